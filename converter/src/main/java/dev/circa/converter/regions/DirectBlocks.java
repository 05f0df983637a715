package dev.circa.converter.regions;

import dev.circa.converter.reference.ReferenceDensities;
import java.util.Arrays;

/**
 * One direct evaluator's working memory, shared by its two passes ({@link LinearPass}, {@link LogDomainPass}), and
 * the steps both take: the block of each slot ({@code [node][row]}, {@value RegionTensorEvaluator#CHUNK_ROWS} rows,
 * reused once the regions that read it are done, so memory stays small for any number of regions), the block's
 * data turned into columns, the leaves' bundles of log-values, the walk over a partition's products, and the
 * weighted sums of a region's children. Everything is allocated once (or on first use) and reused on every call.
 */
final class DirectBlocks {
    /** Below this a scaled sum has lost too many digits: the row (or sum) takes the exact log-domain path. */
    static final double SCALED_FLOOR = 0x1p-900;
    private static final int CHUNK_ROWS = RegionTensorEvaluator.CHUNK_ROWS;

    private final DirectModel m;
    /** Per slot: a block of log-values, or of linear values y, {@code [node][row]}, allocated on first use. */
    final double[][][] block;
    /** Per slot: the exponent E of each row of its block of linear values (value = y * 2^E). */
    final long[][] blockExp;
    /** The children of the region's sums, {@code [child][row]}. */
    final double[][] child;
    /** Each child's linear value (e^(v - vmax) in the log domain), {@code [child][row]}. */
    final double[][] expChild;
    final double[] vmax;
    /** Scaled sums of the block: {@code [q][row]}. */
    final double[][] dot;
    /** The product scale of a partition at each row. */
    final double[] partScale = new double[CHUNK_ROWS];
    /** Row arrays for a partition's part nodes; grown on first use (see {@link #partRows}). */
    private double[][] partExp = new double[0][];
    /** The node of each part in the current product of a partition. */
    int[] digit = new int[2];
    /**
     * Every variable at the block's rows, {@code [v][row]}: the block's data turned column by column
     * once, then read by every leaf (each variable is in one leaf per repetition of the region graph; turning
     * each leaf's columns by itself cost a branch per cell and leaf, a third of the direct evaluation's time on
     * the 9 * 10^6-edge circuit with K = I = 4). Allocated on first use.
     */
    private double[][] columns = new double[0][];
    /** The same with 0 at the missing cells, and 1 at the observed cells and 0 elsewhere. */
    private double[][] clean = new double[0][];
    private double[][] seen = new double[0][];
    /** Per variable: its missing rows in the block are {@code nanRow[nanStart[v] .. nanStart[v+1]-1]}. */
    private final int[] nanStart;
    private int[] nanRow = new int[0];
    /** Per variable: whether every observed cell of the block is {@link ReferenceDensities#plain}. */
    private final boolean[] plain;
    /** One bundle's sum of its inputs' log-values so far, at the block's rows. */
    private final double[] bundle = new double[CHUNK_ROWS];
    /** One normal input's log-values at the block's rows, before they are added to {@link #bundle}. */
    private final double[] term = new double[CHUNK_ROWS];

    /** The working memory of an evaluator of {@code m}. */
    DirectBlocks(DirectModel m) {
        this.m = m;
        this.block = new double[m.slotSize.length][][];
        this.blockExp = new long[m.slotSize.length][];
        this.child = new double[m.maxChildren][CHUNK_ROWS];
        this.expChild = new double[m.maxChildren][CHUNK_ROWS];
        this.vmax = new double[CHUNK_ROWS];
        this.dot = new double[m.maxSums][CHUNK_ROWS];
        this.nanStart = new int[m.family.length + 1];
        this.plain = new boolean[m.family.length];
    }

    /** The block of a slot, allocated on first use. */
    double[][] block(int sl) {
        if (block[sl] == null) {
            block[sl] = new double[m.slotSize[sl]][CHUNK_ROWS];
            blockExp[sl] = new long[CHUNK_ROWS];
        }
        return block[sl];
    }

    /** At least {@code count} row arrays for a partition's part nodes, those held so far kept. */
    double[][] partRows(int count) {
        if (partExp.length < count) {
            double[][] grown = Arrays.copyOf(partExp, count);
            for (int i = partExp.length; i < count; i++) {
                grown[i] = new double[CHUNK_ROWS];
            }
            partExp = grown;
        }
        return partExp;
    }

    /** Rows {@code row0 .. row0+n-1} of {@code data} into {@link #columns}, with each variable's missing rows. */
    void columns(double[] data, int row0, int n) {
        int nv = m.family.length;
        if (columns.length == 0) {
            columns = new double[nv][CHUNK_ROWS];
            clean = new double[nv][CHUNK_ROWS];
            seen = new double[nv][CHUNK_ROWS];
            nanRow = new int[Math.multiplyExact(nv, CHUNK_ROWS)];
        }
        for (int row = 0; row < n; row++) {
            for (int v = 0, cell = (row0 + row) * nv; v < nv; v++) {
                columns[v][row] = data[cell + v];
            }
        }
        int missing = 0;
        for (int v = 0; v < nv; v++) {
            nanStart[v] = missing;
            boolean ok = true;
            double[] col = columns[v];
            double[] xc = clean[v];
            double[] w = seen[v];
            for (int row = 0; row < n; row++) {
                double x = col[row];
                if (Double.isNaN(x)) {
                    nanRow[missing++] = row;
                    xc[row] = 0;
                    w[row] = 0;
                } else {
                    ok &= ReferenceDensities.plain(x, false);
                    xc[row] = x;
                    w[row] = 1;
                }
            }
            plain[v] = ok;
        }
        nanStart[nv] = missing;
    }

    /**
     * Bundle i of leaf r at each row: the sum of its inputs' log-values, variables in the region's order. A
     * normal input over a column of plain cells takes the vectorised loops of
     * {@link ReferenceDensities#addNormalLogValues} (on the 9 * 10^6-edge circuit with K = I = 4, 4.3 million
     * inputs, the branch per cell of the general loop was most of this evaluation's time); the same numbers.
     */
    void bundles(int r, int n, double[][] dst) {
        int[] vars = m.s.vars(r);
        int bundles = m.p.options().inputs();
        for (int i = 0, q = m.leafBase[r]; i < bundles; i++) {
            Arrays.fill(bundle, 0, n, 0);
            for (int j = 0; j < vars.length; j++, q++) {
                int v = vars[j];
                double mean = m.normalMean[q];
                if (plain[v] && mean == mean) {
                    ReferenceDensities.addNormalLogValues(mean, m.normalSd[q], m.normalLogSd[q], columns[v], clean[v],
                            seen[v], n, nanRow, nanStart[v], nanStart[v + 1], term, bundle);
                } else {
                    ReferenceDensities.addLogValues(m.family[v], m.p.inputParams(r, i, j), columns[v], n, bundle);
                }
            }
            System.arraycopy(bundle, 0, dst[i], 0, n);
        }
    }

    /** Sets the digits of a partition of {@code parts} parts to its first product. */
    void firstProduct(int parts) {
        if (digit.length < parts) {
            digit = new int[parts];
        }
        Arrays.fill(digit, 0, parts, 0);
    }

    /** Advances the digits to a partition's next product (the last part varying fastest); false after its last. */
    boolean nextProduct(int[] parts, int count) {
        for (int t = count - 1; t >= 0; t--) {
            if (++digit[t] < m.layout.size(parts[t])) {
                return true;
            }
            digit[t] = 0;
        }
        return false;
    }

    /**
     * {@code dot[q][row] = sum_j sw(q, j) * expChild[j][row]} for each row below {@code n}, the products
     * added in child order from the first, one child's row at a time.
     */
    void product(double[] sw, int q, int c, int n) {
        double[] d = dot[q];
        Arrays.fill(d, 0, n, 0);
        for (int j = 0, w = q * c; j < c; j++, w++) {
            double wj = sw[w];
            double[] e = expChild[j];
            for (int row = 0; row < n; row++) {
                d[row] += wj * e[row];
            }
        }
    }
}
