package dev.circa.engine.internal;

/**
 * {@link DenseKernel}'s evaluation of one dense block at every row of a chunk of several rows (the
 * one-row case is {@link RowBlocks}, with the same values bit for bit). The method is the
 * kernel's: per row, each part's offset (its maximum, or the offset of the block that holds it in linear
 * form), the segments' sums of offsets and the block's largest; each part node's factor (its exponential
 * after its part's maximum is subtracted, or its mantissa as it is); a segment's products as the outer product of
 * its parts' exponentials (times exp(segment maximum - block maximum) when there are several segments);
 * then sums = weights x products, every entry summed over the products in order from the first; and
 * log(sum) + largest log-weight + block maximum, or the exact log-sum-exp where the linear sum is below
 * {@link DenseKernel#TINY} or the row's maximum is not finite, or the sums in linear form
 * ({@link LinearOutput}) where the block holds them so.
 *
 * <p>Layout: every per-row quantity of the block is a row array of its own ({@code products[j][r]},
 * {@code sums[k][r]}, {@code partMax[p][r]}, {@code segMax[s][r]}, {@code partExp[j][r]}), and a node's
 * values are first copied out of the slot-major value array into the 0-based {@code cells}, so that every
 * loop over rows reads and writes its arrays at the same index: the JIT turns those loops into vector
 * instructions, while a loop over {@code value[vb + r]} and {@code partMax[pm + r]} (two arrays at two
 * offsets) stayed scalar. A part's maximum is {@link Math#max}, which vectorises, where a compare and
 * branch per row did not (and mispredicted on random data). With the engine's input densities in 0-based
 * columns ({@link InputColumns}) this took the engine's CPU time on the 3,001 verification rows of the
 * 9 * 10^5-edge region-graph circuit with K = I = 4 from 4.3 s to 2.4 s, and 44 s to 24.5 s at 9 * 10^6 edges.
 *
 * <p>Each row's doubles are those of the one-row case: the same operations in the same order, except that
 * a NaN part node makes the part's maximum NaN here where the one-row case skips it when it is not first;
 * either way the row's products are NaN or its segment maximum is, and every sum of the block at that row
 * takes the exact log-sum-exp (or is 0 when the block maximum or its weights say so), so the values stored
 * are the same (IEEE 754 rules; valid parameters give no NaN node that a test could build, and the tests
 * cover part nodes that are 0 first or throughout, alone and in batches). A row's values do not depend on
 * the other rows of the chunk. One per workspace, for chunks of up to {@code rows} rows.
 */
final class ChunkBlocks {
    private final double[][] products;
    private final double[][] sums;
    private final double[][] partMax;
    private final double[][] segMax;
    private final double[][] partExp;
    private final double[] blockMax;
    private final double[] check;
    /** One node's values, or one product row while a segment is expanded. */
    private final double[] cells;
    /** One part's offsets, or the powers of two that scale a block's sums. */
    private final double[] offsets;
    /** Per part of the block, whether some row of the chunk holds it as log-values. */
    private final boolean[] partLog;
    /** Per row, whether the block's sums are held in linear form, and their binary exponent. */
    private final boolean[] held;
    private final int[] exponent;

    ChunkBlocks(DenseBlocks blocks, int rows) {
        this.products = new double[Math.max(1, blocks.maxWidth)][rows];
        this.sums = new double[Math.max(1, blocks.maxSums)][rows];
        this.partMax = new double[Math.max(1, blocks.maxParts)][rows];
        this.segMax = new double[Math.max(1, blocks.maxSegments)][rows];
        this.partExp = new double[Math.max(1, blocks.maxPartSize)][rows];
        this.blockMax = new double[rows];
        this.check = new double[rows];
        this.cells = new double[rows];
        this.offsets = new double[rows];
        this.partLog = new boolean[Math.max(1, blocks.maxParts)];
        this.held = new boolean[rows];
        this.exponent = new int[rows];
    }

    /** Block {@code b} at rows 0 .. rows-1 of slot-major {@code value}: its sums' values into their slots. */
    void block(CircuitData c, DenseBlocks d, int b, int rows, double[] value) {
        final int n = d.width[b];
        final int seg0 = d.segStart[b];
        final int seg1 = d.segStart[b + 1];
        final int part0 = d.partStart[seg0];
        final double[] bm = blockMax;
        final double[] ck = check;
        final double[] x = cells;
        final double neg = Double.NEGATIVE_INFINITY;
        for (int r = 0; r < rows; r++) {
            bm[r] = neg;
            ck[r] = 0;
        }
        for (int s = seg0; s < seg1; s++) {
            final double[] sm = segMax[s - seg0];
            for (int r = 0; r < rows; r++) {
                sm[r] = 0;
            }
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final double[] pm = partMax[p - part0];
                final int os = d.partOffsetSlot[p];
                boolean logRows = os < 0;
                if (os >= 0) {
                    System.arraycopy(value, os * rows, pm, 0, rows);
                    for (int r = 0; r < rows; r++) {
                        logRows |= pm[r] != pm[r];
                    }
                }
                partLog[p - part0] = logRows;
                if (logRows) {
                    partMaximum(d, p, rows, value, pm);
                }
                for (int r = 0; r < rows; r++) {
                    sm[r] += pm[r];
                }
            }
            for (int r = 0; r < rows; r++) {
                double m = sm[r];
                if (m > bm[r]) {
                    bm[r] = m;
                }
                if (m != m || m == Double.POSITIVE_INFINITY) {
                    ck[r] = 1;
                }
            }
        }
        final boolean single = seg1 - seg0 == 1;
        for (int s = seg0; s < seg1; s++) {
            final double[] sm = segMax[s - seg0];
            final int out = d.segOffset[s];
            final double[] first = products[out];
            if (single) {
                for (int r = 0; r < rows; r++) {
                    first[r] = 1;
                }
            } else {
                for (int r = 0; r < rows; r++) {
                    double m = sm[r];
                    first[r] = m == neg || !(m < Double.POSITIVE_INFINITY) ? 0 : Math.exp(m - bm[r]);
                }
            }
            int cur = 1;
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final int g0 = d.groupStart[p];
                final int size = d.groupStart[p + 1] - g0;
                final int os = d.partOffsetSlot[p];
                if (size == 1 && os < 0) {
                    continue;
                }
                final double[] pm = partMax[p - part0];
                for (int j = 0; j < size; j++) {
                    final int vb = d.groupSlot[g0 + j] * rows;
                    final double[] e = partExp[j];
                    if (os < 0) {
                        for (int r = 0; r < rows; r++) {
                            double v = value[vb + r];
                            e[r] = v == neg ? 0 : Math.exp(v - pm[r]);
                        }
                    } else if (!partLog[p - part0]) {
                        System.arraycopy(value, vb, e, 0, rows);
                    } else {
                        final int ob = os * rows;
                        for (int r = 0; r < rows; r++) {
                            double v = value[vb + r];
                            double l = value[ob + r];
                            e[r] = l == l ? v : v == neg ? 0 : Math.exp(v - pm[r]);
                        }
                    }
                }
                expand(out, cur, size, rows);
                cur *= size;
            }
        }
        multiply(d, b, n, rows);
        final int k0 = d.sumStart[b];
        final int k1 = d.sumStart[b + 1];
        final int os = d.offsetSlot[b];
        if (os >= 0) {
            linearSums(c, d, b, rows, value);
            return;
        }
        for (int k = k0; k < k1; k++) {
            final int node = d.sumNode[k];
            final int base = d.sumSlot[k] * rows;
            final double[] ct = sums[k - k0];
            final double lw = d.maxLogWeight[k];
            for (int r = 0; r < rows; r++) {
                value[base + r] = ck[r] != 0 ? ExactSum.value(c, d, node, rows, r, value)
                        : ExactSum.fromLinear(c, d, node, rows, r, value, ct[r], lw, bm[r]);
            }
        }
    }

    /**
     * Part p's maximum log-value at every row into {@code pm} ({@link Math#max}, so a NaN node makes it NaN);
     * for a part held in linear form, its offset where the row holds the linear form.
     */
    private void partMaximum(DenseBlocks d, int p, int rows, double[] value, double[] pm) {
        final double[] x = cells;
        final int g0 = d.groupStart[p];
        final int g1 = d.groupStart[p + 1];
        final int os = d.partOffsetSlot[p];
        if (os >= 0) {
            System.arraycopy(value, os * rows, offsets, 0, rows);
        }
        System.arraycopy(value, d.groupSlot[g0] * rows, pm, 0, rows);
        for (int g = g0 + 1; g < g1; g++) {
            System.arraycopy(value, d.groupSlot[g] * rows, x, 0, rows);
            for (int r = 0; r < rows; r++) {
                pm[r] = Math.max(pm[r], x[r]);
            }
        }
        if (os >= 0) {
            for (int r = 0; r < rows; r++) {
                double l = offsets[r];
                pm[r] = l == l ? l : pm[r];
            }
        }
    }

    /**
     * Block b's sums from {@link #sums} at every row: in linear form where it holds them
     * ({@link LinearOutput#held}, the same operations as the one-row case), else log-values as every other
     * block, with offset NaN. Every loop but the one over a chunk with rows not held indexes its arrays alike.
     */
    private void linearSums(CircuitData c, DenseBlocks d, int b, int rows, double[] value) {
        final int k0 = d.sumStart[b];
        final int k1 = d.sumStart[b + 1];
        final double[] scale = d.sumScale;
        final double[] bm = blockMax;
        final double[] ck = check;
        final double[] top = cells;
        final double[] low = offsets;
        for (int r = 0; r < rows; r++) {
            top[r] = 0;
            low[r] = Double.POSITIVE_INFINITY;
        }
        for (int k = k0; k < k1; k++) {
            final double[] ct = sums[k - k0];
            final double sk = scale[k];
            if (sk != 0) {
                for (int r = 0; r < rows; r++) {
                    double a = ct[r] * sk;
                    top[r] = Math.max(top[r], a);
                    low[r] = Math.min(low[r], a);
                }
            }
        }
        boolean all = true;
        final double[] inv = low;
        for (int r = 0; r < rows; r++) {
            boolean h = LinearOutput.held(ck[r], bm[r], low[r], top[r]);
            int ex = Math.getExponent(top[r]);
            exponent[r] = ex;
            held[r] = h;
            inv[r] = h ? LinearOutput.pow2(-ex) : 0;
            all &= h;
        }
        for (int k = k0; k < k1; k++) {
            final int vb = d.sumSlot[k] * rows;
            final double[] ct = sums[k - k0];
            final double sk = scale[k];
            if (all) {
                for (int r = 0; r < rows; r++) {
                    value[vb + r] = ct[r] * sk * inv[r];
                }
            } else {
                logWhereNotHeld(c, d, k, k - k0, rows, value);
            }
        }
        final int ob = d.offsetSlot[b] * rows;
        final double base = d.logTop[b];
        for (int r = 0; r < rows; r++) {
            value[ob + r] = held[r] ? LinearOutput.offset(base + bm[r], exponent[r]) : Double.NaN;
        }
    }

    /**
     * Sum k (the block's {@code index}-th) at every row: its mantissa where the row is held, else its log-value
     * (as every other block).
     */
    private void logWhereNotHeld(CircuitData c, DenseBlocks d, int k, int index, int rows, double[] value) {
        final int node = d.sumNode[k];
        final int vb = d.sumSlot[k] * rows;
        final double[] ct = sums[index];
        final double sk = d.sumScale[k];
        final double lw = d.maxLogWeight[k];
        final double[] inv = offsets;
        for (int r = 0; r < rows; r++) {
            double sum = ct[r];
            value[vb + r] = held[r] ? sum * sk * inv[r] : check[r] != 0 ? ExactSum.value(c, d, node, rows, r, value)
                    : ExactSum.fromLinear(c, d, node, rows, r, value, sum, lw, blockMax[r]);
        }
    }

    /**
     * Replaces the first {@code cur} product rows from {@code out} by their products with each of the
     * {@code size} rows of {@link #partExp}: row i * size + j = row i times exponential j (the new part
     * varies fastest). Works backwards so no row is overwritten before it is read.
     */
    private void expand(int out, int cur, int size, int rows) {
        final double[] t = cells;
        for (int i = cur - 1; i >= 0; i--) {
            System.arraycopy(products[out + i], 0, t, 0, rows);
            final int dst = out + i * size;
            for (int j = 0; j < size; j++) {
                final double[] e = partExp[j];
                final double[] p = products[dst + j];
                for (int r = 0; r < rows; r++) {
                    p[r] = t[r] * e[r];
                }
            }
        }
    }

    /**
     * sums (K x rows) = weights (K x n) times products (n x rows), 4 sums at a time. Every entry is the sum
     * over j = 0..n-1, in that order from 0, of weight(k, j) x product(j, r), as in the one-row case, so a
     * row's result does not depend on the rows evaluated with it (bit for bit).
     */
    private void multiply(DenseBlocks d, int b, int n, int rows) {
        final int kk = d.sumStart[b + 1] - d.sumStart[b];
        final double[] w = d.weights[b].data;
        int k = 0;
        for (; k + 4 <= kk; k += 4) {
            final double[] a0 = sums[k];
            final double[] a1 = sums[k + 1];
            final double[] a2 = sums[k + 2];
            final double[] a3 = sums[k + 3];
            for (int r = 0; r < rows; r++) {
                a0[r] = 0;
                a1[r] = 0;
                a2[r] = 0;
                a3[r] = 0;
            }
            for (int j = 0; j < n; j++) {
                final double w0 = w[k * n + j];
                final double w1 = w[(k + 1) * n + j];
                final double w2 = w[(k + 2) * n + j];
                final double w3 = w[(k + 3) * n + j];
                final double[] p = products[j];
                for (int r = 0; r < rows; r++) {
                    double pv = p[r];
                    a0[r] += w0 * pv;
                    a1[r] += w1 * pv;
                    a2[r] += w2 * pv;
                    a3[r] += w3 * pv;
                }
            }
        }
        for (; k < kk; k++) {
            final double[] a0 = sums[k];
            for (int r = 0; r < rows; r++) {
                a0[r] = 0;
            }
            for (int j = 0; j < n; j++) {
                final double w0 = w[k * n + j];
                final double[] p = products[j];
                for (int r = 0; r < rows; r++) {
                    a0[r] += w0 * p[r];
                }
            }
        }
    }
}
