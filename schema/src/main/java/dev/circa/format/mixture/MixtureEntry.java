package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * One component of a {@link MixtureExpr}: a weight and an expression written in the same object
 * (the entry's {@code label} is the expression's).
 *
 * @param weight the weight as written (not rescaled)
 * @param expression the component
 * @param weightLocation where the weight was written
 */
public record MixtureEntry(double weight, Expression expression, SourceLocation weightLocation) {
}
