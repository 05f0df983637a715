package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * A named sub-model under {@code definitions}, shared by every {@link UseExpr} that names it.
 *
 * @param name the name
 * @param expression its expression
 * @param location where the definition was written
 */
public record Definition(String name, Expression expression, SourceLocation location) {
}
