package dev.circa.engine.family;

/**
 * Log-gamma, log-beta and Loader's saddle-point terms for the Poisson, binomial, gamma and beta
 * densities. Every loop is bounded (at most 15 recurrence steps, at most {@value #DEVIANCE_SERIES_TERMS}
 * series terms), and every function is defined over the whole double range: a result beyond it is an
 * infinity of the right sign, never NaN for arguments in the domain. Everything uses {@link StrictMath} so
 * that the sampler, which relies on these, draws the same values on every machine.
 */
public final class SpecialFunctions {
    /** log(2 pi) / 2. */
    public static final double HALF_LOG_2PI = 0.5 * StrictMath.log(2 * Math.PI);
    private static final double LOG_2PI = StrictMath.log(2 * Math.PI);
    /** Arguments below this are shifted up by the recurrence before the Stirling series is used. */
    private static final double STIRLING_FROM = 15.0;
    /** stirlingError(n) for n = 0..15, from exact factorials. */
    private static final double[] STIRLING_ERROR_TABLE = new double[16];

    static {
        double factorial = 1;
        for (int n = 1; n < STIRLING_ERROR_TABLE.length; n++) {
            factorial *= n; // exact in a double up to 18!
            STIRLING_ERROR_TABLE[n] = StrictMath.log(factorial) - (n + 0.5) * StrictMath.log(n) + n - HALF_LOG_2PI;
        }
    }

    private SpecialFunctions() {
    }

    /** log Gamma(x) for x {@literal >} 0 (NaN for x {@literal <=} 0 or NaN, +inf for +inf). */
    public static double logGamma(double x) {
        if (!(x > 0)) {
            return Double.NaN;
        }
        if (x == Double.POSITIVE_INFINITY) {
            return x;
        }
        double z = x;
        double product = 1;
        while (z < STIRLING_FROM) {
            product *= z;
            z += 1;
        }
        double shift = product == 1 ? 0 : StrictMath.log(product);
        return stirling(z) - shift;
    }

    /** log Gamma(z) by the Stirling series with Bernoulli-number terms; accurate to rounding for z >= 15. */
    private static double stirling(double z) {
        return (z - 0.5) * StrictMath.log(z) - z + HALF_LOG_2PI + stirlingSeries(z);
    }

    /**
     * log B(a, b) = log Gamma(a) + log Gamma(b) - log Gamma(a + b) for a, b > 0, finite over the whole
     * double range: where a or b is large the Stirling terms are grouped so that no intermediate
     * overflows (a + b may exceed the largest double) and the large terms cancel algebraically.
     */
    public static double logBeta(double a, double b) {
        double big = Math.max(a, b);
        double small = Math.min(a, b);
        if (big < STIRLING_FROM) {
            return logGamma(a) + logGamma(b) - logGamma(a + b);
        }
        if (small >= STIRLING_FROM) {
            // (a - 1/2) log(a / s) + (b - 1/2) log(b / s) - log(s) / 2 + log(2 pi) / 2 with s = a + b
            double logS = StrictMath.log(big) + StrictMath.log1p(small / big);
            return HALF_LOG_2PI - (big - 0.5) * StrictMath.log1p(small / big)
                    - (small - 0.5) * StrictMath.log1p(big / small) - 0.5 * logS
                    + stirlingSeries(big) + stirlingSeries(small) - stirlingSeries(big + small);
        }
        return logGamma(small) + logGammaRatio(big, small);
    }

    /** log Gamma(a) - log Gamma(a + b) for a >= 15 and 0 < b <= a, without forming either term. */
    private static double logGammaRatio(double a, double b) {
        double t = b / a;
        double log1pT = StrictMath.log1p(t);
        double logS = StrictMath.log(a) + log1pT;
        return b * oneMinusLog1pOver(t) + 0.5 * log1pT - b * logS + stirlingSeries(a) - stirlingSeries(a + b);
    }

    /** 1 - log(1 + t) / t for t > 0, accurate for small t. */
    private static double oneMinusLog1pOver(double t) {
        if (t < 1e-4) {
            return t * (0.5 - t * (1.0 / 3 - t * 0.25));
        }
        return 1 - StrictMath.log1p(t) / t;
    }

    /** The correction term of the Stirling series, log Gamma(z) - ((z - 1/2) log z - z + log(2 pi) / 2), for z >= 15. */
    private static double stirlingSeries(double z) {
        if (z == Double.POSITIVE_INFINITY) {
            return 0;
        }
        double inv = 1 / z;
        double inv2 = inv * inv;
        return inv * (1.0 / 12 - inv2 * (1.0 / 360 - inv2 * (1.0 / 1260 - inv2 * (1.0 / 1680
                - inv2 * (1.0 / 1188 - inv2 * (691.0 / 360360 - inv2 * (1.0 / 156 - inv2 * (3617.0 / 122400))))))));
    }

    /**
     * The Stirling error log Gamma(n + 1) - (n + 1/2) log n + n - log sqrt(2 pi) for n > 0 (Loader, "Fast
     * and accurate computation of binomial probabilities", 2000); exact from a table for whole n below 16.
     */
    public static double stirlingError(double n) {
        if (n < STIRLING_ERROR_TABLE.length) {
            if (n == Math.rint(n)) {
                return STIRLING_ERROR_TABLE[(int) n];
            }
            return logGamma(n + 1) - (n + 0.5) * StrictMath.log(n) + n - HALF_LOG_2PI;
        }
        if (n == Double.POSITIVE_INFINITY) {
            return 0;
        }
        double nn = n * n;
        return (1.0 / 12 - (1.0 / 360 - (1.0 / 1260 - (1.0 / 1680 - (1.0 / 1188) / nn) / nn) / nn) / nn) / n;
    }

    /** Terms of the series of {@link #deviancePart}: each is at most 1/100 of the one before, so 60 reach rounding. */
    private static final int DEVIANCE_SERIES_TERMS = 60;

    /**
     * The deviance term x log(x / mu) + mu - x for x >= 0 and mu > 0, computed without cancellation near
     * x = mu (Loader, 2000) and without overflow anywhere in double range; +inf when the true value exceeds
     * the largest double.
     */
    public static double deviancePart(double x, double mu) {
        if (x == 0) {
            return mu;
        }
        double half = 0.5 * x + 0.5 * mu;
        double d = x - mu;
        if (Math.abs(d) < 0.2 * half) {
            double v = 0.5 * d / half; // d / (x + mu) with x + mu possibly beyond double range
            double s = v * d;
            double ej = 2.0 * (x * v);
            double w = v * v;
            for (int j = 1; j <= DEVIANCE_SERIES_TERMS; j++) {
                ej *= w;
                double next = s + ej / (j * 2 + 1);
                if (next == s) {
                    break;
                }
                s = next;
            }
            return s;
        }
        double ratio = x / mu;
        double logRatio = ratio > Double.MIN_NORMAL && ratio < Double.POSITIVE_INFINITY
                ? StrictMath.log(ratio) : StrictMath.log(x) - StrictMath.log(mu);
        return x * logRatio + (mu - x);
    }

    /** log of the Poisson mass at the integer {@code k >= 0} with the given rate > 0. */
    public static double logPoisson(double k, double rate) {
        if (k == 0) {
            return -rate;
        }
        return -stirlingError(k) - deviancePart(k, rate) - HALF_LOG_2PI - 0.5 * StrictMath.log(k);
    }

    /**
     * log of mu^k e^-mu / Gamma(k + 1) for real k >= 0 and mu >= 0 (the Poisson mass extended to real k,
     * Loader's form of the gamma density): no intermediate overflows or cancels.
     */
    public static double logPoissonRaw(double k, double mu) {
        if (mu == 0) {
            return k == 0 ? 0 : Double.NEGATIVE_INFINITY;
        }
        if (mu == Double.POSITIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        if (k == 0) {
            return -mu;
        }
        return -stirlingError(k) - deviancePart(k, mu) - HALF_LOG_2PI - 0.5 * StrictMath.log(k);
    }

    /** log of the binomial mass at the integer {@code 0 <= k <= n} with success probability p. */
    public static double logBinomial(double k, double n, double p) {
        double q = 1 - p;
        if (n == 0) {
            return 0;
        }
        if (k == 0) {
            return p < 0.1 ? -deviancePart(n, n * q) - n * p : n * StrictMath.log(q);
        }
        if (k == n) {
            return q < 0.1 ? -deviancePart(n, n * p) - n * q : n * StrictMath.log(p);
        }
        double core = stirlingError(n) - stirlingError(k) - stirlingError(n - k)
                - deviancePart(k, n * p) - deviancePart(n - k, n * q);
        return core - 0.5 * (LOG_2PI + StrictMath.log(k) + StrictMath.log(n - k) - StrictMath.log(n));
    }
}
