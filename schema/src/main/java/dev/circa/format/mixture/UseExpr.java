package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * A reference to a named definition ({@code use: NAME}); every use of one definition denotes the
 * same shared sub-model. The name is known to exist in the document's definitions.
 *
 * @param name the definition's name
 * @param label optional label or {@code null}
 * @param path model path of this expression
 * @param location where this expression's object starts
 */
public record UseExpr(String name, String label, String path, SourceLocation location) implements Expression {
}
