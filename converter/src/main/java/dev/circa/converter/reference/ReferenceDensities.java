package dev.circa.converter.reference;

import dev.circa.format.Family;

/**
 * Log-densities and log-masses of the scalar input families, from their textbook formulas, for the
 * source evaluator (independent of the engine's kernels). Values outside the support give -inf.
 * Not for application code.
 */
public final class ReferenceDensities {
    private static final double HALF_LOG_2PI = SaddlePoint.HALF_LOG_2PI;
    /** Lanczos coefficients for g = 7, n = 9 (common practice; accurate to about 1e-15 relative). */
    private static final double[] LANCZOS = {
        0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
        -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
        1.5056327351493116e-7};

    private ReferenceDensities() {
    }

    /** log of the density or mass of a one-variable input at {@code x} (a state index for discrete families). */
    public static double logValue(Family f, double[] p, double x) {
        switch (f) {
            case BERNOULLI:
                if (x == 0) {
                    return Math.log1p(-p[0]);
                }
                return x == 1 ? Math.log(p[0]) : Double.NEGATIVE_INFINITY;
            case CATEGORICAL: {
                int s = state(x, p.length);
                return s < 0 ? Double.NEGATIVE_INFINITY : Math.log(p[s]);
            }
            case INDICATOR:
                return x == p[0] ? 0 : Double.NEGATIVE_INFINITY;
            case NORMAL:
                return normal(x, p[0], p[1], Math.log(p[1]));
            case LOGNORMAL: {
                if (!(x > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                double lx = Math.log(x);
                double z = (lx - p[0]) / p[1];
                return -0.5 * z * z - Math.log(p[1]) - HALF_LOG_2PI - lx;
            }
            case EXPONENTIAL:
                return x >= 0 ? Math.log(p[0]) - p[0] * x : Double.NEGATIVE_INFINITY;
            case GAMMA:
                return gamma(x, p[0], p[1]);
            case BETA:
                return beta(x, p[0], p[1]);
            case UNIFORM:
                if (!(x >= p[0] && x <= p[1])) {
                    return Double.NEGATIVE_INFINITY;
                }
                // a width beyond double range: log(high - low) = log(high / 2 - low / 2) + log 2
                return p[1] - p[0] < Double.POSITIVE_INFINITY ? -Math.log(p[1] - p[0])
                        : -(Math.log(0.5 * p[1] - 0.5 * p[0]) + Math.log(2));
            case POISSON:
                if (!(x >= 0) || x != Math.rint(x)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return x == Double.POSITIVE_INFINITY ? Double.NEGATIVE_INFINITY : SaddlePoint.logPoisson(x, p[0]);
            case BINOMIAL:
                return binomial(x, p[0], p[1]);
            default:
                throw new IllegalArgumentException("not a one-variable family: " + f);
        }
    }

    /**
     * Adds the log-value of one input at each of the first {@code n} cells of {@code x} to the same entry of
     * {@code dst}; a missing cell (NaN) adds nothing. The same numbers as {@link #logValue} cell by cell, with
     * what depends on the parameters only computed once.
     */
    public static void addLogValues(Family f, double[] p, double[] x, int n, double[] dst) {
        if (f == Family.NORMAL) {
            double mean = p[0];
            double sd = p[1];
            double logSd = Math.log(sd);
            for (int i = 0; i < n; i++) {
                if (!Double.isNaN(x[i])) {
                    dst[i] += normal(x[i], mean, sd, logSd);
                }
            }
            return;
        }
        for (int i = 0; i < n; i++) {
            if (!Double.isNaN(x[i])) {
                dst[i] += logValue(f, p, x[i]);
            }
        }
    }

    /**
     * {@link #addLogValues} of a normal input at the first {@code n} cells of {@code x}, for {@link #plain}
     * cells and mean (where x - mean cannot overflow while x is finite), the missing cells listed in
     * {@code missing[m0 .. m1-1]}, {@code clean} the cells with 0 at the missing ones and {@code seen} 1 at the
     * observed ones and 0 elsewhere: the same numbers, in loops the JIT turns into vector instructions instead
     * of a branch per cell. With no missing cell, the formula is added at every cell; else, where the formula
     * is finite at 0, the formula at {@code clean} times {@code seen} is added (a zero at a missing cell, and
     * adding a zero leaves every sum the same double); else the formula goes into {@code term}, 0 is put at
     * the missing cells, and {@code term} is added. Every array is read from its start: a loop over
     * {@code x[from + i]} and {@code dst[at + i]} stayed scalar, several times slower. {@code logSd} is
     * {@code Math.log(sd)}, taken once by the caller; {@code term} holds at least n doubles.
     */
    public static void addNormalLogValues(double mean, double sd, double logSd, double[] x, double[] clean,
            double[] seen, int n, int[] missing, int m0, int m1, double[] term, double[] dst) {
        if (m0 == m1) {
            for (int i = 0; i < n; i++) {
                double z = (x[i] - mean) / sd;
                dst[i] += -0.5 * z * z - logSd - HALF_LOG_2PI;
            }
            return;
        }
        double z0 = (0.0 - mean) / sd;
        if (Double.isFinite(-0.5 * z0 * z0 - logSd - HALF_LOG_2PI)) {
            for (int i = 0; i < n; i++) {
                double z = (clean[i] - mean) / sd;
                dst[i] += (-0.5 * z * z - logSd - HALF_LOG_2PI) * seen[i];
            }
            return;
        }
        for (int i = 0; i < n; i++) {
            double z = (x[i] - mean) / sd;
            term[i] = -0.5 * z * z - logSd - HALF_LOG_2PI;
        }
        for (int k = m0; k < m1; k++) {
            term[missing[k]] = 0;
        }
        for (int i = 0; i < n; i++) {
            dst[i] += term[i];
        }
    }

    /**
     * Whether a cell, or with {@code mean} a normal's mean, is small enough for {@link #addNormalLogValues}:
     * below {@value #PLAIN} in magnitude, or an infinite cell.
     */
    public static boolean plain(double x, boolean mean) {
        return Math.abs(x) < PLAIN || !mean && Math.abs(x) == Double.POSITIVE_INFINITY;
    }

    /** Magnitude below which the difference of two numbers cannot overflow. */
    private static final double PLAIN = 1e307;

    /** The normal log-density; a difference x - mean beyond double range is divided term by term. */
    private static double normal(double x, double mean, double sd, double logSd) {
        double d = x - mean;
        double z = Double.isInfinite(d) && Double.isFinite(x) ? x / sd - mean / sd : d / sd;
        return -0.5 * z * z - logSd - HALF_LOG_2PI;
    }

    private static int state(double x, int k) {
        if (x != Math.rint(x) || x < 0 || x >= k) {
            return -1;
        }
        return (int) x;
    }

    /** Shapes from which the beta density is computed in the saddle-point form (common practice: large terms cancel there). */
    private static final double BETA_SADDLE_FROM = 10;

    /** The gamma log-density (shape a, rate b) on its open support, as a Poisson mass with real count (b x)^(a - 1). */
    private static double gamma(double x, double a, double b) {
        if (!(x > 0) || x == Double.POSITIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        double y = b * x;
        if (y == Double.POSITIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        if (y < Double.MIN_NORMAL) {
            // b x below the normal range: a log b + (a - 1) log x - b x - log Gamma(a), its logarithm from the factors'
            double logY = Math.log(b) + Math.log(x);
            return Math.log(b) + (a - 1) * logY - y - logGamma(a);
        }
        return a >= 1 ? Math.log(b) + SaddlePoint.logPoisson(a - 1, y)
                : Math.log(a) - Math.log(x) + SaddlePoint.logPoisson(a, y);
    }

    /**
     * The beta log-density on its open support (0, 1): for both shapes from {@value #BETA_SADDLE_FROM} as
     * (a + b - 1) times the binomial mass of a - 1 in a + b - 2 trials at x, in the saddle-point form
     * (halving every size when a + b overflows: the deviance is homogeneous); otherwise from log B(a, b).
     */
    private static double beta(double x, double a, double b) {
        if (!(x > 0 && x < 1)) {
            return Double.NEGATIVE_INFINITY;
        }
        if (a < BETA_SADDLE_FROM || b < BETA_SADDLE_FROM) {
            return (a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - logBeta(a, b);
        }
        double scale = a + b < Double.POSITIVE_INFINITY ? 1 : 2;
        double k1 = a - 1;
        double k2 = b - 1;
        double n = a / scale + b / scale - 2 / scale;
        double dev = scale * (SaddlePoint.devianceAt(k1 / scale, n, x) + SaddlePoint.devianceAt(k2 / scale, n, 1 - x));
        double logN = Math.log(n) + Math.log(scale);
        double lc = SaddlePoint.stirlingError(n * scale) - SaddlePoint.stirlingError(k1) - SaddlePoint.stirlingError(k2) - dev;
        double lf = SaddlePoint.LOG_2PI + Math.log(k1) + Math.log(k2) - logN;
        double logSize = Math.log(a / scale + b / scale - 1 / scale) + Math.log(scale);
        return logSize + lc - 0.5 * lf;
    }

    /** log B(a, b); when one shape is large, log Gamma of it and of the sum are taken together (they nearly cancel). */
    static double logBeta(double a, double b) {
        double lo = Math.min(a, b);
        double hi = Math.max(a, b);
        if (hi < BETA_SADDLE_FROM) {
            return logGamma(lo) + logGamma(hi) - logGamma(lo + hi);
        }
        if (lo >= BETA_SADDLE_FROM) {
            // both large: log Gamma(z) = stirling(z) + (z - 1/2) log z - z + log sqrt(2 pi), the z log z terms taken together
            double s = lo + hi;
            double logS = s < Double.POSITIVE_INFINITY ? Math.log(s) : Math.log(0.5 * lo + 0.5 * hi) + Math.log(2);
            return SaddlePoint.stirlingError(lo) + SaddlePoint.stirlingError(hi) - SaddlePoint.stirlingError(s)
                    + HALF_LOG_2PI - lo * Math.log1p(hi / lo) - hi * Math.log1p(lo / hi)
                    - 0.5 * (Math.log(lo) + Math.log(hi) - logS);
        }
        // log Gamma(hi) - log Gamma(lo + hi) = stirling(hi) - stirling(lo + hi) - (hi - 1/2) log(1 + lo / hi) - lo log(lo + hi) + lo
        double s = lo + hi;
        return logGamma(lo) + SaddlePoint.stirlingError(hi) - SaddlePoint.stirlingError(s)
                - (hi - 0.5) * Math.log1p(lo / hi) - lo * Math.log(s) + lo;
    }

    /** The binomial log-mass of x successes in n trials with success probability q, in the saddle-point form. */
    private static double binomial(double x, double n, double q) {
        if (!(x >= 0 && x <= n) || x != Math.rint(x)) {
            return Double.NEGATIVE_INFINITY;
        }
        if (n == 0) {
            return 0;
        }
        if (x == 0) {
            return n * Math.log1p(-q);
        }
        if (x == n) {
            return n * Math.log(q);
        }
        if (q == 0 || q == 1) {
            return Double.NEGATIVE_INFINITY;
        }
        double lc = SaddlePoint.stirlingError(n) - SaddlePoint.stirlingError(x) - SaddlePoint.stirlingError(n - x)
                - SaddlePoint.devianceAt(x, n, q) - SaddlePoint.devianceAt(n - x, n, 1 - q);
        double lf = SaddlePoint.LOG_2PI + Math.log(x) + Math.log1p(-x / n);
        return lc - 0.5 * lf;
    }

    /** log Gamma(x) for x &gt; 0 (Lanczos approximation; below 1/2 from log Gamma(x + 1) - log x). */
    public static double logGamma(double x) {
        if (x < 0.5) {
            return logGamma(x + 1) - Math.log(x);
        }
        double y = x - 1;
        double a = LANCZOS[0];
        double t = y + 7.5;
        for (int i = 1; i < LANCZOS.length; i++) {
            a += LANCZOS[i] / (y + i);
        }
        return HALF_LOG_2PI + (y + 0.5) * Math.log(t) - t + Math.log(a);
    }
}
