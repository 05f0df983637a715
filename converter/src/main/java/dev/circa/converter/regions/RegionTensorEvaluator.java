package dev.circa.converter.regions;

import dev.circa.converter.reference.LogSumExp;
import dev.circa.converter.reference.ReferenceDensities;
import dev.circa.format.Family;
import java.util.Arrays;

/**
 * Evaluates a compiled region graph directly from its parameters, region by region, without
 * building or reading a circuit. Written separately from the engine to check it.
 *
 * <p>Rows are taken in blocks of {@value #CHUNK_ROWS}. Each region holds a block of log-values laid out
 * node by node, the block's rows side by side ({@code [node * CHUNK_ROWS + row]}), filled children first:
 * a leaf's bundles are sums of its inputs' log-densities (a missing value counts 0); a partition's
 * products are sums of its parts' log-values over the cross product (first part varying slowest); a sum
 * is the log-sum-exp of weight plus child, computed for all rows of the block at once as a scaled
 * product in linear space, {@code vmax + log(wmax) + log(sum_j (w_j / wmax) e^(v_j - vmax))} with
 * {@code vmax} the row's largest child. A row whose scaled sum underflows (below 2^-900), whose
 * largest child is not finite, or that meets a non-finite weight falls back to the exact per-edge
 * log-sum-exp ({@link LogSumExp}). Each row is summed in one fixed order (children in layout order,
 * parts in partition order), so a row's value does not depend on the other rows of the call.
 *
 * <p>The scaled weights are computed once and shared by the evaluators made with {@link #sharing()};
 * each evaluator owns its blocks and reuses them on every call. Not thread-safe: one evaluator per thread.
 */
public final class RegionTensorEvaluator {
    /** Rows evaluated together: the blocks hold this many rows, whatever the number of rows asked for. */
    public static final int CHUNK_ROWS = 64;
    /** Below this a scaled sum has lost too many digits: the row takes the exact per-edge log-sum-exp. */
    private static final double SCALED_FLOOR = 0x1p-900;

    private final RegionParameters p;
    private final RegionStructure s;
    private final Layout layout;
    private final int[] order;
    /** Per region with sums: weight / largest weight of its sum, row-major (sums x children); null elsewhere. */
    private final double[][] scaled;
    /** Per region with sums: log of the largest weight of each sum (NaN when a weight is not usable as scaled). */
    private final double[][] shift;
    /** Per region: its block of log-values ({@code size(r) x CHUNK_ROWS}). */
    private final double[][] block;
    private final double[] child;
    private final double[] expChild;
    private final double[] vmax;
    private final double[] acc;
    private final double[] column;
    private int[] digit = new int[2];

    /** An evaluator of the model that {@code params} define. */
    public RegionTensorEvaluator(RegionParameters params) {
        this.p = params;
        this.s = params.structure();
        this.layout = params.layout();
        this.order = s.order();
        int nr = s.regionCount();
        this.scaled = new double[nr][];
        this.shift = new double[nr][];
        for (int r = 0; r < nr; r++) {
            if (layout.hasSums(r)) {
                scale(r);
            }
        }
        int maxChildren = 1;
        for (int r = 0; r < nr; r++) {
            maxChildren = Math.max(maxChildren, layout.children(r));
        }
        this.block = new double[nr][];
        this.child = new double[maxChildren * CHUNK_ROWS];
        this.expChild = new double[maxChildren * CHUNK_ROWS];
        this.vmax = new double[CHUNK_ROWS];
        this.acc = new double[CHUNK_ROWS];
        this.column = new double[maxChildren];
    }

    private RegionTensorEvaluator(RegionTensorEvaluator shared) {
        this.p = shared.p;
        this.s = shared.s;
        this.layout = shared.layout;
        this.order = shared.order;
        this.scaled = shared.scaled;
        this.shift = shared.shift;
        this.block = new double[s.regionCount()][];
        this.child = new double[shared.child.length];
        this.expChild = new double[shared.expChild.length];
        this.vmax = new double[CHUNK_ROWS];
        this.acc = new double[CHUNK_ROWS];
        this.column = new double[shared.column.length];
    }

    /** Another evaluator of the same model that shares this one's scaled weights, for another thread. */
    public RegionTensorEvaluator sharing() {
        return new RegionTensorEvaluator(this);
    }

    private void scale(int r) {
        int k = layout.sums(r);
        int c = layout.children(r);
        boolean log = p.logWeights(r);
        double[] sw = new double[k * c];
        double[] sh = new double[k];
        for (int q = 0; q < k; q++) {
            double[] w = p.weights(r, q);
            double max = Double.NEGATIVE_INFINITY;
            boolean usable = true;
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                usable &= lw < Double.POSITIVE_INFINITY;
                max = Math.max(max, lw);
            }
            // a weight of +inf or NaN (or all weights zero) has no scaled form: every row takes the exact path
            sh[q] = usable && max > Double.NEGATIVE_INFINITY ? max : Double.NaN;
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                sw[q * c + j] = Double.isNaN(sh[q]) ? 0 : Math.exp(lw - max);
            }
        }
        scaled[r] = sw;
        shift[r] = sh;
    }

    /** Number of outputs (C). */
    public int outputCount() {
        return p.options().outputs();
    }

    /**
     * Log-values of every output for each row.
     *
     * @param data input: row-major rows x variables, NaN = missing, discrete values as doubles
     * @param rows number of rows
     * @param out output: {@code out[row * outputCount() + o]}
     */
    public void logDensity(double[] data, int rows, double[] out) {
        logDensity(data, 0, rows, out);
    }

    /**
     * {@link #logDensity} spread over {@code threads} threads (this evaluator and others {@link #sharing()}
     * its weights), each on its own range of whole blocks; the values are the same as on one thread.
     */
    public void logDensity(double[] data, int rows, double[] out, int threads) {
        int blocks = (rows + CHUNK_ROWS - 1) / CHUNK_ROWS;
        int parts = Math.max(1, Math.min(threads, blocks));
        if (parts == 1) {
            logDensity(data, 0, rows, out);
            return;
        }
        Thread[] workers = new Thread[parts - 1];
        Throwable[] failure = new Throwable[parts - 1];
        for (int t = 0; t < parts - 1; t++) {
            int from = (int) ((long) blocks * t / parts) * CHUNK_ROWS;
            int to = (int) ((long) blocks * (t + 1) / parts) * CHUNK_ROWS;
            RegionTensorEvaluator e = sharing();
            int slot = t;
            workers[t] = new Thread(() -> {
                try {
                    e.logDensity(data, from, to, out);
                } catch (RuntimeException | Error ex) {
                    failure[slot] = ex;
                }
            }, "circa-region-tensors-" + (t + 1));
            workers[t].setDaemon(true);
            workers[t].start();
        }
        logDensity(data, (int) ((long) blocks * (parts - 1) / parts) * CHUNK_ROWS, rows, out);
        boolean interrupted = false;
        for (int t = 0; t < workers.length; t++) {
            while (true) {
                try {
                    workers[t].join();
                    break;
                } catch (InterruptedException ex) {
                    interrupted = true;
                }
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        for (Throwable f : failure) {
            if (f instanceof RuntimeException re) {
                throw re;
            }
            if (f instanceof Error er) {
                throw er;
            }
        }
    }

    /** {@link #logDensity} on rows {@code from .. to-1} of {@code data}, written to the same rows of {@code out}. */
    public void logDensity(double[] data, int from, int to, double[] out) {
        for (int row0 = from; row0 < to; row0 += CHUNK_ROWS) {
            evaluateBlock(data, row0, Math.min(CHUNK_ROWS, to - row0), out);
        }
    }

    private void evaluateBlock(double[] data, int row0, int n, double[] out) {
        for (int r : order) {
            double[] t = block[r];
            if (t == null) {
                t = new double[layout.size(r) * CHUNK_ROWS];
                block[r] = t;
            }
            if (s.isLeaf(r)) {
                // a leaf below the root offers its bundles; the root leaf sums over them
                bundles(r, data, row0, n, r == s.root() ? child : t);
                if (r != s.root()) {
                    continue;
                }
            } else {
                products(r, n);
            }
            sums(r, n, t);
        }
        int co = outputCount();
        double[] root = block[s.root()];
        for (int row = 0; row < n; row++) {
            for (int o = 0; o < co; o++) {
                out[(row0 + row) * co + o] = root[o * CHUNK_ROWS + row];
            }
        }
    }

    /** Bundle i of leaf r at each row: the sum of its inputs' log-values, variables in the region's order. */
    private void bundles(int r, double[] data, int row0, int n, double[] dst) {
        int[] vars = s.vars(r);
        int nv = s.variables().size();
        int bundles = p.options().inputs();
        for (int i = 0; i < bundles; i++) {
            int at = i * CHUNK_ROWS;
            Arrays.fill(dst, at, at + n, 0);
            for (int j = 0; j < vars.length; j++) {
                Family f = p.family(vars[j]);
                double[] params = p.inputParams(r, i, j);
                for (int row = 0, cell = row0 * nv + vars[j]; row < n; row++, cell += nv) {
                    double x = data[cell];
                    if (!Double.isNaN(x)) {
                        dst[at + row] += ReferenceDensities.logValue(f, params, x);
                    }
                }
            }
        }
    }

    /** The products of inner region r, in layout order, into {@link #child}. */
    private void products(int r, int n) {
        int c = 0;
        for (int part : s.partitionsOf(r)) {
            int[] parts = s.parts(part);
            int m = parts.length;
            if (digit.length < m) {
                digit = new int[m];
            }
            Arrays.fill(digit, 0, m, 0);
            boolean more = true;
            while (more) {
                int at = c * CHUNK_ROWS;
                System.arraycopy(block[parts[0]], digit[0] * CHUNK_ROWS, child, at, n);
                for (int t = 1; t < m; t++) {
                    double[] src = block[parts[t]];
                    int from = digit[t] * CHUNK_ROWS;
                    for (int row = 0; row < n; row++) {
                        child[at + row] += src[from + row];
                    }
                }
                c++;
                more = false;
                for (int t = m - 1; t >= 0; t--) {
                    if (++digit[t] < layout.size(parts[t])) {
                        more = true;
                        break;
                    }
                    digit[t] = 0;
                }
            }
        }
    }

    /** The sums of region r over the children in {@link #child}, into {@code t}. */
    private void sums(int r, int n, double[] t) {
        int c = layout.children(r);
        int k = layout.sums(r);
        double[] sw = scaled[r];
        double[] sh = shift[r];
        Arrays.fill(vmax, 0, n, Double.NEGATIVE_INFINITY);
        for (int j = 0; j < c; j++) {
            int at = j * CHUNK_ROWS;
            for (int row = 0; row < n; row++) {
                vmax[row] = Math.max(vmax[row], child[at + row]);
            }
        }
        for (int j = 0; j < c; j++) {
            int at = j * CHUNK_ROWS;
            for (int row = 0; row < n; row++) {
                expChild[at + row] = Math.exp(child[at + row] - vmax[row]);
            }
        }
        for (int q = 0; q < k; q++) {
            Arrays.fill(acc, 0, n, 0);
            int wq = q * c;
            for (int j = 0; j < c; j++) {
                double w = sw[wq + j];
                int at = j * CHUNK_ROWS;
                for (int row = 0; row < n; row++) {
                    acc[row] += w * expChild[at + row];
                }
            }
            int out = q * CHUNK_ROWS;
            for (int row = 0; row < n; row++) {
                double m = vmax[row];
                if (m == Double.NEGATIVE_INFINITY) {
                    t[out + row] = m;
                } else if (acc[row] >= SCALED_FLOOR && m < Double.POSITIVE_INFINITY && !Double.isNaN(sh[q])) {
                    t[out + row] = m + sh[q] + Math.log(acc[row]);
                } else {
                    t[out + row] = exact(r, q, row, c);
                }
            }
        }
    }

    /** Sum q of region r at one row by the per-edge log-sum-exp. */
    private double exact(int r, int q, int row, int c) {
        for (int j = 0; j < c; j++) {
            column[j] = child[j * CHUNK_ROWS + row];
        }
        return LogSumExp.weighted(p.weights(r, q), p.logWeights(r), column, c);
    }
}
