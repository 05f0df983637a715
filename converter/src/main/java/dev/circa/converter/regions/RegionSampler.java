package dev.circa.converter.regions;

import dev.circa.format.Family;
import dev.circa.format.Variable;

/**
 * Draws complete assignments from a compiled region graph by ancestral sampling over its regions
 * (a sum picks a child with probability proportional to its weight, a product takes every part,
 * a bundle draws each of its inputs), for verification points. With normalised parameters the
 * draws follow the circuit's distribution. Not thread-safe; not for application code.
 */
final class RegionSampler {
    private final RegionParameters p;
    private final RegionStructure s;
    private final Layout layout;
    private final SplitMix64 rng;
    private int[] stackRegion = new int[64];
    private int[] stackIndex = new int[64];

    RegionSampler(RegionParameters p, long seed) {
        this.p = p;
        this.s = p.structure();
        this.layout = p.layout();
        this.rng = new SplitMix64(seed);
    }

    /** Fills row {@code row} of {@code out} (rows x variables) with one draw from output {@code output}. */
    void sample(int output, double[] out, int row) {
        int nv = s.variables().size();
        int top = 0;
        stackRegion[top] = s.root();
        stackIndex[top++] = output;
        boolean atRootSum = true;
        while (top > 0) {
            top--;
            int r = stackRegion[top];
            int idx = stackIndex[top];
            if (layout.hasSums(r) && (r != s.root() || atRootSum)) {
                if (r == s.root()) {
                    atRootSum = false;
                }
                int j = pick(r, idx);
                if (s.isLeaf(r)) {
                    bundle(r, j, out, row * nv);
                    continue;
                }
                for (int part : s.partitionsOf(r)) {
                    int[] parts = s.parts(part);
                    long combos = 1;
                    for (int q : parts) {
                        combos *= layout.size(q);
                    }
                    if (j >= combos) {
                        j -= (int) combos;
                        continue;
                    }
                    for (int t = parts.length - 1; t >= 0; t--) {
                        int q = parts[t];
                        int d = j % layout.size(q);
                        j /= layout.size(q);
                        if (top + 1 >= stackRegion.length) {
                            stackRegion = java.util.Arrays.copyOf(stackRegion, top * 2 + 2);
                            stackIndex = java.util.Arrays.copyOf(stackIndex, top * 2 + 2);
                        }
                        stackRegion[top] = q;
                        stackIndex[top++] = d;
                    }
                    break;
                }
            } else {
                bundle(r, idx, out, row * nv);
            }
        }
    }

    private int pick(int r, int k) {
        double[] w = p.weights(r, k);
        int c = w.length;
        boolean log = p.logWeights(r);
        double max = Double.NEGATIVE_INFINITY;
        if (log) {
            for (double x : w) {
                max = Math.max(max, x);
            }
        }
        double total = 0;
        for (double x : w) {
            total += log ? Math.exp(x - max) : x;
        }
        double u = rng.nextDouble() * total;
        double acc = 0;
        for (int j = 0; j < c; j++) {
            acc += log ? Math.exp(w[j] - max) : w[j];
            if (u < acc) {
                return j;
            }
        }
        for (int j = c - 1; j >= 0; j--) {
            if (log ? w[j] > Double.NEGATIVE_INFINITY : w[j] > 0) {
                return j;
            }
        }
        return c - 1;
    }

    private void bundle(int r, int i, double[] out, int at) {
        int[] vars = s.vars(r);
        for (int j = 0; j < vars.length; j++) {
            Variable v = s.variables().get(vars[j]);
            out[at + vars[j]] = draw(p.family(vars[j]), p.inputParams(r, i, j), v);
        }
    }

    private double draw(Family f, double[] q, Variable v) {
        switch (f) {
            case NORMAL:
                return q[0] + q[1] * rng.nextGaussian();
            case LOGNORMAL:
                return StrictMath.exp(q[0] + q[1] * rng.nextGaussian());
            case EXPONENTIAL:
                return -StrictMath.log(rng.nextOpenDouble()) / q[0];
            case GAMMA:
                return rng.nextGamma(q[0]) / q[1];
            case BETA: {
                double a = rng.nextGamma(q[0]);
                double b = rng.nextGamma(q[1]);
                double x = a / (a + b);
                return Math.min(Math.max(x, 0x1p-52), 1 - 0x1p-53);
            }
            case UNIFORM:
                return rng.uniform(q[0], q[1]);
            case POISSON:
                return poisson(q[0]);
            case BINOMIAL: {
                int n = (int) q[0];
                if (n > 10_000) {
                    double m = n * q[1];
                    double sd = Math.sqrt(m * (1 - q[1]));
                    return Math.min(n, Math.max(0, Math.rint(m + sd * rng.nextGaussian())));
                }
                int k = 0;
                for (int t = 0; t < n; t++) {
                    if (rng.nextDouble() < q[1]) {
                        k++;
                    }
                }
                return k;
            }
            case BERNOULLI:
                return rng.nextDouble() < q[0] ? 1 : 0;
            case CATEGORICAL: {
                double u = rng.nextDouble();
                double acc = 0;
                for (int t = 0; t < q.length; t++) {
                    acc += q[t];
                    if (u < acc) {
                        return t;
                    }
                }
                return q.length - 1;
            }
            case INDICATOR:
                return q[0];
            default:
                throw new IllegalArgumentException(f.jsonName() + " is not a compile family for " + v.name());
        }
    }

    private double poisson(double rate) {
        if (rate > 500) {
            return Math.max(0, Math.rint(rate + Math.sqrt(rate) * rng.nextGaussian()));
        }
        double u = rng.nextDouble();
        double pk = StrictMath.exp(-rate);
        double acc = pk;
        int k = 0;
        while (u >= acc && k < 100_000) {
            k++;
            pk *= rate / k;
            acc += pk;
            if (pk == 0 && k > rate) {
                break;
            }
        }
        return k;
    }
}
