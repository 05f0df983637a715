package dev.circa.engine.family;

/**
 * Log-gamma and Loader's saddle-point terms for the Poisson and binomial masses. Everything uses
 * {@link StrictMath} so that the sampler, which relies on these, draws the same values on every machine.
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
        double inv = 1 / z;
        double inv2 = inv * inv;
        double series = inv * (1.0 / 12 - inv2 * (1.0 / 360 - inv2 * (1.0 / 1260 - inv2 * (1.0 / 1680
                - inv2 * (1.0 / 1188 - inv2 * (691.0 / 360360 - inv2 * (1.0 / 156 - inv2 * (3617.0 / 122400))))))));
        return (z - 0.5) * StrictMath.log(z) - z + HALF_LOG_2PI + series;
    }

    /** log B(a, b) = log Gamma(a) + log Gamma(b) - log Gamma(a + b). */
    public static double logBeta(double a, double b) {
        return logGamma(a) + logGamma(b) - logGamma(a + b);
    }

    /**
     * The Stirling error log(n!) - (n + 1/2) log n + n - log sqrt(2 pi) for an integer n >= 1 (Loader,
     * "Fast and accurate computation of binomial probabilities", 2000).
     */
    public static double stirlingError(double n) {
        if (n < STIRLING_ERROR_TABLE.length) {
            return STIRLING_ERROR_TABLE[(int) n];
        }
        double nn = n * n;
        return (1.0 / 12 - (1.0 / 360 - (1.0 / 1260 - (1.0 / 1680 - (1.0 / 1188) / nn) / nn) / nn) / nn) / n;
    }

    /** The deviance term x log(x / mu) + mu - x, computed without cancellation near x = mu (Loader, 2000). */
    public static double deviancePart(double x, double mu) {
        if (Math.abs(x - mu) < 0.1 * (x + mu)) {
            double d = x - mu;
            double v = d / (x + mu);
            double s1 = v * d;
            double s = Double.NaN;
            double ej = 2.0 * x * v;
            v *= v;
            int j = 1;
            while (s1 != s) {
                s = s1;
                ej *= v;
                s1 = s + ej / (j * 2 + 1);
                j++;
            }
            return s1;
        }
        return x * StrictMath.log(x / mu) + mu - x;
    }

    /** log of the Poisson mass at the integer {@code k >= 0} with the given rate > 0. */
    public static double logPoisson(double k, double rate) {
        if (k == 0) {
            return -rate;
        }
        return -stirlingError(k) - deviancePart(k, rate) - HALF_LOG_2PI - 0.5 * StrictMath.log(k);
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
