package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * One expression of a mixture document: a mixture, a product, a use of a definition, an input or a
 * Gaussian mixture. Every expression knows where it was written: its model path (e.g.
 * {@code model.mixture[1].product[0]}) and its source location (JSON pointer, line, column).
 */
public sealed interface Expression permits MixtureExpr, ProductExpr, UseExpr, InputExpr, GaussianMixtureExpr {
    /** The {@code label} of the mixture entry this expression is written in, or {@code null}. */
    String label();

    /** The model path, e.g. {@code model.mixture[1].product[0]} or {@code definitions.worn-valve}. */
    String path();

    /** Where the expression's object starts. */
    SourceLocation location();
}
