package dev.circa.engine.random;

import dev.circa.engine.family.SpecialFunctions;

/** Non-uniform variates drawn from a {@link Xoshiro256} by published exact methods, in {@link StrictMath}. */
public final class Variates {
    /** Below this rate the Poisson is drawn by multiplying uniforms, above by transformed rejection. */
    private static final double POISSON_REJECTION_FROM = 10;
    /** Binomials with at most this many trials are drawn as a count of Bernoulli trials. */
    private static final int BINOMIAL_DIRECT_UPTO = 64;

    private Variates() {
    }

    /** A Gamma(shape, 1) variate (Marsaglia and Tsang, 2000; shape {@literal <} 1 by the power boost). */
    public static double gamma(Xoshiro256 rng, double shape) {
        if (shape < 1) {
            double g = gamma(rng, shape + 1);
            return g * StrictMath.pow(rng.nextOpenDouble(), 1 / shape);
        }
        double d = shape - 1.0 / 3;
        double c = 1 / StrictMath.sqrt(9 * d);
        while (true) {
            double x;
            double v;
            do {
                x = rng.nextGaussian();
                v = 1 + c * x;
            } while (v <= 0);
            v = v * v * v;
            double u = rng.nextOpenDouble();
            double x2 = x * x;
            if (u < 1 - 0.0331 * x2 * x2) {
                return d * v;
            }
            if (StrictMath.log(u) < 0.5 * x2 + d * (1 - v + StrictMath.log(v))) {
                return d * v;
            }
        }
    }

    /**
     * A Beta(a, b) variate as X / (X + Y) with X ~ Gamma(a), Y ~ Gamma(b). Where X + Y leaves double
     * range (both shapes near the largest double) the ratio is taken of halves; where both underflow to 0
     * (tiny shapes) it is taken of their logarithms, so the draw is never NaN.
     */
    public static double beta(Xoshiro256 rng, double a, double b) {
        // drawn as gamma() draws them, keeping the pieces of a shape below 1 for the logarithms
        double gx = a < 1 ? gamma(rng, a + 1) : gamma(rng, a);
        double ux = a < 1 ? rng.nextOpenDouble() : 1;
        double x = a < 1 ? gx * StrictMath.pow(ux, 1 / a) : gx;
        double gy = b < 1 ? gamma(rng, b + 1) : gamma(rng, b);
        double uy = b < 1 ? rng.nextOpenDouble() : 1;
        double y = b < 1 ? gy * StrictMath.pow(uy, 1 / b) : gy;
        double sum = x + y;
        if (sum == Double.POSITIVE_INFINITY) {
            return (0.5 * x) / (0.5 * x + 0.5 * y);
        }
        if (x > 0 && y > 0) {
            return x / sum;
        }
        double powX = StrictMath.log(ux) / a;
        double powY = StrictMath.log(uy) / b;
        if (Double.isInfinite(powX) || Double.isInfinite(powY)) {
            // subnormal shapes: the draw is 0 or 1 by which power term is smaller
            double sign = StrictMath.log(ux) * b - StrictMath.log(uy) * a;
            return sign < 0 ? 0 : sign > 0 ? 1 : 0.5;
        }
        // 1 / (1 + Y / X) from the logarithms
        return 1 / (1 + StrictMath.exp(StrictMath.log(gy) + powY - StrictMath.log(gx) - powX));
    }

    /**
     * A Poisson variate: multiplication of uniforms for small rates, Hoermann's transformed rejection
     * with squeeze (PTRS, 1993) otherwise.
     */
    public static double poisson(Xoshiro256 rng, double rate) {
        if (rate < POISSON_REJECTION_FROM) {
            double limit = StrictMath.exp(-rate);
            double prod = rng.nextDouble();
            long k = 0;
            while (prod > limit) {
                k++;
                prod *= rng.nextDouble();
            }
            return k;
        }
        double slam = StrictMath.sqrt(rate);
        double logRate = StrictMath.log(rate);
        double b = 0.931 + 2.53 * slam;
        double a = -0.059 + 0.02483 * b;
        double invAlpha = 1.1239 + 1.1328 / (b - 3.4);
        double vr = 0.9277 - 3.6224 / (b - 2);
        while (true) {
            double u = rng.nextDouble() - 0.5;
            double v = rng.nextDouble();
            double us = 0.5 - Math.abs(u);
            double k = Math.floor((2 * a / us + b) * u + rate + 0.43);
            if (us >= 0.07 && v <= vr) {
                return k;
            }
            if (k < 0 || (us < 0.013 && v > us)) {
                continue;
            }
            if (StrictMath.log(v) + StrictMath.log(invAlpha) - StrictMath.log(a / (us * us) + b)
                    <= -rate + k * logRate - SpecialFunctions.logGamma(k + 1)) {
                return k;
            }
        }
    }

    /**
     * A binomial variate: Knuth's beta splitting (The Art of Computer Programming, vol. 2, 3.4.1) halves
     * the number of trials until few remain, which are then drawn one by one.
     */
    public static double binomial(Xoshiro256 rng, long trials, double p) {
        long n = trials;
        double prob = p;
        long count = 0;
        while (n > BINOMIAL_DIRECT_UPTO) {
            long a = 1 + n / 2;
            long b = n - a + 1;
            double x = beta(rng, a, b);
            if (x >= prob) {
                n = a - 1;
                prob = prob / x;
            } else {
                count += a;
                n = b - 1;
                prob = (prob - x) / (1 - x);
            }
        }
        for (long i = 0; i < n; i++) {
            if (rng.nextDouble() < prob) {
                count++;
            }
        }
        return count;
    }
}
