package dev.circa.converter.regions;

import java.util.Arrays;

/**
 * The direct evaluation in linear space, the path of almost every row. Each region's block holds its values node
 * by node, a row array per node ({@code [node][row]}), filled children first: at each row a region's values are
 * {@code y_k * 2^E}, with the y_k held and E an integer per row (value 0 is y = 0; see {@link BinaryScale}). A
 * leaf's bundles are sums of its inputs' log-densities (a missing value counts 0), turned into linear values by
 * one exponential each, {@code e^(v - E ln 2)} with E = floor(largest / ln 2); a partition's products are
 * products of its parts' y over the cross product (first part varying slowest) with the parts' exponents
 * added, scaled by the exact power of two between the partition's exponent and the largest of the region's
 * partitions; a sum is the weights (each sum's scaled by the power of two of its largest,
 * {@link ScaledWeights#binaryScaled}) times the products; an inner region's sums are then scaled by exact powers
 * of two so that the largest is in [1, 2), and the root's are logged once, {@code log y + E ln 2} (ln 2 in two
 * parts). No exponential or logarithm at the part or sum nodes: those were most of the time when the regions held
 * log-values.
 *
 * <p>A row that a region cannot hold this way is evaluated again on its own by {@link LogDomainPass}: a row where
 * some scaled sum is below {@link DirectBlocks#SCALED_FLOOR} of its largest weight (digits lost, or every product 0
 * or underflowed; the partition with the largest exponent has a product of at least 1, so what underflows
 * elsewhere is below 2^-1074 of it), or not finite; a leaf whose bundles are all 0 (-inf), one +inf or NaN, or
 * past 2^20 in magnitude; a region with a weight +inf or NaN, a sum of zero weights, or a log weight past 2^20 in
 * magnitude (every row). Which path a row takes depends on that row alone.
 */
final class LinearPass {
    private static final int CHUNK_ROWS = RegionTensorEvaluator.CHUNK_ROWS;

    private final DirectModel m;
    private final RegionStructure s;
    private final Layout layout;
    private final int[] slot;
    private final ScaledWeights w;
    private final DirectBlocks b;
    private final LogDomainPass exact;
    private final double[][][] block;
    private final long[][] blockExp;
    private final double[][] child;
    private final double[][] expChild;
    private final double[] vmax;
    private final double[][] dot;
    private final double[] partScale;
    /** The exponent of the children of the region's sums in {@link DirectBlocks#expChild}, at each row. */
    private final long[] childExp = new long[CHUNK_ROWS];
    /** Per partition of a region: the sum of its parts' exponents, at each row; grown on first use. */
    private long[][] partitionExp = new long[0][];
    /** A region's smallest scaled sum, then its largest sum (times 2^(g - G)), at each row. */
    private final double[] sumLow = new double[CHUNK_ROWS];
    private final double[] sumHigh = new double[CHUNK_ROWS];
    /** The rows of the block that the linear evaluation leaves to the log-domain one. */
    private final boolean[] fallback = new boolean[CHUNK_ROWS];
    /** Those rows' data and log-values, evaluated again in the log domain. */
    private double[] fallbackData = new double[0];
    private double[] fallbackOut = new double[0];
    private final int[] fallbackRow = new int[CHUNK_ROWS];
    /** Rows left to the log domain since this pass was made, for the tests. */
    private long logDomainRows;

    /** The linear pass of an evaluator of {@code m} working in {@code b}, leaving rows to {@code exact}. */
    LinearPass(DirectModel m, DirectBlocks b, LogDomainPass exact) {
        this.m = m;
        this.s = m.s;
        this.layout = m.layout;
        this.slot = m.slot;
        this.w = m.weights;
        this.b = b;
        this.exact = exact;
        this.block = b.block;
        this.blockExp = b.blockExp;
        this.child = b.child;
        this.expChild = b.expChild;
        this.vmax = b.vmax;
        this.dot = b.dot;
        this.partScale = b.partScale;
    }

    /** The rows this pass has left to the log-domain evaluation so far (each counted once per call). */
    long logDomainRows() {
        return logDomainRows;
    }

    /**
     * Rows {@code row0 .. row0+n-1} of {@code data} in linear space, each region a block of linear values and
     * a power of two per row; the rows this leaves (see {@link #fallback}) are evaluated again by
     * {@link LogDomainPass#logBlock}, on their own.
     */
    void linearBlock(double[] data, int row0, int n, double[] out) {
        b.columns(data, row0, n);
        Arrays.fill(fallback, 0, n, false);
        int bundles = m.p.options().inputs();
        for (int r : m.order) {
            double[][] t = b.block(slot[r]);
            long[] e = blockExp[slot[r]];
            if (s.isLeaf(r)) {
                if (r != s.root()) {
                    b.bundles(r, n, t);
                    toLinear(t, bundles, n, t, e);
                    continue;
                }
                b.bundles(r, n, child);
                toLinear(child, bundles, n, expChild, childExp);
            } else {
                scaledProducts(r, n);
            }
            if (w.binaryScaled[r] == null) {
                Arrays.fill(fallback, 0, n, true);
                Arrays.fill(e, 0, n, 0);
                for (int q = 0; q < layout.sums(r); q++) {
                    Arrays.fill(t[q], 0, n, 0);
                }
                continue;
            }
            for (int q = 0; q < layout.sums(r); q++) {
                b.product(w.binaryScaled[r], q, layout.children(r), n);
            }
            if (r == s.root()) {
                rootLogs(r, n, t);
            } else {
                normalise(r, n, t, e);
            }
        }
        int co = m.outputCount();
        double[][] root = block[slot[s.root()]];
        int nv = m.family.length;
        int left = 0;
        for (int row = 0; row < n; row++) {
            if (fallback[row]) {
                fallbackRow[left++] = row;
                continue;
            }
            for (int o = 0; o < co; o++) {
                out[(row0 + row) * co + o] = root[o][row];
            }
        }
        if (left == 0) {
            return;
        }
        logDomainRows += left;
        if (fallbackData.length == 0) {
            fallbackData = new double[Math.multiplyExact(CHUNK_ROWS, nv)];
            fallbackOut = new double[Math.multiplyExact(CHUNK_ROWS, co)];
        }
        for (int i = 0; i < left; i++) {
            System.arraycopy(data, (row0 + fallbackRow[i]) * nv, fallbackData, i * nv, nv);
        }
        exact.logBlock(fallbackData, 0, left, fallbackOut);
        for (int i = 0; i < left; i++) {
            System.arraycopy(fallbackOut, i * co, out, (row0 + fallbackRow[i]) * co, co);
        }
    }

    /**
     * Log-values {@code src[i][row]} ({@code i < count}) as linear values {@code dst[i][row]} times 2^E per row,
     * E = floor(largest / ln 2): one exponential per value. A row whose largest is not finite (every value 0,
     * or a value +inf or NaN) or not below {@link BinaryScale#LOG_LIMIT} in magnitude is left to the log domain.
     * {@code dst} may be {@code src}.
     */
    private void toLinear(double[][] src, int count, int n, double[][] dst, long[] e) {
        Arrays.fill(vmax, 0, n, Double.NEGATIVE_INFINITY);
        for (int i = 0; i < count; i++) {
            double[] v = src[i];
            for (int row = 0; row < n; row++) {
                vmax[row] = Math.max(vmax[row], v[row]);
            }
        }
        for (int row = 0; row < n; row++) {
            double top = vmax[row];
            boolean ok = Math.abs(top) < BinaryScale.LOG_LIMIT;
            fallback[row] |= !ok;
            e[row] = ok ? BinaryScale.exponentOf(top) : 0;
        }
        for (int i = 0; i < count; i++) {
            double[] v = src[i];
            double[] y = dst[i];
            for (int row = 0; row < n; row++) {
                y[row] = BinaryScale.linear(v[row], e[row]);
            }
        }
    }

    /**
     * The products of inner region r in linear space, into {@link DirectBlocks#expChild} in layout order with their
     * exponent in {@link #childExp}: a partition's exponent at a row is the sum of its parts' exponents, the region's
     * the largest over its partitions, and a partition below it is scaled by the exact power of two between
     * them (applied to its last part's values, then multiplied by the other parts', first part first). Every
     * part has a value in [1, 2) at a row it does not leave to the log domain, so the partition with the
     * largest exponent has a product of at least 1: whatever underflows elsewhere is below 2^-1074 of it.
     */
    private void scaledProducts(int r, int n) {
        int[] partitions = s.partitionsOf(r);
        if (partitionExp.length < partitions.length) {
            partitionExp = new long[partitions.length][CHUNK_ROWS];
        }
        Arrays.fill(childExp, 0, n, Long.MIN_VALUE);
        for (int i = 0; i < partitions.length; i++) {
            int[] parts = s.parts(partitions[i]);
            long[] pe = partitionExp[i];
            System.arraycopy(blockExp[slot[parts[0]]], 0, pe, 0, n);
            for (int t = 1; t < parts.length; t++) {
                long[] add = blockExp[slot[parts[t]]];
                for (int row = 0; row < n; row++) {
                    pe[row] += add[row];
                }
            }
            for (int row = 0; row < n; row++) {
                childExp[row] = Math.max(childExp[row], pe[row]);
            }
        }
        int c = 0;
        for (int i = 0; i < partitions.length; i++) {
            int[] parts = s.parts(partitions[i]);
            int pm = parts.length;
            double[][] last = block[slot[parts[pm - 1]]];
            if (partitions.length > 1) {
                last = scaledLast(last, layout.size(parts[pm - 1]), partitionExp[i], n);
            }
            b.firstProduct(pm);
            int[] digit = b.digit;
            boolean more = true;
            while (more) {
                double[] dst = expChild[c];
                double[] f0 = pm == 1 ? last[digit[0]] : block[slot[parts[0]]][digit[0]];
                double[] f1 = pm <= 2 ? last[digit[pm - 1]] : block[slot[parts[1]]][digit[1]];
                if (pm == 1) {
                    System.arraycopy(f0, 0, dst, 0, n);
                } else {
                    for (int row = 0; row < n; row++) {
                        dst[row] = f0[row] * f1[row];
                    }
                }
                for (int t = 2; t < pm; t++) {
                    double[] f = t == pm - 1 ? last[digit[t]] : block[slot[parts[t]]][digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] *= f[row];
                    }
                }
                c++;
                more = b.nextProduct(parts, pm);
            }
        }
    }

    /**
     * A partition's last part's values times 2^(its exponent - the region's) at each row (a power of two at
     * most 1, exact unless the product underflows), in {@link DirectBlocks#partRows}.
     */
    private double[][] scaledLast(double[][] y, int size, long[] pe, int n) {
        double[][] partExp = b.partRows(size);
        for (int row = 0; row < n; row++) {
            partScale[row] = BinaryScale.pow2(pe[row] - childExp[row]);
        }
        for (int u = 0; u < size; u++) {
            double[] src = y[u];
            double[] dst = partExp[u];
            for (int row = 0; row < n; row++) {
                dst[row] = src[row] * partScale[row];
            }
        }
        return partExp;
    }

    /**
     * Whether the scaled sum {@code a} (in units of its largest weight's power of two) is usable: not below
     * {@link DirectBlocks#SCALED_FLOOR} (below it digits are lost, or every term was 0 or underflowed) and finite.
     */
    private static boolean usable(double a) {
        return a >= DirectBlocks.SCALED_FLOOR && a < Double.POSITIVE_INFINITY;
    }

    /**
     * Region r's sums from the scaled sums in {@link DirectBlocks#dot}, as linear values normalised by exact powers
     * of two so that the largest is in [1, 2), into {@code t}, and the row's exponent into {@code e}: each sum times
     * 2^(g - G) (every sum in units of 2^G), then every sum of the row times 2^-(the exponent of the largest). A
     * row with an unusable scaled sum is left to the log domain. The loops over a sum's rows hold no branch, and
     * the exponent is taken once per row: taken per sum and row, with branches, this step was 28% of the
     * evaluation's time on the 3 * 10^6-edge circuit with K = I = 4, against 12% now.
     */
    private void normalise(int r, int n, double[][] t, long[] e) {
        int k = layout.sums(r);
        double[] relative = w.binaryRelative[r];
        Arrays.fill(sumLow, 0, n, Double.POSITIVE_INFINITY);
        Arrays.fill(sumHigh, 0, n, 0);
        for (int q = 0; q < k; q++) {
            double[] a = dot[q];
            double[] y = t[q];
            double rq = relative[q];
            for (int row = 0; row < n; row++) {
                double v = a[row];
                sumLow[row] = Math.min(sumLow[row], v);
                double u = v * rq;
                y[row] = u;
                sumHigh[row] = Math.max(sumHigh[row], u);
            }
        }
        long top = w.binaryTop[r];
        for (int row = 0; row < n; row++) {
            double high = sumHigh[row];
            // the smallest below the floor (or NaN), or the largest +inf or NaN: the row is not held
            fallback[row] |= !(usable(sumLow[row]) && usable(high));
            int ex = Math.getExponent(high);
            e[row] = childExp[row] + top + ex;
            sumHigh[row] = BinaryScale.pow2(-ex);
        }
        for (int q = 0; q < k; q++) {
            double[] y = t[q];
            for (int row = 0; row < n; row++) {
                y[row] *= sumHigh[row];
            }
        }
    }

    /** The root's sums from the scaled sums in {@link DirectBlocks#dot}, as log-values, into {@code t}. */
    private void rootLogs(int r, int n, double[][] t) {
        long[] g = w.binaryShift[r];
        for (int q = 0; q < layout.sums(r); q++) {
            double[] a = dot[q];
            double[] y = t[q];
            for (int row = 0; row < n; row++) {
                double v = a[row];
                fallback[row] |= !usable(v);
                y[row] = BinaryScale.log(v, childExp[row] + g[q]);
            }
        }
    }
}
