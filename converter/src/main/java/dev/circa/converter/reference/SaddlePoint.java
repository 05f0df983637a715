package dev.circa.converter.reference;

/**
 * The two terms of Loader's saddle-point form of the Poisson and binomial masses (C. Loader, "Fast and
 * accurate computation of binomial probabilities", 2000), written for the source evaluators: the
 * Stirling error of log n! and the deviance x log(x / m) + m - x. Together they give log-masses and
 * log-densities without the cancellation of large terms (x log m against log Gamma(x + 1)) that makes
 * the textbook formulas lose every digit, or form inf - inf, near the ends of double range. Every
 * loop is bounded. Stateless.
 */
final class SaddlePoint {
    static final double HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);
    static final double LOG_2PI = Math.log(2 * Math.PI);
    /** From here on the Stirling error is its asymptotic series (5 terms: below 1e-17 absolute there). */
    private static final double SERIES_FROM = 15;
    /** The deviance's series converges at least 100-fold per term where it is used; this bounds it regardless. */
    private static final int MAX_TERMS = 200;

    private SaddlePoint() {
    }

    /** log n! - ((n + 1/2) log n - n + log sqrt(2 pi)) for n &gt; 0 (0 at +inf). */
    static double stirlingError(double n) {
        if (n > SERIES_FROM) {
            double nn = n * n;
            return (1.0 / 12 - (1.0 / 360 - (1.0 / 1260 - (1.0 / 1680 - 1.0 / 1188 / nn) / nn) / nn) / nn) / n;
        }
        return ReferenceDensities.logGamma(n + 1) - (n + 0.5) * Math.log(n) + n - HALF_LOG_2PI;
    }

    /**
     * x log(x / m) + m - x for x, m &gt;= 0 (0 log 0 = 0): the Poisson deviance, by its series in
     * v = (x - m) / (x + m) when x and m are close, so that it keeps its digits; +inf when m = 0 &lt; x.
     */
    static double deviance(double x, double m) {
        return deviance(x, m, x - m);
    }

    /**
     * {@link #deviance} at m = n p, with x - n p from a fused multiply-add: near x = n p the deviance
     * depends on that difference, which the rounded product would only give to within its last bit.
     */
    static double devianceAt(double x, double n, double p) {
        double m = n * p;
        return deviance(x, m, Double.isFinite(m) ? -Math.fma(n, p, -x) : x - m);
    }

    private static double deviance(double x, double m, double diff) {
        if (x == 0) {
            return m;
        }
        if (m == 0 || x == Double.POSITIVE_INFINITY || m == Double.POSITIVE_INFINITY) {
            return Double.POSITIVE_INFINITY;
        }
        double sum = x + m;
        double v = sum < Double.POSITIVE_INFINITY ? diff / sum : (0.5 * x - 0.5 * m) / (0.5 * x + 0.5 * m);
        if (Math.abs(v) < 0.1) {
            double s = diff * v;
            double term = x * v * 2;
            double v2 = v * v;
            for (int j = 1; j <= MAX_TERMS; j++) {
                term *= v2;
                double next = s + term / (2 * j + 1);
                if (next == s) {
                    break;
                }
                s = next;
            }
            return s;
        }
        double ratio = x / m;
        double logRatio = ratio >= Double.MIN_NORMAL && ratio < Double.POSITIVE_INFINITY
                ? Math.log(ratio) : Math.log(x) - Math.log(m);
        return x * logRatio - diff;
    }

    /** log(y^k e^-y / Gamma(k + 1)) for real k &gt;= 0 and y &gt; 0: the Poisson mass with a real count. */
    static double logPoisson(double k, double y) {
        if (k == 0) {
            return -y;
        }
        if (k < 1) {
            return k * Math.log(y) - y - ReferenceDensities.logGamma(k + 1);
        }
        return -stirlingError(k) - deviance(k, y) - 0.5 * (LOG_2PI + Math.log(k));
    }
}
