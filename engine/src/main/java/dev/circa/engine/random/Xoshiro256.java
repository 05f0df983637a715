package dev.circa.engine.random;

/**
 * The engine's random generator: xoshiro256** (Blackman and Vigna, 2018), its 256-bit state filled from
 * four successive outputs of a SplitMix64 generator. A stream is named by a (seed, row) pair: SplitMix64
 * starts at {@code mix64(seed) ^ mix64(row)}, with {@code mix64} the SplitMix64 output function, so every
 * row has its own stream and draws do not depend on the order rows are sampled in, the machine or the
 * number of threads. Variates use {@link StrictMath} only. Not thread-safe.
 */
public final class Xoshiro256 {
    private static final long GOLDEN_GAMMA = 0x9E3779B97F4A7C15L;
    private static final double DOUBLE_UNIT = 0x1.0p-53;

    private long s0;
    private long s1;
    private long s2;
    private long s3;
    private double spareGaussian;
    private boolean hasSpare;

    /** A generator on the stream (seed, 0). */
    public Xoshiro256(long seed) {
        reseed(seed, 0);
    }

    /** Restarts this generator on the stream named by (seed, row). */
    public void reseed(long seed, long row) {
        long x = mix64(seed) ^ mix64(row);
        x += GOLDEN_GAMMA;
        s0 = mix64(x);
        x += GOLDEN_GAMMA;
        s1 = mix64(x);
        x += GOLDEN_GAMMA;
        s2 = mix64(x);
        x += GOLDEN_GAMMA;
        s3 = mix64(x);
        hasSpare = false;
    }

    /** The SplitMix64 output function (a bijection on 64-bit values). */
    public static long mix64(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /** The next 64 random bits. */
    public long nextLong() {
        long result = Long.rotateLeft(s1 * 5, 7) * 9;
        long t = s1 << 17;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= t;
        s3 = Long.rotateLeft(s3, 45);
        return result;
    }

    /** A uniform double in [0, 1) with 53 random bits. */
    public double nextDouble() {
        return (nextLong() >>> 11) * DOUBLE_UNIT;
    }

    /** A uniform double in (0, 1). */
    public double nextOpenDouble() {
        return ((nextLong() >>> 11) + 0.5) * DOUBLE_UNIT;
    }

    /** A standard normal variate (Marsaglia's polar method; the second value of a pair is kept). */
    public double nextGaussian() {
        if (hasSpare) {
            hasSpare = false;
            return spareGaussian;
        }
        double u;
        double v;
        double s;
        do {
            u = 2 * nextDouble() - 1;
            v = 2 * nextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        double f = StrictMath.sqrt(-2 * StrictMath.log(s) / s);
        spareGaussian = v * f;
        hasSpare = true;
        return u * f;
    }
}
