package dev.circa.engine.family;

import dev.circa.engine.random.Variates;
import dev.circa.engine.random.Xoshiro256;
import dev.circa.format.Family;

/**
 * Static kernels of the one-variable input families, addressed by an integer family code. Parameters sit
 * at {@code p[off] .. p[off + len - 1]} in the order of {@link Family#parameters()} (categorical: one
 * probability, or log-probability for {@link #CATEGORICAL_LOG}, per state; binomial: trials then p). The
 * kernels trust their input: the compiler has checked parameter counts and ranges. A value outside a
 * family's support has log-density -inf. {@link #MVNORMAL} is handled by {@link MvNormal}.
 */
public final class Families {
    public static final int BERNOULLI = 0;
    public static final int CATEGORICAL = 1;
    public static final int INDICATOR = 2;
    public static final int NORMAL = 3;
    public static final int LOGNORMAL = 4;
    public static final int EXPONENTIAL = 5;
    public static final int GAMMA = 6;
    public static final int BETA = 7;
    public static final int UNIFORM = 8;
    public static final int POISSON = 9;
    public static final int BINOMIAL = 10;
    public static final int MVNORMAL = 11;
    /** Categorical whose parameters are log-probabilities. */
    public static final int CATEGORICAL_LOG = 12;

    private static final double NEG_INF = Double.NEGATIVE_INFINITY;
    private static final double HALF_LOG_2PI = SpecialFunctions.HALF_LOG_2PI;

    private Families() {
    }

    /** The code of {@code family}; {@code logForm} selects {@link #CATEGORICAL_LOG} for a categorical. */
    public static int code(Family family, boolean logForm) {
        return switch (family) {
            case BERNOULLI -> BERNOULLI;
            case CATEGORICAL -> logForm ? CATEGORICAL_LOG : CATEGORICAL;
            case INDICATOR -> INDICATOR;
            case NORMAL -> NORMAL;
            case LOGNORMAL -> LOGNORMAL;
            case EXPONENTIAL -> EXPONENTIAL;
            case GAMMA -> GAMMA;
            case BETA -> BETA;
            case UNIFORM -> UNIFORM;
            case POISSON -> POISSON;
            case BINOMIAL -> BINOMIAL;
            case MVNORMAL -> MVNORMAL;
        };
    }

    /** The family of a code. */
    public static Family family(int code) {
        return code == CATEGORICAL_LOG ? Family.CATEGORICAL : Family.values()[code];
    }

    /** Whether {@code x} is a whole number >= 0. */
    private static boolean isCount(double x) {
        return x >= 0 && x == Math.rint(x) && x != Double.POSITIVE_INFINITY;
    }

    /** Log-density (or log-mass) at the observed value {@code x} (not NaN). */
    public static double logDensity(int code, double[] p, int off, int len, double x) {
        switch (code) {
            case BERNOULLI:
                return x == 1 ? Math.log(p[off]) : x == 0 ? Math.log1p(-p[off]) : NEG_INF;
            case CATEGORICAL:
            case CATEGORICAL_LOG: {
                if (!isCount(x) || x >= len) {
                    return NEG_INF;
                }
                double v = p[off + (int) x];
                return code == CATEGORICAL ? Math.log(v) : v;
            }
            case INDICATOR:
                return x == p[off] ? 0 : NEG_INF;
            case NORMAL: {
                double z = (x - p[off]) / p[off + 1];
                return -0.5 * z * z - Math.log(p[off + 1]) - HALF_LOG_2PI;
            }
            case LOGNORMAL: {
                if (!(x > 0)) {
                    return NEG_INF;
                }
                double lx = Math.log(x);
                double z = (lx - p[off]) / p[off + 1];
                return -0.5 * z * z - Math.log(p[off + 1]) - HALF_LOG_2PI - lx;
            }
            case EXPONENTIAL:
                return x < 0 ? NEG_INF : Math.log(p[off]) - p[off] * x;
            case GAMMA:
                return logGamma(x, p[off], p[off + 1]);
            case BETA:
                return logBeta(x, p[off], p[off + 1]);
            case UNIFORM:
                return x < p[off] || x > p[off + 1] ? NEG_INF : -Math.log(p[off + 1] - p[off]);
            case POISSON:
                return isCount(x) ? SpecialFunctions.logPoisson(x, p[off]) : NEG_INF;
            case BINOMIAL:
                return isCount(x) && x <= p[off] ? SpecialFunctions.logBinomial(x, p[off], p[off + 1]) : NEG_INF;
            default:
                throw new IllegalArgumentException("not a scalar family code: " + code);
        }
    }

    private static double logGamma(double x, double shape, double rate) {
        if (x < 0 || Double.isNaN(x) || x == Double.POSITIVE_INFINITY) {
            return NEG_INF;
        }
        double norm = shape * Math.log(rate) - SpecialFunctions.logGamma(shape);
        if (x == 0) {
            // the density's limit at the edge of the support
            return shape < 1 ? Double.POSITIVE_INFINITY : shape == 1 ? norm : NEG_INF;
        }
        return (shape - 1) * Math.log(x) - rate * x + norm;
    }

    private static double logBeta(double x, double a, double b) {
        if (x < 0 || x > 1 || Double.isNaN(x)) {
            return NEG_INF;
        }
        double norm = -SpecialFunctions.logBeta(a, b);
        if (x == 0 || x == 1) {
            // the density's limit at the edge of the support
            double e = x == 0 ? a : b;
            return e < 1 ? Double.POSITIVE_INFINITY : e == 1 ? norm : NEG_INF;
        }
        return (a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) + norm;
    }

    /** The most probable value (a mode; the first one on ties, an edge of the support when unbounded). */
    public static double mode(int code, double[] p, int off, int len) {
        switch (code) {
            case BERNOULLI:
                return p[off] > 0.5 ? 1 : 0;
            case CATEGORICAL:
            case CATEGORICAL_LOG: {
                int best = 0;
                for (int k = 1; k < len; k++) {
                    if (p[off + k] > p[off + best]) {
                        best = k;
                    }
                }
                return best;
            }
            case INDICATOR:
                return p[off];
            case NORMAL:
                return p[off];
            case LOGNORMAL:
                return Math.exp(p[off] - p[off + 1] * p[off + 1]);
            case EXPONENTIAL:
                return 0;
            case GAMMA:
                return p[off] > 1 ? (p[off] - 1) / p[off + 1] : 0;
            case BETA: {
                double a = p[off];
                double b = p[off + 1];
                if (a > 1 && b > 1) {
                    return (a - 1) / (a + b - 2);
                }
                if (a == 1 && b == 1) {
                    return 0.5;
                }
                return a <= b ? 0 : 1;
            }
            case UNIFORM:
                return 0.5 * (p[off] + p[off + 1]);
            case POISSON:
                return Math.floor(p[off]);
            case BINOMIAL:
                return Math.min(p[off], Math.floor((p[off] + 1) * p[off + 1]));
            default:
                throw new IllegalArgumentException("not a scalar family code: " + code);
        }
    }

    /**
     * The log of the input's integral over its whole support: its value when its variable is missing
     * (FORMAT.md). 0 for every family but a categorical, whose probabilities may not add exactly to 1.
     */
    public static double logTotalMass(int code, double[] p, int off, int len) {
        if (code == CATEGORICAL) {
            double total = 0;
            for (int k = 0; k < len; k++) {
                total += p[off + k];
            }
            return Math.log(total);
        }
        if (code == CATEGORICAL_LOG) {
            double m = Double.NEGATIVE_INFINITY;
            for (int k = 0; k < len; k++) {
                m = Math.max(m, p[off + k]);
            }
            if (m == Double.NEGATIVE_INFINITY) {
                return m;
            }
            double total = 0;
            for (int k = 0; k < len; k++) {
                total += Math.exp(p[off + k] - m);
            }
            return m + Math.log(total);
        }
        return 0;
    }

    /** The log-density at the mode: the largest value the input takes (+inf when unbounded). */
    public static double maxLogDensity(int code, double[] p, int off, int len) {
        return logDensity(code, p, off, len, mode(code, p, off, len));
    }

    /** One draw (StrictMath only, so the same on every machine). */
    public static double sample(int code, double[] p, int off, int len, Xoshiro256 rng) {
        switch (code) {
            case BERNOULLI:
                return rng.nextDouble() < p[off] ? 1 : 0;
            case CATEGORICAL:
            case CATEGORICAL_LOG: {
                double total = 0;
                for (int k = 0; k < len; k++) {
                    total += code == CATEGORICAL ? p[off + k] : StrictMath.exp(p[off + k]);
                }
                double u = rng.nextDouble() * total;
                double acc = 0;
                int last = 0;
                for (int k = 0; k < len; k++) {
                    double w = code == CATEGORICAL ? p[off + k] : StrictMath.exp(p[off + k]);
                    if (w > 0) {
                        last = k;
                        acc += w;
                        if (u < acc) {
                            return k;
                        }
                    }
                }
                return last;
            }
            case INDICATOR:
                return p[off];
            case NORMAL:
                return p[off] + p[off + 1] * rng.nextGaussian();
            case LOGNORMAL:
                return StrictMath.exp(p[off] + p[off + 1] * rng.nextGaussian());
            case EXPONENTIAL:
                return -StrictMath.log(rng.nextOpenDouble()) / p[off];
            case GAMMA:
                return Variates.gamma(rng, p[off]) / p[off + 1];
            case BETA:
                return Variates.beta(rng, p[off], p[off + 1]);
            case UNIFORM:
                return p[off] + (p[off + 1] - p[off]) * rng.nextDouble();
            case POISSON:
                return Variates.poisson(rng, p[off]);
            case BINOMIAL:
                return Variates.binomial(rng, (long) p[off], p[off + 1]);
            default:
                throw new IllegalArgumentException("not a scalar family code: " + code);
        }
    }
}
