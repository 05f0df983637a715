package dev.circa.converter.regions;

import dev.circa.converter.reference.LogSumExp;
import java.util.Arrays;

/**
 * The exact path of the direct evaluation, for the rows that {@link LinearPass} cannot hold: each region a block of
 * log-values, each sum a scaled sum ({@link ScaledWeights#scaled}, the log of the largest weight added back) over
 * the children's e^(v - vmax), with the exact per-edge log-sum-exp ({@link LogSumExp}) where the scaled sum is below
 * {@link DirectBlocks#SCALED_FLOOR}, where the row's largest child is +inf or NaN, or where the sum's weights
 * have no scaled form. Each row is summed in one fixed order (children in layout order, parts in partition
 * order), whatever the other rows of the call.
 */
final class LogDomainPass {
    private static final int CHUNK_ROWS = RegionTensorEvaluator.CHUNK_ROWS;

    private final DirectModel m;
    private final DirectBlocks b;
    /** One sum's children at one row, for the exact per-edge log-sum-exp. */
    private final double[] column;
    /** Per part of a partition, where its exponentials start in {@link DirectBlocks#partRows}. */
    private int[] partFirst = new int[2];
    /** A part's largest value at each row. */
    private final double[] partMax = new double[CHUNK_ROWS];

    /** The log-domain pass of an evaluator of {@code m} working in {@code b}. */
    LogDomainPass(DirectModel m, DirectBlocks b) {
        this.m = m;
        this.b = b;
        this.column = new double[m.maxChildren];
    }

    /**
     * Rows {@code row0 .. row0+n-1} of {@code data} in the log domain, each region a block of log-values: the
     * exact path of the rows that the linear evaluation leaves.
     */
    void logBlock(double[] data, int row0, int n, double[] out) {
        b.columns(data, row0, n);
        for (int r : m.order) {
            double[][] t = b.block(m.slot[r]);
            if (m.s.isLeaf(r)) {
                // a leaf below the root offers its bundles; the root leaf sums over them
                b.bundles(r, n, r == m.s.root() ? b.child : t);
                if (r != m.s.root()) {
                    continue;
                }
            } else {
                products(r, n);
            }
            sums(r, n, t);
        }
        int co = m.outputCount();
        double[][] root = b.block[m.slot[m.s.root()]];
        for (int row = 0; row < n; row++) {
            for (int o = 0; o < co; o++) {
                out[(row0 + row) * co + o] = root[o][row];
            }
        }
    }

    /** The products of inner region r, in layout order, into {@link DirectBlocks#child}. */
    private void products(int r, int n) {
        int c = 0;
        for (int part : m.s.partitionsOf(r)) {
            int[] parts = m.s.parts(part);
            int pm = parts.length;
            b.firstProduct(pm);
            int[] digit = b.digit;
            boolean more = true;
            while (more) {
                double[] dst = b.child[c];
                System.arraycopy(b.block[m.slot[parts[0]]][digit[0]], 0, dst, 0, n);
                for (int t = 1; t < pm; t++) {
                    double[] src = b.block[m.slot[parts[t]]][digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] += src[row];
                    }
                }
                c++;
                more = b.nextProduct(parts, pm);
            }
        }
    }

    /** The sums of region r over the children in {@link DirectBlocks#child}, into {@code t}. */
    private void sums(int r, int n, double[][] t) {
        double[] vmax = b.vmax;
        int c = m.layout.children(r);
        int k = m.layout.sums(r);
        Arrays.fill(vmax, 0, n, Double.NEGATIVE_INFINITY);
        for (int j = 0; j < c; j++) {
            double[] v = b.child[j];
            for (int row = 0; row < n; row++) {
                vmax[row] = Math.max(vmax[row], v[row]);
            }
        }
        if (m.s.isLeaf(r)) {
            for (int j = 0; j < c; j++) {
                double[] v = b.child[j];
                double[] e = b.expChild[j];
                for (int row = 0; row < n; row++) {
                    e[row] = Math.exp(v[row] - vmax[row]);
                }
            }
        } else {
            linearProducts(r, n);
        }
        for (int q = 0; q < k; q++) {
            b.product(m.weights.scaled[r], q, c, n);
            finish(r, q, n, c, t[q]);
        }
    }

    /**
     * The products of inner region r in linear space, e^(v - vmax) for each product's log-value v, into
     * {@link DirectBlocks#expChild} in layout order: per partition, each part's largest value at the row, one
     * exponential per part node after its part's largest is subtracted, the products of those, times
     * e^(sum of the parts' largest - vmax). The sum of the largest parts is the partition's largest
     * product, so every factor is at most 1; a part whose nodes are all 0 (log -inf) gives 0. One exponential
     * per part node instead of one per product: the exponentials were most of this evaluation's time (3.5 ns
     * each here, against a fraction of a nanosecond for a vectorised add or multiply).
     */
    private void linearProducts(int r, int n) {
        double[] vmax = b.vmax;
        double[] partScale = b.partScale;
        final double neg = Double.NEGATIVE_INFINITY;
        int c = 0;
        for (int part : m.s.partitionsOf(r)) {
            int[] parts = m.s.parts(part);
            int pm = parts.length;
            if (partFirst.length < pm) {
                partFirst = new int[pm];
            }
            Arrays.fill(partScale, 0, n, 0);
            int rows = 0;
            double[][] partExp = b.partRows(0);
            for (int t = 0; t < pm; t++) {
                double[][] src = b.block[m.slot[parts[t]]];
                int size = m.layout.size(parts[t]);
                System.arraycopy(src[0], 0, partMax, 0, n);
                for (int u = 1; u < size; u++) {
                    double[] v = src[u];
                    for (int row = 0; row < n; row++) {
                        partMax[row] = Math.max(partMax[row], v[row]);
                    }
                }
                partExp = b.partRows(rows + size);
                partFirst[t] = rows;
                for (int u = 0; u < size; u++) {
                    double[] v = src[u];
                    double[] e = partExp[rows + u];
                    for (int row = 0; row < n; row++) {
                        double top = partMax[row];
                        e[row] = top == neg ? 0 : Math.exp(v[row] - top);
                    }
                }
                rows += size;
                for (int row = 0; row < n; row++) {
                    partScale[row] += partMax[row];
                }
            }
            for (int row = 0; row < n; row++) {
                double top = partScale[row];
                partScale[row] = top == neg || vmax[row] == neg ? 0 : Math.exp(top - vmax[row]);
            }
            b.firstProduct(pm);
            int[] digit = b.digit;
            boolean more = true;
            while (more) {
                double[] dst = b.expChild[c];
                System.arraycopy(partScale, 0, dst, 0, n);
                for (int t = 0; t < pm; t++) {
                    double[] e = partExp[partFirst[t] + digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] *= e[row];
                    }
                }
                c++;
                more = b.nextProduct(parts, pm);
            }
        }
    }

    /** Sum q of region r from its scaled sum in {@link DirectBlocks#dot}, at each row, into {@code t}. */
    private void finish(int r, int q, int n, int c, double[] t) {
        double[] vmax = b.vmax;
        double sh = m.weights.shift[r][q];
        double[] a = b.dot[q];
        for (int row = 0; row < n; row++) {
            double top = vmax[row];
            if (top == Double.NEGATIVE_INFINITY) {
                t[row] = top;
            } else if (a[row] >= DirectBlocks.SCALED_FLOOR && top < Double.POSITIVE_INFINITY && !Double.isNaN(sh)) {
                t[row] = top + sh + Math.log(a[row]);
            } else {
                t[row] = exact(r, q, row, c);
            }
        }
    }

    /** Sum q of region r at one row by the per-edge log-sum-exp. */
    private double exact(int r, int q, int row, int c) {
        for (int j = 0; j < c; j++) {
            column[j] = b.child[j][row];
        }
        return LogSumExp.weighted(m.p.weights(r, q), m.p.logWeights(r), column, c);
    }
}
