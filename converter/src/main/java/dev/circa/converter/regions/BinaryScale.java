package dev.circa.converter.regions;

/**
 * Numbers held as a linear value and an integer power of two ({@code value = y * 2^E}), for the linear
 * evaluation of {@link LinearPass}: exact powers of two built from their bits, the conversion of a
 * log-value to such a pair and back, with ln 2 split in two so that {@code E * ln 2} keeps its digits for
 * large |E|. Stateless.
 */
final class BinaryScale {
    /**
     * ln 2 in two parts (the usual split, common practice): the high part has 21 trailing zero bits, so
     * {@code E * LN2_HI} is exact for |E| {@literal <} 2^21; {@code LN2_HI + LN2_LO} is ln 2 to about 2^-85.
     */
    static final double LN2_HI = 0x1.62e42feep-1;
    static final double LN2_LO = 0x1.a39ef35793c76p-33;
    static final double INV_LN2 = 1 / Math.log(2);
    /**
     * A log-value turned into a pair must be below this in magnitude, so that its exponent (at most 2^21) times
     * {@link #LN2_HI} is exact; a row with a larger one takes the log-domain evaluation.
     */
    static final double LOG_LIMIT = 0x1p20;

    private BinaryScale() {
    }

    /**
     * 2^k for k {@literal <=} 1023, exact: a normal number from its exponent bits, a subnormal below -1022, 0
     * below -1074.
     */
    static double pow2(long k) {
        if (k >= -1022) {
            return Double.longBitsToDouble((k + 1023) << 52);
        }
        return k >= -1074 ? Double.longBitsToDouble(1L << (k + 1074)) : 0;
    }

    /** The exponent E of a log-value m, |m| {@literal <} {@link #LOG_LIMIT}: floor(m / ln 2), so e^(m - E ln 2) is in [1, 2). */
    static long exponentOf(double m) {
        return (long) Math.floor(m * INV_LN2);
    }

    /** e^(v - E ln 2), with E ln 2 taken in two parts (exact subtraction of the high part near v). */
    static double linear(double v, double e) {
        return Math.exp((v - e * LN2_HI) - e * LN2_LO);
    }

    /** log(y * 2^E) = log y + E ln 2, E ln 2 added by fused multiply-adds of its two parts. */
    static double log(double y, long e) {
        double d = e;
        return Math.fma(d, LN2_HI, Math.fma(d, LN2_LO, Math.log(y)));
    }

    /** floor(log2 w) for a finite w {@literal >} 0, subnormals included. */
    static int exponent(double w) {
        return w >= Double.MIN_NORMAL ? Math.getExponent(w) : Math.getExponent(w * 0x1p60) - 60;
    }
}
