package dev.circa.converter.regions;

import dev.circa.format.Family;

/**
 * Log-densities and log-masses of the scalar and categorical input families, written here from
 * their textbook formulas so that the region-by-region evaluation does not share code with the
 * engine it checks. A value outside the support (or a non-integer for a discrete family) gives
 * -inf. Stateless; not for application code.
 */
final class LogDensities {
    private static final double HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);
    private static final double[] LANCZOS = {
        0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
        -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
        1.5056327351493116e-7};

    private LogDensities() {
    }

    /** The log-density (or log-mass) of {@code family} with {@code params} at {@code x}. */
    static double of(Family family, double[] p, double x) {
        switch (family) {
            case NORMAL: {
                double z = (x - p[0]) / p[1];
                return -0.5 * z * z - Math.log(p[1]) - HALF_LOG_TWO_PI;
            }
            case LOGNORMAL: {
                if (!(x > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                double lx = Math.log(x);
                double z = (lx - p[0]) / p[1];
                return -0.5 * z * z - Math.log(p[1]) - HALF_LOG_TWO_PI - lx;
            }
            case EXPONENTIAL:
                return x >= 0 ? Math.log(p[0]) - p[0] * x : Double.NEGATIVE_INFINITY;
            case GAMMA:
                if (!(x > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return p[0] * Math.log(p[1]) - logGamma(p[0]) + (p[0] - 1) * Math.log(x) - p[1] * x;
            case BETA:
                if (!(x > 0 && x < 1)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return (p[0] - 1) * Math.log(x) + (p[1] - 1) * Math.log1p(-x)
                        - (logGamma(p[0]) + logGamma(p[1]) - logGamma(p[0] + p[1]));
            case UNIFORM:
                return x >= p[0] && x <= p[1] ? -Math.log(p[1] - p[0]) : Double.NEGATIVE_INFINITY;
            case POISSON: {
                if (!(x >= 0) || x != Math.rint(x)) {
                    return Double.NEGATIVE_INFINITY;
                }
                return x * Math.log(p[0]) - p[0] - logGamma(x + 1);
            }
            case BINOMIAL: {
                double n = p[0];
                double q = p[1];
                if (!(x >= 0) || x != Math.rint(x) || x > n) {
                    return Double.NEGATIVE_INFINITY;
                }
                double c = logGamma(n + 1) - logGamma(x + 1) - logGamma(n - x + 1);
                return c + xlogy(x, q) + xlogy(n - x, 1 - q);
            }
            case BERNOULLI:
                if (x == 1) {
                    return Math.log(p[0]);
                }
                return x == 0 ? Math.log1p(-p[0]) : Double.NEGATIVE_INFINITY;
            case CATEGORICAL: {
                if (!(x >= 0) || x != Math.rint(x) || x >= p.length) {
                    return Double.NEGATIVE_INFINITY;
                }
                return Math.log(p[(int) x]);
            }
            case INDICATOR:
                return x == p[0] ? 0 : Double.NEGATIVE_INFINITY;
            default:
                throw new IllegalArgumentException(family.jsonName() + " is not a compile family");
        }
    }

    /** x log y with 0 log 0 = 0. */
    private static double xlogy(double x, double y) {
        return x == 0 ? 0 : x * Math.log(y);
    }

    /** log Gamma(x) for x > 0 (Lanczos approximation, g = 7, nine coefficients; relative error near 1e-15). */
    static double logGamma(double x) {
        if (x < 0.5) {
            return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
        }
        double y = x - 1;
        double a = LANCZOS[0];
        double t = y + 7.5;
        for (int i = 1; i < 9; i++) {
            a += LANCZOS[i] / (y + i);
        }
        return HALF_LOG_TWO_PI + (y + 0.5) * Math.log(t) - t + Math.log(a);
    }
}
