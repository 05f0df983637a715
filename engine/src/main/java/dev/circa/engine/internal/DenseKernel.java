package dev.circa.engine.internal;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.MvNormalWorkspace;
import dev.circa.engine.family.SpecialFunctions;

/**
 * One upward sum-product pass like {@link ForwardKernel#run} (same layout, same results to rounding), with
 * each dense block of {@link DenseBlocks} evaluated in linear space with per-row scaling. For block b with
 * K sums over n products and row r: every part's maximum log-value is subtracted from its nodes before
 * the exp; a segment's linear product values are the outer product of its parts' exponentials (the
 * product layer never goes back to log space, and products used only by the block are never
 * materialised), times exp(segment maximum - block maximum) when there are several segments; then one
 * matrix product, sums (K x rows) = weights (K x n) times products (n x rows); then
 * value = log(sum) + largest log-weight of the sum + block maximum. So a row costs one exp per part node
 * and K x n multiply-adds instead of one exp per edge. The matrix product sums every entry over j in
 * order from 0 whatever the number of rows (one row: accumulators in registers, 4 to 8 sums at a time; several: rows in the
 * innermost loop), so results do not depend on the batch. A {@link DenseBlocks#FUSED} product adds its
 * inputs' log-densities directly (a normal's log sd taken once per circuit, the same formula as
 * {@link Families#logDensity}).
 *
 * <p>Exactness: every linear factor is in [0, 1] and the argmax product of a row is exactly 1, so a sum
 * below {@value #TINY} can only come from weights that are tiny where the products are large; such an
 * entry is recomputed by the generic log-sum-exp over the sum's edges, and so is every entry of a row
 * where a segment's maximum is +inf or NaN (a part with a +inf value); a NaN elsewhere in a part makes
 * the linear sum NaN, which also goes the exact way. A row whose block maximum is -inf (every product 0) gives -inf; so does a sum whose
 * weights are all 0. The kernel trusts its input.
 */
public final class DenseKernel {
    /** Smallest linear sum taken as exact; below it an entry goes the generic way. */
    static final double TINY = 1e-200;
    private static final double HALF_LOG_2PI = SpecialFunctions.HALF_LOG_2PI;

    private DenseKernel() {
    }

    /**
     * Sum-product pass; arguments as {@link ForwardKernel#run} with {@code max = false}, plus the blocks of
     * {@code c} and a workspace for at least {@code rows} rows. Values are slot-major
     * ({@link DenseBlocks#nodeSlot}): {@code value} holds at least {@code blocks.slotCount * rows} doubles.
     */
    public static void run(CircuitData c, DenseBlocks blocks, double[] data, int row0, int rows, boolean[] hide,
            double[] value, double[] scratch, MvNormalWorkspace mvn, DenseWorkspace ws) {
        final byte[] action = blocks.action;
        final boolean sweep = rows == 1 && hide == null;
        if (sweep) {
            inputSweep(c, blocks, data, row0 * c.variableCount, ws.fused);
            fusedSums(blocks, ws.fused, ws.fusedValue);
        } else if (rows > 1) {
            ws.columns.load(data, row0, rows, c.variableCount);
        }
        for (int i : blocks.steps) {
            byte a = action[i];
            if (a == DenseBlocks.GENERIC) {
                node(c, blocks, i, data, row0, rows, hide, value, scratch, mvn, ws);
            } else if (a == DenseBlocks.FUSED) {
                if (sweep) {
                    value[blocks.nodeSlot[i]] = ws.fusedValue[blocks.fusedOut[i]];
                } else {
                    fused(c, blocks, i, data, row0, rows, hide, value, ws);
                }
            } else if (a == DenseBlocks.BLOCK) {
                if (rows == 1) {
                    blockRow(c, blocks, blocks.blockAt[i], value, ws);
                } else {
                    ws.chunk.block(c, blocks, blocks.blockAt[i], rows, value);
                }
            }
        }
    }

    /**
     * Max-product pass for the most probable explanation, node-major like {@link ForwardKernel#run} with
     * {@code max = true} and the same values at every node a backtrack reads: fused products add their
     * inputs' log-densities (a missing variable: the input's largest) without storing the inputs, whose
     * entries are left unset; every other node as {@link ForwardKernel#node}.
     */
    public static void runMax(CircuitData c, DenseBlocks d, double[] data, int row0, int rows, double[] value,
            int[] choice, double[] scratch, MvNormalWorkspace mvn) {
        final byte[] action = d.action;
        final int nv = c.variableCount;
        for (int i = 0; i < c.nodeCount; i++) {
            byte a = action[i];
            if (a == DenseBlocks.FUSED) {
                final int base = i * rows;
                final int f0 = d.fusedBase[i];
                final int stride = d.fusedStride[i];
                final int last = f0 + (c.childStart[i + 1] - c.childStart[i]) * stride;
                for (int r = 0; r < rows; r++) {
                    final int rowBase = (row0 + r) * nv;
                    double acc = 0;
                    for (int f = f0; f < last; f += stride) {
                        int slot = d.fusedSlot[f];
                        double x = data[rowBase + d.fusedVar[f]];
                        double g;
                        if (x != x) {
                            g = d.inputMaxMissing[slot];
                        } else if (d.fusedSd[f] == d.fusedSd[f]) {
                            double z = (x - d.fusedMean[f]) / d.fusedSd[f];
                            g = -0.5 * z * z - d.fusedLogSd[f] - HALF_LOG_2PI;
                        } else {
                            g = density(c, slot, x);
                        }
                        acc = f == f0 ? g : acc + g;
                    }
                    value[base + r] = acc;
                }
            } else if (a != DenseBlocks.SKIP || c.kind[i] != CircuitData.INPUT) {
                ForwardKernel.node(c, i, data, row0, rows, null, true, value, choice, scratch, mvn);
            }
        }
    }

    /** {@link ForwardKernel#node} in slots. */
    private static void node(CircuitData c, DenseBlocks d, int i, double[] data, int row0, int rows, boolean[] hide,
            double[] value, double[] scratch, MvNormalWorkspace mvn, DenseWorkspace ws) {
        final int[] childSlot = d.childSlot;
        final int base = d.nodeSlot[i] * rows;
        final int s = c.childStart[i];
        final int end = c.childStart[i + 1];
        if (c.kind[i] == CircuitData.PRODUCT) {
            System.arraycopy(value, childSlot[s] * rows, value, base, rows);
            for (int e = s + 1; e < end; e++) {
                int cb = childSlot[e] * rows;
                for (int r = 0; r < rows; r++) {
                    value[base + r] += value[cb + r];
                }
            }
        } else if (c.kind[i] == CircuitData.SUM) {
            final double[] logWeight = c.logWeight;
            for (int r = 0; r < rows; r++) {
                value[base + r] = Double.NEGATIVE_INFINITY;
            }
            for (int e = s; e < end; e++) {
                int cb = childSlot[e] * rows;
                double w = logWeight[e];
                for (int r = 0; r < rows; r++) {
                    double t = w + value[cb + r];
                    if (t > value[base + r]) {
                        value[base + r] = t;
                    }
                }
            }
            ForwardKernel.logSumExp(value, base, rows, s, end, childSlot, logWeight, scratch);
        } else if (c.family[c.inputSlot[i]] == Families.MVNORMAL) {
            ForwardKernel.input(c, data, row0, rows, hide, false, value, base, c.inputSlot[i], c.variableCount, mvn);
        } else if (rows > 1 && ws.columns.loaded()) {
            ws.columns.input(c, d, c.inputSlot[i], hide, value, base);
        } else {
            input(c, d, c.inputSlot[i], data, row0, rows, hide, value, base, false);
        }
    }

    /** A {@link DenseBlocks#FUSED} product: the sum of its inputs' log-densities, in child order. */
    private static void fused(CircuitData c, DenseBlocks d, int i, double[] data, int row0, int rows, boolean[] hide,
            double[] value, DenseWorkspace ws) {
        final int base = d.nodeSlot[i] * rows;
        final int s = c.childStart[i];
        final int end = c.childStart[i + 1];
        if (rows > 1 && ws.columns.loaded()) {
            ws.columns.fused(c, d, i, hide, value, base);
            return;
        }
        for (int e = s; e < end; e++) {
            input(c, d, c.inputSlot[c.childIndex[e]], data, row0, rows, hide, value, base, e > s);
        }
    }

    /**
     * One row: every fused product's input log-densities, {@code g[f]} for fused child f, in three loops
     * (gather the cells; the normal formula over all, which the JIT vectorises; then every entry that is
     * NaN, i.e. a missing cell or another family, again by itself). The same values as {@link #input}.
     */
    private static void inputSweep(CircuitData c, DenseBlocks d, double[] data, int rowBase, double[] g) {
        final int[] fVar = d.fusedVar;
        final double[] fMean = d.fusedMean;
        final double[] fSd = d.fusedSd;
        final double[] fLogSd = d.fusedLogSd;
        final int m = fVar.length;
        for (int f = 0; f < m; f++) {
            g[f] = data[rowBase + fVar[f]];
        }
        for (int f = 0; f < m; f++) {
            double z = (g[f] - fMean[f]) / fSd[f];
            g[f] = -0.5 * z * z - fLogSd[f] - HALF_LOG_2PI;
        }
        for (int f = 0; f < m; f++) {
            if (g[f] != g[f]) {
                double x = data[rowBase + fVar[f]];
                int slot = d.fusedSlot[f];
                g[f] = x != x ? d.inputMissing[slot] : density(c, slot, x);
            }
        }
    }

    /** {@link Families#logDensity} of univariate input {@code slot} at the observed value {@code x}. */
    private static double density(CircuitData c, int slot, double x) {
        int off = c.paramStart[slot];
        return Families.logDensity(c.family[slot], c.params, off, c.paramStart[slot + 1] - off, x);
    }

    /**
     * One row: every fused product's sum of its children's log-densities {@code g} (from {@link #inputSweep}),
     * in child order as {@link #fused} adds them, into {@code out} by {@link DenseBlocks#fusedOut}: per
     * group of products with the same number of children, the j-th children of all of them at once.
     */
    private static void fusedSums(DenseBlocks d, double[] g, double[] out) {
        for (int grp = 0; grp < d.fusedGroupStart.length; grp++) {
            final int base = d.fusedGroupStart[grp];
            final int q = d.fusedGroupSize[grp];
            final int width = d.fusedGroupWidth[grp];
            final int o = d.fusedGroupOut[grp];
            System.arraycopy(g, base, out, o, q);
            for (int j = 1; j < width; j++) {
                final int gb = base + j * q;
                for (int p = 0; p < q; p++) {
                    out[o + p] += g[gb + p];
                }
            }
        }
    }

    /**
     * The log-density of univariate input {@code slot} at each row, stored at {@code value[base + r]}, or
     * added to it when {@code add}. Equal to {@link Families#logDensity} (a normal's log(sd) taken once).
     */
    private static void input(CircuitData c, DenseBlocks d, int slot, double[] data, int row0, int rows,
            boolean[] hide, double[] value, int base, boolean add) {
        final int code = c.family[slot];
        final int off = c.paramStart[slot];
        final int len = c.paramStart[slot + 1] - off;
        final double[] p = c.params;
        final int nv = c.variableCount;
        final int v = c.varIndex[c.varStart[slot]];
        final double missing = d.inputMissing[slot];
        if (hide != null && hide[v]) {
            for (int r = 0; r < rows; r++) {
                value[base + r] = add ? value[base + r] + missing : missing;
            }
            return;
        }
        if (code == Families.NORMAL) {
            final double mean = p[off];
            final double sd = p[off + 1];
            final double logSd = d.inputLogSd[slot];
            for (int r = 0; r < rows; r++) {
                double x = data[(row0 + r) * nv + v];
                double z = (x - mean) / sd;
                double f = x != x ? missing : -0.5 * z * z - logSd - HALF_LOG_2PI;
                value[base + r] = add ? value[base + r] + f : f;
            }
            return;
        }
        for (int r = 0; r < rows; r++) {
            double x = data[(row0 + r) * nv + v];
            double f = x != x ? missing : Families.logDensity(code, p, off, len, x);
            value[base + r] = add ? value[base + r] + f : f;
        }
    }

    /**
     * {@link ChunkBlocks#block} at one row, with the same values bit for bit: the same part maxima, exponentials,
     * products and matrix product, without the loops over rows; a row that goes the exact way skips the
     * linear work, and a part's exponentials go straight into the product list when it is the first part.
     */
    private static void blockRow(CircuitData c, DenseBlocks d, int b, double[] value, DenseWorkspace ws) {
        final int seg0 = d.segStart[b];
        final int seg1 = d.segStart[b + 1];
        final int part0 = d.partStart[seg0];
        final int[] groupStart = d.groupStart;
        final int[] groupSlot = d.groupSlot;
        final double[] partMax = ws.partMax;
        final double[] segMax = ws.segMax;
        final double neg = Double.NEGATIVE_INFINITY;
        double blockMax = neg;
        boolean check = false;
        for (int s = seg0; s < seg1; s++) {
            double sm = 0;
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final int g1 = groupStart[p + 1];
                double pm = value[groupSlot[groupStart[p]]];
                for (int g = groupStart[p] + 1; g < g1; g++) {
                    double v = value[groupSlot[g]];
                    pm = v > pm ? v : pm;
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
        if (check || blockMax == neg) {
            for (int k = k0; k < k1; k++) {
                value[d.sumSlot[k]] = check ? exact(c, d.childSlot, d.sumNode[k], 1, 0, value) : neg;
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
            for (int p = d.partStart[s]; p < d.partStart[s + 1]; p++) {
                final int g0 = groupStart[p];
                final int size = groupStart[p + 1] - g0;
                if (size == 1) {
                    continue;
                }
                final double pm = partMax[p - part0];
                final double[] dst = cur == 1 ? pt : e;
                final int at = cur == 1 ? out : 0;
                for (int j = 0; j < size; j++) {
                    double v = value[groupSlot[g0 + j]];
                    dst[at + j] = v == neg ? 0 : Math.exp(v - pm);
                }
                if (cur == 1) {
                    for (int j = 0; j < size; j++) {
                        pt[out + j] = t * pt[out + j];
                    }
                } else {
                    expand(pt, out, cur, size, e);
                }
                cur *= size;
            }
            if (cur == 1) {
                pt[out] = t;
            }
        }
        final double[] ct = ws.sums;
        multiply(d, b, pt, d.width[b], ct);
        for (int k = k0; k < k1; k++) {
            double lw = d.maxLogWeight[k];
            double sum = ct[k - k0];
            double v;
            if (lw == neg) {
                v = neg;
            } else if (sum >= TINY) {
                v = Math.log(sum) + (lw + blockMax);
            } else {
                v = exact(c, d.childSlot, d.sumNode[k], 1, 0, value);
            }
            value[d.sumSlot[k]] = v;
        }
    }

    /**
     * One row: sums (K) = weights (K x n) times products (n). Every entry is the sum over j = 0..n-1, in that
     * order from 0, of weight(k, j) x product(j), as {@link ChunkBlocks} sums each row of a chunk, so a row's
     * result does not depend on the rows evaluated with it (bit for bit).
     */
    static void multiply(DenseBlocks d, int b, double[] pt, int n, double[] ct) {
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

    /**
     * Sum {@code node} at row r exactly as the generic kernel computes it, each product child's value taken
     * as the sum of its children's, in child order.
     */
    static double exact(CircuitData c, int[] slot, int node, int rows, int r, double[] value) {
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        final int s = cs[node];
        final int end = cs[node + 1];
        double m = Double.NEGATIVE_INFINITY;
        for (int e = s; e < end; e++) {
            double t = c.logWeight[e] + product(cs, ci, slot, ci[e], rows, r, value);
            if (t > m) {
                m = t;
            }
        }
        if (!(m > Double.NEGATIVE_INFINITY && m < Double.POSITIVE_INFINITY)) {
            return m;
        }
        double sum = 0;
        for (int e = s; e < end; e++) {
            double t = c.logWeight[e] + product(cs, ci, slot, ci[e], rows, r, value);
            if (t > Double.NEGATIVE_INFINITY) {
                sum += Math.exp(t - m);
            }
        }
        return m + Math.log(sum);
    }

    private static double product(int[] cs, int[] ci, int[] slot, int q, int rows, int r, double[] value) {
        int s = cs[q];
        double v = value[slot[s] * rows + r];
        for (int e = s + 1; e < cs[q + 1]; e++) {
            v += value[slot[e] * rows + r];
        }
        return v;
    }
}
