package dev.circa.engine.internal;

/**
 * The exact way for a dense block's sum at one row, where the linear sum cannot be trusted: the generic
 * log-sum-exp over the sum's edges, each product child's log-value taken as the sum of its children's, in
 * child order. A child held in linear form ({@link LinearOutput}) gives {@code log y + L}, or its log-value
 * when its row holds log-values (L = NaN). The kernel trusts its input.
 */
final class ExactSum {
    private ExactSum() {
    }

    /**
     * The log-value of a block's sum {@code node} at row r from its linear sum {@code sum} (weights scaled by
     * {@code maxLogWeight}, products by {@code blockMax}): -inf when either is -inf, log(sum) + maxLogWeight +
     * blockMax when the sum is at least {@link DenseKernel#TINY}, else the exact way ({@link #value}). The one
     * rule of the one-row and the chunk paths, so both give the same bits.
     */
    static double fromLinear(CircuitData c, DenseBlocks d, int node, int rows, int r, double[] value, double sum,
            double maxLogWeight, double blockMax) {
        if (blockMax == Double.NEGATIVE_INFINITY || maxLogWeight == Double.NEGATIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        return sum >= DenseKernel.TINY ? Math.log(sum) + (maxLogWeight + blockMax) : value(c, d, node, rows, r, value);
    }

    /** Sum {@code node} at row r of slot-major {@code value} ({@code rows} rows). */
    static double value(CircuitData c, DenseBlocks d, int node, int rows, int r, double[] value) {
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        final int s = cs[node];
        final int end = cs[node + 1];
        double m = Double.NEGATIVE_INFINITY;
        for (int e = s; e < end; e++) {
            double t = c.logWeight[e] + product(c, d, ci[e], rows, r, value);
            if (t > m) {
                m = t;
            }
        }
        if (!(m > Double.NEGATIVE_INFINITY && m < Double.POSITIVE_INFINITY)) {
            return m;
        }
        double sum = 0;
        for (int e = s; e < end; e++) {
            double t = c.logWeight[e] + product(c, d, ci[e], rows, r, value);
            if (t > Double.NEGATIVE_INFINITY) {
                sum += Math.exp(t - m);
            }
        }
        return m + Math.log(sum);
    }

    private static double product(CircuitData c, DenseBlocks d, int q, int rows, int r, double[] value) {
        final int[] cs = c.childStart;
        int s = cs[q];
        double v = child(d, s, rows, r, value);
        for (int e = s + 1; e < cs[q + 1]; e++) {
            v += child(d, e, rows, r, value);
        }
        return v;
    }

    /** The log-value of edge e's child at row r. */
    private static double child(DenseBlocks d, int e, int rows, int r, double[] value) {
        double v = value[d.childSlot[e] * rows + r];
        int os = d.childOffsetSlot[e];
        if (os < 0) {
            return v;
        }
        double offset = value[os * rows + r];
        return offset != offset ? v : Math.log(v) + offset;
    }
}
