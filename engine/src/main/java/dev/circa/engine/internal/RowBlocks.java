package dev.circa.engine.internal;

/**
 * {@link ChunkBlocks#block} at one row, with the same values bit for bit: the same part offsets, factors,
 * products, matrix product and outputs, without the loops over rows; a row that goes the exact way skips the
 * linear work, and a part's factors go straight into the product list when it is the first part. A part of
 * log-values gives its maximum as offset and e^(v - maximum) per node; a part held in linear form
 * ({@link LinearOutput}) its block's offset L and its mantissas as they are, so a block over linear parts
 * takes no exponential (one per segment when there are several) and, holding its own sums in linear form,
 * no logarithm.
 */
final class RowBlocks {
    private RowBlocks() {
    }

    /** Block {@code b} at the one row of slot-major {@code value}: its sums into their slots. */
    static void block(CircuitData c, DenseBlocks d, int b, double[] value, DenseWorkspace ws) {
        final int seg0 = d.segStart[b];
        final int seg1 = d.segStart[b + 1];
        final int part0 = d.partStart[seg0];
        final int[] groupStart = d.groupStart;
        final int[] groupSlot = d.groupSlot;
        final int[] partOffset = d.partOffsetSlot;
        final double[] partMax = ws.partMax;
        final double[] segMax = ws.segMax;
        final double neg = Double.NEGATIVE_INFINITY;
        double blockMax = neg;
        boolean check = false;
        for (int s = seg0; s < seg1; s++) {
            double sm = 0;
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final int os = partOffset[p];
                double pm = os >= 0 ? value[os] : Double.NaN;
                if (pm != pm) {
                    final int g1 = groupStart[p + 1];
                    pm = value[groupSlot[groupStart[p]]];
                    for (int g = groupStart[p] + 1; g < g1; g++) {
                        double v = value[groupSlot[g]];
                        pm = v > pm ? v : pm;
                    }
                }
                partMax[p - part0] = pm;
                sm += pm;
            }
            segMax[s - seg0] = sm;
            if (sm > blockMax) {
                blockMax = sm;
            }
            check |= sm != sm || sm == Double.POSITIVE_INFINITY;
        }
        final int k0 = d.sumStart[b];
        final int k1 = d.sumStart[b + 1];
        final int os = d.offsetSlot[b];
        if (check || blockMax == neg) {
            for (int k = k0; k < k1; k++) {
                value[d.sumSlot[k]] = check ? ExactSum.value(c, d, d.sumNode[k], 1, 0, value) : neg;
            }
            if (os >= 0) {
                value[os] = Double.NaN;
            }
            return;
        }
        final double[] pt = ws.products;
        final double[] e = ws.partExp;
        final boolean single = seg1 - seg0 == 1;
        for (int s = seg0; s < seg1; s++) {
            final int out = d.segOffset[s];
            final double sm = segMax[s - seg0];
            double t = single ? 1 : sm == neg ? 0 : Math.exp(sm - blockMax);
            int cur = 1;
            boolean started = false;
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final int g0 = groupStart[p];
                final int size = groupStart[p + 1] - g0;
                final int po = partOffset[p];
                if (size == 1 && po < 0) {
                    continue;
                }
                final double pm = partMax[p - part0];
                final boolean linear = po >= 0 && value[po] == value[po];
                final double[] dst = started ? e : pt;
                final int at = started ? 0 : out;
                for (int j = 0; j < size; j++) {
                    double v = value[groupSlot[g0 + j]];
                    dst[at + j] = linear ? v : v == neg ? 0 : Math.exp(v - pm);
                }
                if (!started) {
                    for (int j = 0; j < size; j++) {
                        pt[out + j] = t * pt[out + j];
                    }
                } else {
                    expand(pt, out, cur, size, e);
                }
                started = true;
                cur *= size;
            }
            if (!started) {
                pt[out] = t;
            }
        }
        final double[] ct = ws.sums;
        multiply(d, b, pt, d.width[b], ct);
        if (os >= 0 && linearSums(d, b, blockMax, ct, value)) {
            return;
        }
        for (int k = k0; k < k1; k++) {
            value[d.sumSlot[k]] = ExactSum.fromLinear(c, d, d.sumNode[k], 1, 0, value, ct[k - k0], d.maxLogWeight[k],
                    blockMax);
        }
        if (os >= 0) {
            value[os] = Double.NaN;
        }
    }

    /**
     * Block b's sums {@code ct} at the row in linear form, mantissas and offset into their slots, when the
     * form holds them ({@link LinearOutput#held}, the same operations as {@link ChunkBlocks}); else nothing
     * is written and the answer is false.
     */
    private static boolean linearSums(DenseBlocks d, int b, double blockMax, double[] ct, double[] value) {
        final int k0 = d.sumStart[b];
        final int k1 = d.sumStart[b + 1];
        final double[] scale = d.sumScale;
        double top = 0;
        double low = Double.POSITIVE_INFINITY;
        for (int k = k0; k < k1; k++) {
            final double sk = scale[k];
            if (sk != 0) {
                double a = ct[k - k0] * sk;
                top = Math.max(top, a);
                low = Math.min(low, a);
            }
        }
        if (!LinearOutput.held(0, blockMax, low, top)) {
            return false;
        }
        final int ex = Math.getExponent(top);
        final double inv = LinearOutput.pow2(-ex);
        for (int k = k0; k < k1; k++) {
            value[d.sumSlot[k]] = ct[k - k0] * scale[k] * inv;
        }
        value[d.offsetSlot[b]] = LinearOutput.offset(d.logTop[b] + blockMax, ex);
        return true;
    }

    /**
     * One row: sums (K) = weights (K x n) times products (n). Every entry is the sum over j = 0..n-1, in that
     * order from 0, of weight(k, j) x product(j), as {@link ChunkBlocks} sums each row of a chunk, so a row's
     * result does not depend on the rows evaluated with it (bit for bit).
     */
    private static void multiply(DenseBlocks d, int b, double[] pt, int n, double[] ct) {
        final int kk = d.sumStart[b + 1] - d.sumStart[b];
        final double[] w = d.weights[b].data;
        int k = 0;
        while (k < kk) {
            int left = kk - k;
            if (left >= 12 || left == 8) {
                oneRow8(w, k * n, n, pt, ct, k);
                k += 8;
            } else if (left >= 5) {
                oneRow5(w, k * n, n, pt, ct, k);
                k += 5;
            } else if (left == 4) {
                oneRow4(w, k * n, n, pt, ct, k);
                k += 4;
            } else if (left >= 2) {
                oneRow2(w, k * n, n, pt, ct, k);
                k += 2;
            } else {
                double a0 = 0;
                for (int j = 0, w0 = k * n; j < n; j++) {
                    a0 += w[w0 + j] * pt[j];
                }
                ct[k] = a0;
                k++;
            }
        }
    }

    /*
     * One row, sums k .. k+m-1 at once with m accumulators in registers, each summed over j in order from 0.
     * A pass costs about max(m, 4) cycles per j (two multiply-adds per cycle; an add waits 4 cycles for the
     * previous one of its chain), so K sums go in passes of 4 to 8 (K = 10: 5 + 5, not 8 + 2).
     */

    private static void oneRow8(double[] w, int w0, int n, double[] pt, double[] ct, int k) {
        double a0 = 0;
        double a1 = 0;
        double a2 = 0;
        double a3 = 0;
        double a4 = 0;
        double a5 = 0;
        double a6 = 0;
        double a7 = 0;
        for (int j = 0; j < n; j++) {
            double pj = pt[j];
            a0 += w[w0 + j] * pj;
            a1 += w[w0 + n + j] * pj;
            a2 += w[w0 + 2 * n + j] * pj;
            a3 += w[w0 + 3 * n + j] * pj;
            a4 += w[w0 + 4 * n + j] * pj;
            a5 += w[w0 + 5 * n + j] * pj;
            a6 += w[w0 + 6 * n + j] * pj;
            a7 += w[w0 + 7 * n + j] * pj;
        }
        ct[k] = a0;
        ct[k + 1] = a1;
        ct[k + 2] = a2;
        ct[k + 3] = a3;
        ct[k + 4] = a4;
        ct[k + 5] = a5;
        ct[k + 6] = a6;
        ct[k + 7] = a7;
    }

    private static void oneRow5(double[] w, int w0, int n, double[] pt, double[] ct, int k) {
        double a0 = 0;
        double a1 = 0;
        double a2 = 0;
        double a3 = 0;
        double a4 = 0;
        for (int j = 0; j < n; j++) {
            double pj = pt[j];
            a0 += w[w0 + j] * pj;
            a1 += w[w0 + n + j] * pj;
            a2 += w[w0 + 2 * n + j] * pj;
            a3 += w[w0 + 3 * n + j] * pj;
            a4 += w[w0 + 4 * n + j] * pj;
        }
        ct[k] = a0;
        ct[k + 1] = a1;
        ct[k + 2] = a2;
        ct[k + 3] = a3;
        ct[k + 4] = a4;
    }

    private static void oneRow4(double[] w, int w0, int n, double[] pt, double[] ct, int k) {
        double a0 = 0;
        double a1 = 0;
        double a2 = 0;
        double a3 = 0;
        for (int j = 0; j < n; j++) {
            double pj = pt[j];
            a0 += w[w0 + j] * pj;
            a1 += w[w0 + n + j] * pj;
            a2 += w[w0 + 2 * n + j] * pj;
            a3 += w[w0 + 3 * n + j] * pj;
        }
        ct[k] = a0;
        ct[k + 1] = a1;
        ct[k + 2] = a2;
        ct[k + 3] = a3;
    }

    private static void oneRow2(double[] w, int w0, int n, double[] pt, double[] ct, int k) {
        double a0 = 0;
        double a1 = 0;
        for (int j = 0; j < n; j++) {
            double pj = pt[j];
            a0 += w[w0 + j] * pj;
            a1 += w[w0 + n + j] * pj;
        }
        ct[k] = a0;
        ct[k + 1] = a1;
    }

    /**
     * One row: replaces the first {@code cur} products at {@code out} by their products with each of the
     * {@code size} exponentials of {@code e}: product i * size + j = product i times e_j (the new part varies
     * fastest). Works backwards so no product is overwritten before it is read.
     */
    private static void expand(double[] pt, int out, int cur, int size, double[] e) {
        for (int i = cur - 1; i >= 0; i--) {
            double t = pt[out + i];
            int dst = out + i * size;
            for (int j = 0; j < size; j++) {
                pt[dst + j] = t * e[j];
            }
        }
    }

}
