package dev.circa.engine.internal;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.MvNormalWorkspace;
import dev.circa.engine.family.SpecialFunctions;

/**
 * One upward sum-product pass like {@link ForwardKernel#run} (same layout, same results to rounding), with
 * each dense block of {@link DenseBlocks} evaluated in linear space with per-row scaling. For block b with
 * K sums over n products and row r: every part of log-values has its maximum log-value subtracted from its
 * nodes before the exp, and a part held in linear form by the block it comes from ({@link LinearOutput}) gives
 * its mantissas as they are and its log offset in place of the maximum; a segment's linear product values are
 * the outer product of its parts' factors (the product layer never goes back to log space, and products used
 * only by the block are never materialised), times exp(segment offset - block offset) when there are several
 * segments; then one matrix product, sums (K x rows) = weights (K x n) times products (n x rows); then either
 * value = log(sum) + largest log-weight of the sum + block offset, or, for a block read only as parts of other
 * blocks, the sums kept in linear form (no logarithm). So a row costs one exp per node of a part of log-values
 * (in a region graph: the leaf regions' products of inputs), one log per sum read in the log domain, and K x n
 * multiply-adds per block, instead of one exp per edge. On the 9 * 10^6-edge region-graph circuit with
 * K = I = 4, the linear outputs took the engine's CPU time over the 3,001 verification rows from 23.5 s to
 * 15.2 s. The one-row case is {@link RowBlocks}, several rows {@link ChunkBlocks}, with the same bits; the
 * matrix product sums every entry over j in order from 0 whatever the number of rows, so results do not
 * depend on the batch. A {@link DenseBlocks#FUSED} product adds its inputs' log-densities directly (a
 * normal's log sd taken once per circuit, the same formula as {@link Families#logDensity}).
 *
 * <p>Exactness: every factor of a part of log-values is in [0, 1], a linear part's in [0, 2) with its largest
 * at least 1, and the row's largest product is at least 1, so a sum below {@value #TINY} can only come from
 * weights that are tiny where the products are large; such an entry is recomputed by the generic log-sum-exp
 * over the sum's edges ({@link ExactSum}), and so is every entry of a row where a segment's offset is +inf or
 * NaN (a part with a +inf value); a NaN elsewhere in a part makes the linear sum NaN, which also goes the
 * exact way. A row whose block offset is -inf (every product 0) gives -inf; so does a sum whose weights are
 * all 0. A block in linear form holds such rows as log-values (offset NaN). The kernel trusts its input.
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
                    RowBlocks.block(c, blocks, blocks.blockAt[i], value, ws);
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
}
