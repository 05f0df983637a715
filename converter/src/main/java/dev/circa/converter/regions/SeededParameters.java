package dev.circa.converter.regions;

import dev.circa.format.Family;
import dev.circa.format.Variable;

/**
 * Draws seeded parameters of a region graph's circuit with one {@link SplitMix64}, regions children
 * first, in node order: each sum's weights from a symmetric Dirichlet with alpha =
 * {@link RegionParameters#DIRICHLET_ALPHA} (Gamma(alpha) draws normalised); each input's parameters
 * uniformly from a range that suits its family: normal mean in [-2, 2), sd in [0.5, 1.5); lognormal
 * mu in [-1, 1), sigma in [0.25, 1); exponential rate in [0.5, 2); gamma shape in [1, 5), rate in
 * [0.5, 2); beta alpha and beta in [0.5, 5); uniform low in [-2, 0), high = low + [1, 3); poisson
 * rate in [0.5, 10); binomial trials 10, p in [0.05, 0.95); bernoulli p in [0.05, 0.95);
 * categorical probs from a Dirichlet(1); indicator value = bundle index modulo the number of states.
 * Stateless.
 */
final class SeededParameters {
    private SeededParameters() {
    }

    /** Random, valid, normalised parameters drawn from {@code seed} (see {@link RegionParameters#seeded}). */
    static RegionParameters of(RegionStructure s, CompileOptions o, long seed) {
        SplitMix64 rng = new SplitMix64(seed);
        Layout layout = new Layout(s, o);
        int nr = s.regionCount();
        double[][][] w = new double[nr][][];
        double[][][] in = new double[nr][][];
        for (int r : s.order()) {
            if (s.isLeaf(r)) {
                int[] vars = s.vars(r);
                in[r] = new double[o.inputs() * vars.length][];
                for (int i = 0; i < o.inputs(); i++) {
                    for (int j = 0; j < vars.length; j++) {
                        Variable v = s.variables().get(vars[j]);
                        in[r][i * vars.length + j] = draw(rng, o.family(v.type()), v, i);
                    }
                }
            }
            if (layout.hasSums(r)) {
                int k = layout.sums(r);
                int c = layout.children(r);
                w[r] = new double[k][];
                for (int t = 0; t < k; t++) {
                    w[r][t] = new double[c];
                    rng.dirichlet(RegionParameters.DIRICHLET_ALPHA, w[r][t], 0, c);
                }
            }
        }
        return new RegionParameters(s, o, w, new boolean[nr], in);
    }

    private static double[] draw(SplitMix64 rng, Family f, Variable v, int bundle) {
        return switch (f) {
            case NORMAL -> new double[] {rng.uniform(-2, 2), rng.uniform(0.5, 1.5)};
            case LOGNORMAL -> new double[] {rng.uniform(-1, 1), rng.uniform(0.25, 1)};
            case EXPONENTIAL -> new double[] {rng.uniform(0.5, 2)};
            case GAMMA -> new double[] {rng.uniform(1, 5), rng.uniform(0.5, 2)};
            case BETA -> new double[] {rng.uniform(0.5, 5), rng.uniform(0.5, 5)};
            case UNIFORM -> {
                double low = rng.uniform(-2, 0);
                yield new double[] {low, low + rng.uniform(1, 3)};
            }
            case POISSON -> new double[] {rng.uniform(0.5, 10)};
            case BINOMIAL -> new double[] {10, rng.uniform(0.05, 0.95)};
            case BERNOULLI -> new double[] {rng.uniform(0.05, 0.95)};
            case CATEGORICAL -> {
                double[] p = new double[v.stateCount()];
                rng.dirichlet(1.0, p, 0, p.length);
                yield p;
            }
            case INDICATOR -> new double[] {bundle % v.stateCount()};
            case MVNORMAL -> throw new IllegalArgumentException("mvnormal is not a compile family");
        };
    }
}
