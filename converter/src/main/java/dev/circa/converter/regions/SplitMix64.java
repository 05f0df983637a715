package dev.circa.converter.regions;

/**
 * The seeded generator of the region-graph tools, so that a seed gives the same bytes on any
 * platform: SplitMix64 (state advanced by the golden-ratio constant 0x9E3779B97F4A7C15, output
 * mixed by the variant-13 finaliser: xor-shift 30, multiply 0xBF58476D1CE4E5B9, xor-shift 27,
 * multiply 0x94D049BB133111EB, xor-shift 31). Derived draws use only integer arithmetic and
 * {@link StrictMath}. Not thread-safe.
 */
public final class SplitMix64 {
    private long state;

    /** A generator whose first output depends only on {@code seed}. */
    public SplitMix64(long seed) {
        this.state = seed;
    }

    /** The next 64 random bits. */
    public long nextLong() {
        long z = (state += 0x9E3779B97F4A7C15L);
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /** A uniform double in [0, 1): the top 53 bits of {@link #nextLong()} times 2^-53. */
    public double nextDouble() {
        return (nextLong() >>> 11) * 0x1.0p-53;
    }

    /** A uniform double in (0, 1]. */
    public double nextOpenDouble() {
        return ((nextLong() >>> 11) + 1) * 0x1.0p-53;
    }

    /** A uniform double in [lo, hi). */
    public double uniform(double lo, double hi) {
        return lo + (hi - lo) * nextDouble();
    }

    /**
     * A uniform integer in [0, bound): 63 random bits modulo {@code bound}, redrawn when they fall in
     * the incomplete last block (so there is no bias).
     */
    public int nextInt(int bound) {
        if (bound <= 0) {
            throw new IllegalArgumentException("bound must be positive: " + bound);
        }
        long limit = Long.MAX_VALUE - Long.MAX_VALUE % bound;
        long r;
        do {
            r = nextLong() >>> 1;
        } while (r >= limit);
        return (int) (r % bound);
    }

    /** A standard normal draw (Box-Muller, one value per pair of uniforms). */
    public double nextGaussian() {
        double u = nextOpenDouble();
        double v = nextDouble();
        return StrictMath.sqrt(-2 * StrictMath.log(u)) * StrictMath.cos(2 * StrictMath.PI * v);
    }

    /**
     * A Gamma(shape, 1) draw: Marsaglia and Tsang's method for shape {@literal >=} 1; for shape {@literal <} 1 a
     * Gamma(shape + 1) draw times U^(1/shape).
     */
    public double nextGamma(double shape) {
        if (!(shape > 0)) {
            throw new IllegalArgumentException("gamma shape must be positive: " + shape);
        }
        if (shape < 1) {
            double g = nextGamma(shape + 1);
            return g * StrictMath.pow(nextOpenDouble(), 1 / shape);
        }
        double d = shape - 1.0 / 3;
        double c = 1 / StrictMath.sqrt(9 * d);
        while (true) {
            double x;
            double v;
            do {
                x = nextGaussian();
                v = 1 + c * x;
            } while (v <= 0);
            v = v * v * v;
            double u = nextOpenDouble();
            if (u < 1 - 0.0331 * x * x * x * x || StrictMath.log(u) < 0.5 * x * x + d * (1 - v + StrictMath.log(v))) {
                return d * v;
            }
        }
    }

    /** Fills {@code out[from, from+n)} with a symmetric Dirichlet(alpha) draw: Gamma(alpha) draws normalised. */
    public void dirichlet(double alpha, double[] out, int from, int n) {
        double sum = 0;
        for (int i = 0; i < n; i++) {
            double g = nextGamma(alpha);
            out[from + i] = g;
            sum += g;
        }
        if (!(sum > 0)) {
            for (int i = 0; i < n; i++) {
                out[from + i] = 1.0 / n;
            }
            return;
        }
        for (int i = 0; i < n; i++) {
            out[from + i] /= sum;
        }
    }
}
