package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * A mixture of multivariate normal components over the same real variables
 * ({@code gaussian-mixture: {vars, weights, means, covariances | variances}}).
 *
 * @param vars variable indices, in the order of the means; callers must not modify
 * @param weights one weight per component, as written; callers must not modify
 * @param means one mean vector (length d) per component; callers must not modify
 * @param covariances one covariance per component, row-major d x d (diagonal when given as
 *     {@code variances}); callers must not modify
 * @param diagonal whether the document gave {@code variances} rather than {@code covariances}
 * @param label optional label or {@code null}
 * @param path model path of this expression
 * @param location where this expression's object starts
 * @param componentLocations where each component's covariance (or variances) was written
 */
public record GaussianMixtureExpr(int[] vars, double[] weights, double[][] means, double[][] covariances,
        boolean diagonal, String label, String path, SourceLocation location, SourceLocation[] componentLocations)
        implements Expression {
    /** Number of components. */
    public int components() {
        return weights.length;
    }

    /** Number of variables. */
    public int dimension() {
        return vars.length;
    }
}
