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
    private static final double LN_2 = Math.log(2);
    /** The largest count below which every whole number is a double: the count range of every reader. */
    public static final double MAX_COUNT = 9.007199254740992E15;

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
                double diff = x - p[off];
                // a difference beyond double range is divided term by term (sd may be as large)
                double z = Double.isInfinite(diff) ? x / p[off + 1] - p[off] / p[off + 1] : diff / p[off + 1];
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
                return x < p[off] || x > p[off + 1] ? NEG_INF : -logWidth(p[off], p[off + 1]);
            case POISSON:
                return isCount(x) ? SpecialFunctions.logPoisson(x, p[off]) : NEG_INF;
            case BINOMIAL:
                return isCount(x) && x <= p[off] ? SpecialFunctions.logBinomial(x, p[off], p[off + 1]) : NEG_INF;
            default:
                throw new IllegalArgumentException("not a scalar family code: " + code);
        }
    }

    /** log(high - low) for low < high, also when the difference exceeds the largest double. */
    private static double logWidth(double low, double high) {
        double w = high - low;
        return w < Double.POSITIVE_INFINITY ? Math.log(w) : Math.log(0.5 * high - 0.5 * low) + LN_2;
    }

    /**
     * The gamma log-density on its open support (0, inf), in Loader's form through the Poisson mass with
     * real argument, so that large shapes and rates do not cancel (shape log rate against log Gamma(shape)).
     */
    private static double logGamma(double x, double shape, double rate) {
        if (!(x > 0) || x == Double.POSITIVE_INFINITY) {
            return NEG_INF;
        }
        double y = rate * x;
        if (y >= Double.MIN_NORMAL && y < Double.POSITIVE_INFINITY) {
            return shape >= 1
                    ? SpecialFunctions.logPoissonRaw(shape - 1, y) + Math.log(rate)
                    : SpecialFunctions.logPoissonRaw(shape, y) + Math.log(shape) - Math.log(x);
        }
        if (y == Double.POSITIVE_INFINITY) {
            return NEG_INF;
        }
        // rate * x below the normal range: its logarithm from the factors'
        double logY = Math.log(rate) + Math.log(x);
        return shape * logY - y - SpecialFunctions.logGamma(shape) - Math.log(x);
    }

    /** Shapes from which the beta density is computed in Loader's form (large terms cancel algebraically). */
    private static final double BETA_LOADER_FROM = 15;

    /** The beta log-density on its open support (0, 1). */
    private static double logBeta(double x, double a, double b) {
        if (!(x > 0 && x < 1)) {
            return NEG_INF;
        }
        if (a < BETA_LOADER_FROM || b < BETA_LOADER_FROM) {
            return (a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - SpecialFunctions.logBeta(a, b);
        }
        // -(bd0(a, s x) + bd0(b, s (1 - x))) + (log a + log b - log s) / 2 - log(x (1 - x)) - log(2 pi) / 2
        // - the Stirling corrections, with s = a + b; bd0 is homogeneous, so halves avoid overflow of s
        double scale = a + b < Double.POSITIVE_INFINITY ? 1 : 2;
        double ah = a / scale;
        double bh = b / scale;
        double sh = ah + bh;
        double dev = scale * (SpecialFunctions.deviancePart(ah, sh * x) + SpecialFunctions.deviancePart(bh, sh * (1 - x)));
        double big = Math.max(a, b);
        double logS = Math.log(big) + Math.log1p(Math.min(a, b) / big);
        return -dev + 0.5 * (Math.log(a) + Math.log(b) - logS) - Math.log(x) - Math.log1p(-x) - HALF_LOG_2PI
                - SpecialFunctions.stirlingError(a) - SpecialFunctions.stirlingError(b) + stirlingErrorAtSum(a, b);
    }

    /** The Stirling correction of log Gamma at a + b (0 when the sum is beyond double range, as it is below 1e-300 there). */
    private static double stirlingErrorAtSum(double a, double b) {
        double s = a + b;
        return s < Double.POSITIVE_INFINITY ? SpecialFunctions.stirlingError(s) : 0;
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
                return Math.min(Math.exp(p[off] - p[off + 1] * p[off + 1]), Double.MAX_VALUE);
            case EXPONENTIAL:
                return 0;
            case GAMMA:
                return p[off] > 1 ? Math.min((p[off] - 1) / p[off + 1], Double.MAX_VALUE) : 0;
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
                return 0.5 * p[off] + 0.5 * p[off + 1];
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

    /**
     * The supremum of the log-density: its value at the mode, or its limit when the mode is an open end of
     * the support (+inf when the density is unbounded there).
     */
    public static double maxLogDensity(int code, double[] p, int off, int len) {
        if (code == GAMMA && p[off] <= 1) {
            return p[off] < 1 ? Double.POSITIVE_INFINITY : Math.log(p[off + 1]);
        }
        if (code == BETA) {
            double m = mode(code, p, off, len);
            if (m == 0 || m == 1) {
                double e = m == 0 ? p[off] : p[off + 1];
                double other = m == 0 ? p[off + 1] : p[off];
                return e < 1 || other < 1 ? Double.POSITIVE_INFINITY : -SpecialFunctions.logBeta(p[off], p[off + 1]);
            }
        }
        return logDensity(code, p, off, len, mode(code, p, off, len));
    }

    /**
     * Whether a value drawn by {@link #sample} is one the readers accept for the family's variable: a
     * finite double, and for a count family a whole number up to {@link #MAX_COUNT}. A draw that is not
     * has overflowed the double or count range: the sampler stops there and names the input.
     */
    public static boolean representable(int code, double value) {
        if (!Double.isFinite(value)) {
            return false;
        }
        return (code != POISSON && code != BINOMIAL) || value <= MAX_COUNT;
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
            case UNIFORM: {
                double low = p[off];
                double high = p[off + 1];
                double u = rng.nextDouble();
                double w = high - low;
                // a width beyond double range is never formed: the two ends are weighted instead
                return w < Double.POSITIVE_INFINITY ? low + w * u : low * (1 - u) + high * u;
            }
            case POISSON:
                return Variates.poisson(rng, p[off]);
            case BINOMIAL:
                return Variates.binomial(rng, (long) p[off], p[off + 1]);
            default:
                throw new IllegalArgumentException("not a scalar family code: " + code);
        }
    }
}
