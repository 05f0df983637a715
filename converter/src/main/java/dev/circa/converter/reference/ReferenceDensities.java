package dev.circa.converter.reference;

import dev.circa.format.Family;

/**
 * Log-densities and log-masses of the scalar input families, from their textbook formulas, for the
 * source evaluator (independent of the engine's kernels). Values outside the support give -inf.
 * Not for application code.
 */
public final class ReferenceDensities {
    private static final double HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);
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
            case NORMAL: {
                double z = (x - p[0]) / p[1];
                return -0.5 * z * z - Math.log(p[1]) - HALF_LOG_2PI;
            }
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
                if (!(x > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return p[0] * Math.log(p[1]) + (p[0] - 1) * Math.log(x) - p[1] * x - logGamma(p[0]);
            case BETA:
                if (!(x > 0 && x < 1)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return (p[0] - 1) * Math.log(x) + (p[1] - 1) * Math.log1p(-x)
                        - (logGamma(p[0]) + logGamma(p[1]) - logGamma(p[0] + p[1]));
            case UNIFORM:
                if (!(x >= p[0] && x <= p[1])) {
                    return Double.NEGATIVE_INFINITY;
                }
                // a width beyond double range: log(high - low) = log(high / 2 - low / 2) + log 2
                return p[1] - p[0] < Double.POSITIVE_INFINITY ? -Math.log(p[1] - p[0])
                        : -(Math.log(0.5 * p[1] - 0.5 * p[0]) + Math.log(2));
            case POISSON: {
                if (!(x >= 0) || x != Math.rint(x)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return x * Math.log(p[0]) - p[0] - logGamma(x + 1);
            }
            case BINOMIAL: {
                double n = p[0];
                double q = p[1];
                if (!(x >= 0 && x <= n) || x != Math.rint(x)) {
                    return Double.NEGATIVE_INFINITY;
                }
                double c = logGamma(n + 1) - logGamma(x + 1) - logGamma(n - x + 1);
                double a = x == 0 ? 0 : x * Math.log(q);
                double b = x == n ? 0 : (n - x) * Math.log1p(-q);
                return c + a + b;
            }
            default:
                throw new IllegalArgumentException("not a one-variable family: " + f);
        }
    }

    private static int state(double x, int k) {
        if (x != Math.rint(x) || x < 0 || x >= k) {
            return -1;
        }
        return (int) x;
    }

    /** log Gamma(x) for x &gt; 0 (Lanczos approximation, with reflection below 1/2). */
    public static double logGamma(double x) {
        if (x < 0.5) {
            return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
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
