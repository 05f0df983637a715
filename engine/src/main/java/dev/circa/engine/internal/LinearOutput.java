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

    /** Whether a sum's linear value {@code ct} (before its factor) can be held: at least TINY and finite. */
    static boolean holds(double ct) {
        return ct >= DenseKernel.TINY && ct <= Double.MAX_VALUE;
    }
}
