package dev.circa.engine.internal;

/**
 * A dense block's sums held in linear form at a row, for the blocks that read them as parts: the block's
 * K sums at row r are {@code y_k * e^L}, with mantissas y_k in their sums' slots and the row's log offset L
 * in the block's offset slot ({@link DenseBlocks#offsetSlot}). The largest y_k of a row is in [1, 2) (every
 * y scaled by one exact power of two) and every y_k of a sum with a non-zero weight is a normal double, so
 * a parent takes a part's y as they are (no exponential) and the part's L as its offset; the log-value
 * {@code log y + L} is taken only by the exact log-sum-exp of a parent. A row whose sums this form cannot
 * hold (the sum below {@link DenseKernel#TINY} that goes the exact way, a part +inf or NaN, every product
 * 0, a mantissa below the normal range) holds log-values in the sums' slots instead, as every other block
 * does, and L = NaN says so. Which form a row takes depends on that row alone. Stateless.
 */
final class LinearOutput {
    /**
     * ln 2 in two parts (the usual split, common practice): the high part has trailing zero bits enough for
     * {@code ex * LN2_HI} to be exact for every exponent of a double; {@code LN2_HI + LN2_LO} is ln 2 to about
     * 2^-85.
     */
    static final double LN2_HI = 0x1.62e42feep-1;
    static final double LN2_LO = 0x1.a39ef35793c76p-33;
    /**
     * Smallest factor e^(lw_k - lwTop) (a sum's largest log-weight against the block's largest) a block may
     * have for its sums to be held in linear form: with a sum of at least {@link DenseKernel#TINY}, every
     * product y * factor stays in the normal range.
     */
    static final double MIN_SUM_SCALE = 1e-100;
    /**
     * A row's largest sum times its factor must be below this for the row to be held: every other is at least
     * {@link DenseKernel#TINY} (about 2^-664), so scaled by the largest's power of two it stays above 2^-964, a
     * normal double.
     */
    static final double TOP_LIMIT = 0x1p300;

    private LinearOutput() {
    }

    /** 2^k for -1022 {@literal <=} k {@literal <=} 1023, exact, from its exponent bits. */
    static double pow2(int k) {
        return Double.longBitsToDouble((long) (k + 1023) << 52);
    }

    /** The row's log offset: {@code base + ex ln 2}, ln 2 in two parts, in this order (the same bits everywhere). */
    static double offset(double base, int ex) {
        return base + ex * LN2_HI + ex * LN2_LO;
    }

    /**
     * Whether a block's sums at a row are held in linear form: no part +inf or NaN ({@code check} 0), some
     * product not 0 (the block maximum not -inf), every sum with a non-zero weight at least
     * {@link DenseKernel#TINY} once times its factor ({@code low}, so its digits are sound: the largest product
     * is at least 1 and what underflowed is below 2^-1022 of it) and the largest below {@link #TOP_LIMIT}
     * ({@code top}, so that every scaled mantissa is a normal double). NaN in {@code low} or {@code top} fails.
     */
    static boolean held(double check, double blockMax, double low, double top) {
        return check == 0 & blockMax != Double.NEGATIVE_INFINITY & low >= DenseKernel.TINY & top < TOP_LIMIT;
    }
}
