package dev.circa.converter.mixture;

import dev.circa.format.Family;
import dev.circa.format.io.FormatException;
import dev.circa.format.mixture.Expression;
import dev.circa.format.mixture.GaussianMixtureExpr;
import dev.circa.format.mixture.InputExpr;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.ProductExpr;
import java.util.SplittableRandom;

/**
 * Draws complete assignments from a mixture document itself (not from its circuit): a mixture picks
 * one entry by weight, a product samples every factor, a normal vector is mean + L z with its own
 * Cholesky factor L. Discrete values are state indices or counts held as doubles. The generator is
 * {@link SplittableRandom} seeded with the given seed, so the same seed gives the same points.
 * Poisson rates above 30 and binomials of more than 1000 trials are drawn from a rounded normal
 * approximation (kept in the support): the points serve verification, which needs points in the
 * support spread like the source, not exact tail frequencies. Not thread-safe.
 */
public final class MixtureSampler {
    private final CheckedModel model;
    private final int variableCount;
    private final SplittableRandom random;
    private final double[][] cumulative;
    private final double[][][] factor;
    private final int[] stack;
    private final double[] z;

    private MixtureSampler(CheckedModel model, long seed) {
        this.model = model;
        ModelGraph g = model.graph();
        this.variableCount = g.document().variables().size();
        this.random = new SplittableRandom(seed);
        int n = g.size();
        this.cumulative = new double[n][];
        this.factor = new double[n][][];
        int maxD = 1;
        int stackSize = 1;
        for (int i = 0; i < n; i++) {
            Expression e = g.items().get(i);
            stackSize += g.children(i).length;
            double[] w = model.weights(i);
            if (w != null) {
                cumulative[i] = new double[w.length];
                double s = 0;
                for (int j = 0; j < w.length; j++) {
                    s += w[j];
                    cumulative[i][j] = s;
                }
            }
            if (e instanceof InputExpr in && in.family() == Family.MVNORMAL) {
                int d = in.vars().length;
                maxD = Math.max(maxD, d);
                factor[i] = new double[][] {GaussianMath.cholesky(java.util.Arrays.copyOfRange(in.params(), d,
                        d + d * d), d)};
            } else if (e instanceof GaussianMixtureExpr gm) {
                maxD = Math.max(maxD, gm.dimension());
                factor[i] = new double[gm.components()][];
                for (int c = 0; c < gm.components(); c++) {
                    factor[i][c] = GaussianMath.cholesky(gm.covariances()[c], gm.dimension());
                }
            }
        }
        this.stack = new int[stackSize];
        this.z = new double[maxD];
    }

    /**
     * A sampler of {@code doc}, checked as the converter checks it.
     *
     * @throws FormatException on the authoring mistakes the converter reports
     */
    public static MixtureSampler of(MixtureDocument doc, boolean normalizeWeights, long seed) throws FormatException {
        return new MixtureSampler(CheckedModel.of(doc, normalizeWeights), seed);
    }

    static MixtureSampler of(CheckedModel model, long seed) {
        return new MixtureSampler(model, seed);
    }

    /** Number of variables (the length of a row). */
    public int variableCount() {
        return variableCount;
    }

    /**
     * Draws {@code n} rows.
     *
     * @param out output: row-major n x {@link #variableCount()}
     */
    public void sample(int n, double[] out) {
        for (int r = 0; r < n; r++) {
            sampleRow(out, r * variableCount);
        }
    }

    private void sampleRow(double[] out, int offset) {
        ModelGraph g = model.graph();
        int top = 0;
        stack[top++] = g.root();
        while (top > 0) {
            int i = stack[--top];
            Expression e = g.items().get(i);
            int[] kids = g.children(i);
            if (e instanceof InputExpr in) {
                if (in.family() == Family.MVNORMAL) {
                    normalVector(in.vars(), in.params(), factor[i][0], out, offset);
                } else {
                    out[offset + in.vars()[0]] = scalar(in.family(), in.params());
                }
            } else if (e instanceof GaussianMixtureExpr gm) {
                int c = pick(cumulative[i]);
                normalVector(gm.vars(), gm.means()[c], factor[i][c], out, offset);
            } else if (e instanceof ProductExpr) {
                for (int k : kids) {
                    stack[top++] = k;
                }
            } else {
                stack[top++] = kids[pick(cumulative[i])];
            }
        }
    }

    private int pick(double[] cum) {
        double u = random.nextDouble() * cum[cum.length - 1];
        for (int j = 0; j < cum.length; j++) {
            if (u < cum[j]) {
                return j;
            }
        }
        for (int j = cum.length - 1; j > 0; j--) {
            if (cum[j] > cum[j - 1]) {
                return j;
            }
        }
        return 0;
    }

    private void normalVector(int[] vars, double[] mean, double[] l, double[] out, int offset) {
        int d = vars.length;
        for (int a = 0; a < d; a++) {
            z[a] = gaussian();
        }
        for (int a = 0; a < d; a++) {
            double s = mean[a];
            for (int b = 0; b <= a; b++) {
                s += l[a * d + b] * z[b];
            }
            out[offset + vars[a]] = s;
        }
    }

    private double scalar(Family f, double[] p) {
        switch (f) {
            case BERNOULLI:
                return random.nextDouble() < p[0] ? 1 : 0;
            case CATEGORICAL: {
                double u = random.nextDouble();
                double s = 0;
                int last = 0;
                for (int k = 0; k < p.length; k++) {
                    if (p[k] > 0) {
                        last = k;
                        s += p[k];
                        if (u < s) {
                            return k;
                        }
                    }
                }
                return last;
            }
            case INDICATOR:
                return p[0];
            case NORMAL:
                return p[0] + p[1] * gaussian();
            case LOGNORMAL:
                return Math.exp(p[0] + p[1] * gaussian());
            case EXPONENTIAL:
                return -Math.log1p(-random.nextDouble()) / p[0];
            case GAMMA:
                return gamma(p[0]) / p[1];
            case BETA: {
                double x = 0;
                for (int attempt = 0; attempt < MAX_ATTEMPTS && !(x > 0 && x < 1); attempt++) {
                    double a = gamma(p[0]);
                    double b = gamma(p[1]);
                    // halves where the sum leaves double range (both shapes near the largest double)
                    x = a + b < Double.POSITIVE_INFINITY ? a / (a + b) : (0.5 * a) / (0.5 * a + 0.5 * b);
                }
                // shapes so extreme that every draw rounds to an end: the nearest point inside (0, 1)
                return x > 0 && x < 1 ? x : x >= 1 ? Math.nextDown(1.0) : Double.MIN_VALUE;
            }
            case UNIFORM: {
                double u = random.nextDouble();
                double w = p[1] - p[0];
                // a width beyond double range is never formed: the two ends are weighted instead
                double x = w < Double.POSITIVE_INFINITY ? p[0] + w * u : p[0] * (1 - u) + p[1] * u;
                return Math.min(x, p[1]);
            }
            case POISSON:
                return poisson(p[0]);
            case BINOMIAL:
                return binomial((long) p[0], p[1]);
            default:
                throw new IllegalArgumentException("not a one-variable family: " + f);
        }
    }

    /** Redraws of a value that rounded outside its open support before it is moved inside. */
    private static final int MAX_ATTEMPTS = 64;

    /** A standard normal variate (Marsaglia's polar method). */
    private double gaussian() {
        double u;
        double v;
        double s;
        do {
            u = 2 * random.nextDouble() - 1;
            v = 2 * random.nextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        return u * Math.sqrt(-2 * Math.log(s) / s);
    }

    /** A Gamma(shape, 1) variate (Marsaglia and Tsang's method; shape below 1 by the power boost). */
    private double gamma(double shape) {
        if (shape < 1) {
            double g = 0;
            for (int attempt = 0; attempt < MAX_ATTEMPTS && !(g > 0); attempt++) {
                g = gamma(shape + 1) * Math.pow(random.nextDouble(), 1 / shape);
            }
            // a shape so small that every draw underflows: the smallest positive double, inside (0, inf)
            return g > 0 ? g : Double.MIN_VALUE;
        }
        double d = shape - 1.0 / 3;
        double c = 1 / Math.sqrt(9 * d);
        while (true) {
            double x = gaussian();
            double v = 1 + c * x;
            if (v <= 0) {
                continue;
            }
            v = v * v * v;
            double u = random.nextDouble();
            if (Math.log(u) < 0.5 * x * x + d - d * v + d * Math.log(v)) {
                return d * v;
            }
        }
    }

    private double poisson(double rate) {
        if (rate < 30) {
            double limit = Math.exp(-rate);
            double prod = random.nextDouble();
            int k = 0;
            while (prod > limit) {
                prod *= random.nextDouble();
                k++;
            }
            return k;
        }
        return Math.max(0, Math.rint(rate + Math.sqrt(rate) * gaussian()));
    }

    private double binomial(long trials, double p) {
        if (trials <= 1000) {
            int k = 0;
            for (long t = 0; t < trials; t++) {
                if (random.nextDouble() < p) {
                    k++;
                }
            }
            return k;
        }
        double x = Math.rint(trials * p + Math.sqrt(trials * p * (1 - p)) * gaussian());
        return Math.max(0, Math.min(trials, x));
    }
}
