package dev.circa.format.mixture;

import dev.circa.format.Family;
import dev.circa.format.SourceLocation;

/**
 * An input distribution over named variables, resolved to variable indices and to the parameter
 * layout of {@link dev.circa.format.InputNode} (categorical probabilities in state order, an
 * indicator's state index, an {@code mvnormal}'s mean then row-major covariance). Values are as
 * written: their validity (sd &gt; 0, probabilities summing to 1, ...) is the converter's to judge.
 *
 * @param family the family
 * @param vars variable indices (one, or several for {@code mvnormal}); callers must not modify
 * @param params parameters; callers must not modify
 * @param label optional label or {@code null}
 * @param path model path of this expression
 * @param location where this expression's object starts
 * @param paramsLocation where the family's parameters were written
 */
public record InputExpr(Family family, int[] vars, double[] params, String label, String path,
        SourceLocation location, SourceLocation paramsLocation) implements Expression {
}
