package dev.circa.format.io;

/**
 * The double nearest to a decimal {@code w * 10^q} (ties to even, as {@link Double#parseDouble} rounds),
 * for the decimals a reader meets most, without a string and without big integers: significands below
 * 2^60 (18 digits always fit) and exponents in [-{@value #MAX_EXPONENT}, {@value #MAX_EXPONENT}], which
 * covers every shortest decimal of a double from about 1e-10 to 1e27, such as 17-digit weights and
 * parameters. Other decimals return NaN and the caller decodes them the general way.
 *
 * <p>How: when both {@code w} and {@code 10^|q|} are exact doubles ({@code w <= 2^53}, {@code |q| <= 22}) one
 * correctly rounded multiplication or division is the answer. Otherwise that quotient or product, at
 * most two units in the last place away, is corrected by comparing the decimal exactly with the
 * midpoints between neighbouring doubles: {@code w * 10^q} against {@code M * 2^f} becomes
 * {@code w * 5^q} against {@code M} ({@code q >= 0}) or {@code w} against {@code M * 5^-q} ({@code q < 0}), each side at
 * most 123 bits, compared in two longs.
 */
public final class DecimalToDouble {
    /** Largest |q| decoded here: 5^27 is the largest power of five below 2^63. */
    public static final int MAX_EXPONENT = 27;
    /** Significands at or above this go to the general decoder. */
    public static final long MAX_SIGNIFICAND = 1L << 60;

    private static final long[] POW5 = new long[MAX_EXPONENT + 1];
    private static final double[] POW10 = new double[MAX_EXPONENT + 1];

    static {
        long p = 1;
        for (int i = 0; i <= MAX_EXPONENT; i++) {
            POW5[i] = p;
            p *= 5;
            // 1e0..1e22 are exact doubles; 1e23..1e27 are the nearest doubles (within half a unit)
            POW10[i] = Double.parseDouble("1e" + i);
        }
    }

    private DecimalToDouble() {
    }

    /**
     * The double nearest to {@code (negative ? -1 : 1) * w * 10^q}, or NaN when {@code w} or {@code q}
     * is out of this class's range (then decode the text another way). {@code w} = 0 gives a signed zero.
     */
    public static double toDouble(boolean negative, long w, int q) {
        if (w == 0) {
            return negative ? -0.0 : 0.0;
        }
        if (w < 0 || w >= MAX_SIGNIFICAND || q < -MAX_EXPONENT || q > MAX_EXPONENT) {
            return Double.NaN;
        }
        double v;
        if (w <= (1L << 53) && q >= -22 && q <= 22) {
            // both operands exact: the one rounding of the operation is the correct rounding
            v = q < 0 ? (double) w / POW10[-q] : (double) w * POW10[q];
        } else {
            v = nearest(w, q);
            if (Double.isNaN(v)) {
                return v;
            }
        }
        return negative ? -v : v;
    }

    /** Corrects the approximate result by exact comparisons with the midpoints beside it. */
    private static double nearest(long w, int q) {
        double approx = q < 0 ? (double) w / POW10[-q] : (double) w * POW10[q];
        long bits = Double.doubleToRawLongBits(approx);
        // the approximation carries at most three roundings of half a unit each: a few steps at most
        for (int step = 0; step < 8; step++) {
            int up = compareWithMidpoint(w, q, bits);
            if (up > 0 || (up == 0 && (bits & 1) != 0)) {
                bits++;
                continue;
            }
            if (up == 0) {
                return Double.longBitsToDouble(bits);
            }
            int down = compareWithMidpoint(w, q, bits - 1);
            if (down < 0 || (down == 0 && (bits & 1) != 0)) {
                bits--;
                continue;
            }
            return Double.longBitsToDouble(bits);
        }
        return Double.NaN;
    }

    /**
     * The sign of {@code w * 10^q} minus the midpoint between the positive normal doubles with bits
     * {@code lower} and {@code lower + 1}.
     */
    private static int compareWithMidpoint(long w, int q, long lower) {
        int exp = (int) (lower >>> 52);
        long m = (lower & 0xFFFFFFFFFFFFFL) | (1L << 52);
        int e = exp - 1075;
        // the upper neighbour is (m + 1) * 2^e (also when m + 1 = 2^53): the midpoint is (2m + 1) * 2^(e - 1)
        long mid = 2 * m + 1;
        int f = e - 1;
        if (q >= 0) {
            // w * 5^q * 2^q against mid * 2^f
            long p = POW5[q];
            return compareScaled(Math.multiplyHigh(w, p), w * p, q, 0, mid, f);
        }
        // w against mid * 5^-q * 2^(f - q)
        long p = POW5[-q];
        return compareScaled(0, w, 0, Math.multiplyHigh(mid, p), mid * p, f - q);
    }

    /**
     * The sign of {@code X * 2^x - Y * 2^y} for unsigned 128-bit {@code X = (xh, xl)} and {@code Y = (yh, yl)},
     * both nonzero and below 2^126.
     */
    static int compareScaled(long xh, long xl, int x, long yh, long yl, int y) {
        int bx = bitLength(xh, xl) + x;
        int by = bitLength(yh, yl) + y;
        if (bx != by) {
            return bx > by ? 1 : -1;
        }
        // same length: shift the shorter significand up to the longer one's bits (stays within 128 bits)
        int s = x - y;
        if (s > 0) {
            long h = s >= 64 ? xl << (s - 64) : (xh << s) | (xl >>> (64 - s));
            xl = s >= 64 ? 0 : xl << s;
            xh = h;
        } else if (s < 0) {
            s = -s;
            long h = s >= 64 ? yl << (s - 64) : (yh << s) | (yl >>> (64 - s));
            yl = s >= 64 ? 0 : yl << s;
            yh = h;
        }
        if (xh != yh) {
            return Long.compareUnsigned(xh, yh) > 0 ? 1 : -1;
        }
        return Integer.signum(Long.compareUnsigned(xl, yl));
    }

    private static int bitLength(long h, long l) {
        return h != 0 ? 128 - Long.numberOfLeadingZeros(h) : 64 - Long.numberOfLeadingZeros(l);
    }
}
