package dev.circa.converter.regions;

import dev.circa.converter.reference.LogSumExp;
import dev.circa.converter.reference.ReferenceDensities;
import dev.circa.format.Family;
import java.util.Arrays;

/**
 * Evaluates a compiled region graph directly from its parameters, region by region, without
 * building or reading a circuit. Written separately from the engine to check it.
 *
 * <p>Rows are taken in blocks of {@value #CHUNK_ROWS}. Each region holds a block of values (in a slot
 * reused once the regions that read it are done, so memory stays small for any number of regions) laid out
 * node by node, a row array per node ({@code [node][row]}), filled children first, in linear space: at each row
 * a region's values are {@code y_k * 2^E}, with the y_k held and E an integer per row (value 0 is y = 0). A
 * leaf's bundles are sums of its inputs' log-densities (a missing value counts 0), turned into linear values by
 * one exponential each, {@code e^(v - E ln 2)} with E = floor(largest / ln 2); a partition's products are
 * products of its parts' y over the cross product (first part varying slowest) with the parts' exponents
 * added, scaled by the exact power of two between the partition's exponent and the largest of the region's
 * partitions; a sum is the weights (each sum's scaled by the power of two of its largest) times the products;
 * an inner region's sums are then scaled by exact powers of two so that the largest is in [1, 2), and the
 * root's are logged once, {@code log y + E ln 2} (ln 2 in two parts). No exponential or logarithm at the part
 * or sum nodes: those were most of the time when the regions held log-values.
 *
 * <p>A row that a region cannot hold this way is evaluated again on its own in the log domain, as the blocks
 * were before ({@link #logBlock}: log-values, each sum a scaled sum with the exact per-edge log-sum-exp,
 * {@link LogSumExp}, where that underflows): a row where some scaled sum is below 2^-900 of its largest weight
 * (digits lost, or every product 0 or underflowed; the partition with the largest exponent has a product of at
 * least 1, so what underflows elsewhere is below 2^-1074 of it), or not finite; a leaf whose bundles are all 0
 * (-inf), one +inf or NaN, or past 2^20 in magnitude; a region with a weight +inf or NaN, a sum of zero
 * weights, or a log weight past 2^20 in magnitude (every row). Each row is summed in one fixed order (children in layout order, parts in partition
 * order), and which path a row takes depends on that row alone, so a row's value does not depend on the
 * other rows of the call.
 *
 * <p>The scaled weights are computed once and shared by the evaluators made with {@link #sharing()};
 * each evaluator owns its blocks and reuses them on every call. Not thread-safe: one evaluator per thread.
 */
public final class RegionTensorEvaluator {
    /**
     * Rows evaluated together: the blocks hold this many rows, whatever the number of rows asked for. 256 rather
     * than 64: the loops over a block's rows are long enough for the JIT's vector loops, and the per-block work
     * (reading every input's parameters) is taken 4 times less often (6% less time on the K = I = 4 circuit of
     * 10^6 edges, unchanged at K = I = 24).
     */
    public static final int CHUNK_ROWS = 256;
    /**
     * Below this a scaled sum has lost too many digits: the linear evaluation leaves the row to the log domain, where
     * the sum takes the exact per-edge log-sum-exp.
     */
    private static final double SCALED_FLOOR = 0x1p-900;

    private final RegionParameters p;
    private final RegionStructure s;
    private final Layout layout;
    private final int[] order;
    /** The family of each variable. */
    private final Family[] family;
    /**
     * Per region with sums: weight / largest weight of its sum, sum by sum ({@code [q * children + j]}); null
     * elsewhere.
     */
    private final double[][] scaled;
    /** Per region with sums: log of the largest weight of each sum (NaN when a weight is not usable as scaled). */
    private final double[][] shift;
    /**
     * Per region with sums: each weight times 2^-g, g = floor(log2 of its sum's largest weight), sum by sum
     * ({@code [q * children + j]}): exact for plain weights, e^(log w - g ln 2) for log weights. Null where some
     * weight is not usable as scaled (the linear evaluation sends every row to the log-domain one).
     */
    private final double[][] binaryScaled;
    /** Per region with sums: g of each sum. */
    private final long[][] binaryShift;
    /** Per region with sums: 2^(g - G) for each sum, G the largest g of the region's sums (in {@link #binaryTop}). */
    private final double[][] binaryRelative;
    private final long[] binaryTop;
    /**
     * Per leaf region, where its inputs start in the three arrays below (input j of bundle i at
     * {@code leafBase[r] + i * vars + j}): the mean, sd and log sd of each normal input with a
     * {@link ReferenceDensities#plain} mean, NaN for other inputs. Read in order, block after block, instead of
     * the parameters' small arrays (on the 9 * 10^6-edge circuit with K = I = 4 the walk over those 4.3 million
     * arrays and a log per input and block took about as long as the densities).
     */
    private final int[] leafBase;
    private final double[] normalMean;
    private final double[] normalSd;
    private final double[] normalLogSd;
    /** Per region: the slot that holds its block of log-values while a later region reads it. */
    private final int[] slot;
    /** Per slot: the number of nodes of the regions it serves. */
    private final int[] slotSize;
    /** Per slot: a block of log-values, or of linear values y, {@code [node][row]}, allocated on first use. */
    private final double[][][] block;
    /** Per slot: the exponent E of each row of its block of linear values (value = y * 2^E). */
    private final long[][] blockExp;
    /** The exponent of the children of the region's sums in {@link #expChild}, at each row. */
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
    /** Rows evaluated in the log domain since this evaluator was made, for the tests. */
    private long logDomainRows;
    /** The children of the region's sums, {@code [child][row]}. */
    private final double[][] child;
    /** Each child's e^(v - vmax), {@code [child][row]}. */
    private final double[][] expChild;
    private final double[] vmax;
    /** Scaled sums of the block: {@code [q][row]}. */
    private final double[][] dot;
    private final double[] column;
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
    private int[] digit = new int[2];
    /** Per part of a partition, where its exponentials start in {@link #partExp}. */
    private int[] partFirst = new int[2];
    /** The exponentials of a partition's part nodes, a row array each; grown on first use. */
    private double[][] partExp = new double[0][];
    /** A part's largest value at each row. */
    private final double[] partMax = new double[CHUNK_ROWS];
    /** A partition's largest product (the sum of its parts' largest), then e^(that - vmax), at each row. */
    private final double[] partScale = new double[CHUNK_ROWS];

    /** An evaluator of the model that {@code params} define. */
    public RegionTensorEvaluator(RegionParameters params) {
        this.p = params;
        this.s = params.structure();
        this.layout = params.layout();
        this.order = s.order();
        this.family = new Family[s.variables().size()];
        for (int v = 0; v < family.length; v++) {
            family[v] = params.family(v);
        }
        int nr = s.regionCount();
        this.scaled = new double[nr][];
        this.shift = new double[nr][];
        this.binaryScaled = new double[nr][];
        this.binaryShift = new long[nr][];
        this.binaryRelative = new double[nr][];
        this.binaryTop = new long[nr];
        for (int r = 0; r < nr; r++) {
            if (layout.hasSums(r)) {
                scale(r);
            }
        }
        int maxChildren = 1;
        for (int r = 0; r < nr; r++) {
            maxChildren = Math.max(maxChildren, layout.children(r));
        }
        this.leafBase = new int[nr];
        int leafInputs = 0;
        int bundles = params.options().inputs();
        for (int r = 0; r < nr; r++) {
            leafBase[r] = leafInputs;
            leafInputs = s.isLeaf(r) ? Math.addExact(leafInputs, Math.multiplyExact(bundles, s.vars(r).length)) : leafInputs;
        }
        this.normalMean = new double[leafInputs];
        this.normalSd = new double[leafInputs];
        this.normalLogSd = new double[leafInputs];
        for (int r = 0; r < nr; r++) {
            if (!s.isLeaf(r)) {
                continue;
            }
            int[] vars = s.vars(r);
            for (int i = 0; i < bundles; i++) {
                for (int j = 0; j < vars.length; j++) {
                    int q = leafBase[r] + i * vars.length + j;
                    double[] prm = params.inputParams(r, i, j);
                    boolean normal = family[vars[j]] == Family.NORMAL && ReferenceDensities.plain(prm[0], true);
                    normalMean[q] = normal ? prm[0] : Double.NaN;
                    normalSd[q] = normal ? prm[1] : Double.NaN;
                    normalLogSd[q] = normal ? Math.log(prm[1]) : Double.NaN;
                }
            }
        }
        this.slot = new int[nr];
        this.slotSize = assignSlots(s, layout, slot);
        this.block = new double[slotSize.length][][];
        this.blockExp = new long[slotSize.length][];
        this.child = new double[maxChildren][CHUNK_ROWS];
        this.expChild = new double[maxChildren][CHUNK_ROWS];
        this.vmax = new double[CHUNK_ROWS];
        int maxSums = 1;
        for (int r = 0; r < nr; r++) {
            maxSums = Math.max(maxSums, layout.sums(r));
        }
        this.dot = new double[maxSums][CHUNK_ROWS];
        this.column = new double[maxChildren];
        this.nanStart = new int[family.length + 1];
        this.plain = new boolean[family.length];
    }

    private RegionTensorEvaluator(RegionTensorEvaluator shared) {
        this.p = shared.p;
        this.s = shared.s;
        this.layout = shared.layout;
        this.order = shared.order;
        this.family = shared.family;
        this.scaled = shared.scaled;
        this.shift = shared.shift;
        this.binaryScaled = shared.binaryScaled;
        this.binaryShift = shared.binaryShift;
        this.binaryRelative = shared.binaryRelative;
        this.binaryTop = shared.binaryTop;
        this.leafBase = shared.leafBase;
        this.normalMean = shared.normalMean;
        this.normalSd = shared.normalSd;
        this.normalLogSd = shared.normalLogSd;
        this.slot = shared.slot;
        this.slotSize = shared.slotSize;
        this.block = new double[slotSize.length][][];
        this.blockExp = new long[slotSize.length][];
        this.child = new double[shared.child.length][CHUNK_ROWS];
        this.expChild = new double[shared.expChild.length][CHUNK_ROWS];
        this.vmax = new double[CHUNK_ROWS];
        this.dot = new double[shared.dot.length][CHUNK_ROWS];
        this.column = new double[shared.column.length];
        this.nanStart = new int[shared.nanStart.length];
        this.plain = new boolean[shared.plain.length];
    }

    /**
     * Gives each region a slot, reused once every region that reads it is done (regions in
     * {@link RegionStructure#order()}), so that the blocks held at once are few whatever the number of
     * regions; returns each slot's size in nodes.
     */
    private static int[] assignSlots(RegionStructure s, Layout layout, int[] slot) {
        int nr = s.regionCount();
        int[] order = s.order();
        int[] position = new int[nr];
        for (int i = 0; i < nr; i++) {
            position[order[i]] = i;
        }
        int[] lastUse = new int[nr];
        Arrays.fill(lastUse, -1);
        for (int part = 0; part < s.partitionCount(); part++) {
            int reader = position[s.partitionRegion(part)];
            for (int q : s.parts(part)) {
                lastUse[q] = Math.max(lastUse[q], reader);
            }
        }
        // regions whose last reader is at position i, as linked lists
        int[] first = new int[nr];
        int[] next = new int[nr];
        Arrays.fill(first, -1);
        for (int r = 0; r < nr; r++) {
            if (lastUse[r] >= 0) {
                next[r] = first[lastUse[r]];
                first[lastUse[r]] = r;
            }
        }
        java.util.Map<Integer, java.util.ArrayDeque<Integer>> free = new java.util.HashMap<>();
        int[] sizes = new int[Math.max(1, nr)];
        int slots = 0;
        for (int i = 0; i < nr; i++) {
            int r = order[i];
            java.util.ArrayDeque<Integer> same = free.get(layout.size(r));
            if (same != null && !same.isEmpty()) {
                slot[r] = same.pop();
            } else {
                sizes[slots] = layout.size(r);
                slot[r] = slots++;
            }
            for (int q = first[i]; q >= 0; q = next[q]) {
                free.computeIfAbsent(layout.size(q), k -> new java.util.ArrayDeque<>()).push(slot[q]);
            }
        }
        return Arrays.copyOf(sizes, slots);
    }

    /** Another evaluator of the same model that shares this one's scaled weights, for another thread. */
    public RegionTensorEvaluator sharing() {
        return new RegionTensorEvaluator(this);
    }

    /**
     * The weights of region r's sums, scaled for both evaluations. Log domain: each weight over its sum's largest,
     * with the log of the largest. Linear: each weight times 2^-g with g = floor(log2 of its sum's largest), so that
     * the largest scaled weight is in [1, 2) (exact for plain weights), with g; left null when a weight is +inf or
     * NaN, when a sum's weights are all 0 (as in the log domain: every row takes the exact path), or when a log
     * weight's g would pass 2^20.
     */
    private void scale(int r) {
        int k = layout.sums(r);
        int c = layout.children(r);
        boolean log = p.logWeights(r);
        double[] sw = new double[k * c];
        double[] sh = new double[k];
        double[] bw = new double[k * c];
        long[] g = new long[k];
        boolean binary = true;
        for (int q = 0; q < k; q++) {
            double[] w = p.weights(r, q);
            double max = Double.NEGATIVE_INFINITY;
            double plainMax = 0;
            boolean usable = true;
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                usable &= lw < Double.POSITIVE_INFINITY;
                max = Math.max(max, lw);
                plainMax = log ? plainMax : Math.max(plainMax, w[j]);
            }
            // a weight of +inf or NaN (or all weights zero) has no scaled form: every row takes the exact path
            sh[q] = usable && max > Double.NEGATIVE_INFINITY ? max : Double.NaN;
            binary &= !Double.isNaN(sh[q]) && (!log || Math.abs(max) < BinaryScale.LOG_LIMIT);
            g[q] = !binary ? 0 : log ? BinaryScale.exponentOf(max) : BinaryScale.exponent(plainMax);
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                sw[q * c + j] = Double.isNaN(sh[q]) ? 0 : Math.exp(lw - max);
                // plain weights: an exact scaling by a power of two (or an underflow far below the largest)
                bw[q * c + j] = !binary ? 0 : log ? BinaryScale.linear(w[j], g[q]) : Math.scalb(w[j], (int) -g[q]);
            }
        }
        scaled[r] = sw;
        shift[r] = sh;
        binaryScaled[r] = binary ? bw : null;
        binaryShift[r] = g;
        long top = Long.MIN_VALUE;
        for (int q = 0; q < k; q++) {
            top = Math.max(top, g[q]);
        }
        double[] relative = new double[k];
        for (int q = 0; q < k; q++) {
            relative[q] = BinaryScale.pow2(g[q] - top);
        }
        binaryRelative[r] = relative;
        binaryTop[r] = top;
    }

    /** The rows this evaluator has left to the log-domain evaluation so far (each counted once per call). */
    long logDomainRows() {
        return logDomainRows;
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
    private void logDensity(double[] data, int from, int to, double[] out) {
        for (int row0 = from; row0 < to; row0 += CHUNK_ROWS) {
            linearBlock(data, row0, Math.min(CHUNK_ROWS, to - row0), out);
        }
    }

    /** The block of a slot, allocated on first use. */
    private double[][] block(int sl) {
        if (block[sl] == null) {
            block[sl] = new double[slotSize[sl]][CHUNK_ROWS];
            blockExp[sl] = new long[CHUNK_ROWS];
        }
        return block[sl];
    }

    /**
     * Rows {@code row0 .. row0+n-1} of {@code data} in linear space, each region a block of linear values and
     * a power of two per row; the rows this leaves (see {@link #fallback}) are evaluated again by
     * {@link #logBlock}, on their own.
     */
    private void linearBlock(double[] data, int row0, int n, double[] out) {
        columns(data, row0, n);
        Arrays.fill(fallback, 0, n, false);
        int bundles = p.options().inputs();
        for (int r : order) {
            double[][] t = block(slot[r]);
            long[] e = blockExp[slot[r]];
            if (s.isLeaf(r)) {
                if (r != s.root()) {
                    bundles(r, n, t);
                    toLinear(t, bundles, n, t, e);
                    continue;
                }
                bundles(r, n, child);
                toLinear(child, bundles, n, expChild, childExp);
            } else {
                scaledProducts(r, n);
            }
            if (binaryScaled[r] == null) {
                Arrays.fill(fallback, 0, n, true);
                Arrays.fill(e, 0, n, 0);
                for (int q = 0; q < layout.sums(r); q++) {
                    Arrays.fill(t[q], 0, n, 0);
                }
                continue;
            }
            for (int q = 0; q < layout.sums(r); q++) {
                product(binaryScaled[r], q, layout.children(r), n);
            }
            if (r == s.root()) {
                rootLogs(r, n, t);
            } else {
                normalise(r, n, t, e);
            }
        }
        int co = outputCount();
        double[][] root = block[slot[s.root()]];
        int nv = family.length;
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
        logBlock(fallbackData, 0, left, fallbackOut);
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
            double m = vmax[row];
            boolean ok = Math.abs(m) < BinaryScale.LOG_LIMIT;
            fallback[row] |= !ok;
            e[row] = ok ? BinaryScale.exponentOf(m) : 0;
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
     * The products of inner region r in linear space, into {@link #expChild} in layout order with their exponent
     * in {@link #childExp}: a partition's exponent at a row is the sum of its parts' exponents, the region's
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
            int m = parts.length;
            double[][] last = block[slot[parts[m - 1]]];
            if (partitions.length > 1) {
                last = scaledLast(last, layout.size(parts[m - 1]), partitionExp[i], n);
            }
            firstProduct(m);
            boolean more = true;
            while (more) {
                double[] dst = expChild[c];
                double[] a = m == 1 ? last[digit[0]] : block[slot[parts[0]]][digit[0]];
                double[] b = m <= 2 ? last[digit[m - 1]] : block[slot[parts[1]]][digit[1]];
                if (m == 1) {
                    System.arraycopy(a, 0, dst, 0, n);
                } else {
                    for (int row = 0; row < n; row++) {
                        dst[row] = a[row] * b[row];
                    }
                }
                for (int t = 2; t < m; t++) {
                    double[] f = t == m - 1 ? last[digit[t]] : block[slot[parts[t]]][digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] *= f[row];
                    }
                }
                c++;
                more = nextProduct(parts, m);
            }
        }
    }

    /**
     * A partition's last part's values times 2^(its exponent - the region's) at each row (a power of two at
     * most 1, exact unless the product underflows), in {@link #partExp}.
     */
    private double[][] scaledLast(double[][] y, int size, long[] pe, int n) {
        if (partExp.length < size) {
            double[][] grown = Arrays.copyOf(partExp, size);
            for (int i = partExp.length; i < size; i++) {
                grown[i] = new double[CHUNK_ROWS];
            }
            partExp = grown;
        }
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
     * {@link #SCALED_FLOOR} (below it digits are lost, or every term was 0 or underflowed) and finite.
     */
    private static boolean usable(double a) {
        return a >= SCALED_FLOOR && a < Double.POSITIVE_INFINITY;
    }

    /**
     * Region r's sums from the scaled sums in {@link #dot}, as linear values normalised by exact powers of two
     * so that the largest is in [1, 2), into {@code t}, and the row's exponent into {@code e}: each sum times
     * 2^(g - G) (every sum in units of 2^G), then every sum of the row times 2^-(the exponent of the largest). A
     * row with an unusable scaled sum is left to the log domain. The loops over a sum's rows hold no branch, and
     * the exponent is taken once per row: taken per sum and row, with branches, this step was 28% of the
     * evaluation's time on the 3 * 10^6-edge circuit with K = I = 4, against 12% now.
     */
    private void normalise(int r, int n, double[][] t, long[] e) {
        int k = layout.sums(r);
        double[] relative = binaryRelative[r];
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
        long top = binaryTop[r];
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

    /** The root's sums from the scaled sums in {@link #dot}, as log-values, into {@code t}. */
    private void rootLogs(int r, int n, double[][] t) {
        long[] g = binaryShift[r];
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

    /**
     * Rows {@code row0 .. row0+n-1} of {@code data} in the log domain, each region a block of log-values: the
     * exact path of the rows that the linear evaluation leaves.
     */
    private void logBlock(double[] data, int row0, int n, double[] out) {
        columns(data, row0, n);
        for (int r : order) {
            double[][] t = block(slot[r]);
            if (s.isLeaf(r)) {
                // a leaf below the root offers its bundles; the root leaf sums over them
                bundles(r, n, r == s.root() ? child : t);
                if (r != s.root()) {
                    continue;
                }
            } else {
                products(r, n);
            }
            sums(r, n, t);
        }
        int co = outputCount();
        double[][] root = block[slot[s.root()]];
        for (int row = 0; row < n; row++) {
            for (int o = 0; o < co; o++) {
                out[(row0 + row) * co + o] = root[o][row];
            }
        }
    }

    /**
     * Bundle i of leaf r at each row: the sum of its inputs' log-values, variables in the region's order. A
     * normal input over a column of plain cells takes the vectorised loops of
     * {@link ReferenceDensities#addNormalLogValues} (on the 9 * 10^6-edge circuit with K = I = 4, 4.3 million
     * inputs, the branch per cell of the general loop was most of this evaluation's time); the same numbers.
     */
    private void bundles(int r, int n, double[][] dst) {
        int[] vars = s.vars(r);
        int bundles = p.options().inputs();
        for (int i = 0, q = leafBase[r]; i < bundles; i++) {
            Arrays.fill(bundle, 0, n, 0);
            for (int j = 0; j < vars.length; j++, q++) {
                int v = vars[j];
                double mean = normalMean[q];
                if (plain[v] && mean == mean) {
                    ReferenceDensities.addNormalLogValues(mean, normalSd[q], normalLogSd[q], columns[v], clean[v], seen[v],
                            n, nanRow, nanStart[v], nanStart[v + 1], term, bundle);
                } else {
                    ReferenceDensities.addLogValues(family[v], p.inputParams(r, i, j), columns[v], n, bundle);
                }
            }
            System.arraycopy(bundle, 0, dst[i], 0, n);
        }
    }

    /** Rows {@code row0 .. row0+n-1} of {@code data} into {@link #columns}, with each variable's missing rows. */
    private void columns(double[] data, int row0, int n) {
        int nv = family.length;
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

    /** The products of inner region r, in layout order, into {@link #child}. */
    private void products(int r, int n) {
        int c = 0;
        for (int part : s.partitionsOf(r)) {
            int[] parts = s.parts(part);
            int m = parts.length;
            firstProduct(m);
            boolean more = true;
            while (more) {
                double[] dst = child[c];
                System.arraycopy(block[slot[parts[0]]][digit[0]], 0, dst, 0, n);
                for (int t = 1; t < m; t++) {
                    double[] src = block[slot[parts[t]]][digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] += src[row];
                    }
                }
                c++;
                more = nextProduct(parts, m);
            }
        }
    }

    /** Sets the digits of a partition of m parts to its first product. */
    private void firstProduct(int m) {
        if (digit.length < m) {
            digit = new int[m];
        }
        Arrays.fill(digit, 0, m, 0);
    }

    /** Advances the digits to a partition's next product (the last part varying fastest); false after its last. */
    private boolean nextProduct(int[] parts, int m) {
        for (int t = m - 1; t >= 0; t--) {
            if (++digit[t] < layout.size(parts[t])) {
                return true;
            }
            digit[t] = 0;
        }
        return false;
    }

    /** The sums of region r over the children in {@link #child}, into {@code t}. */
    private void sums(int r, int n, double[][] t) {
        int c = layout.children(r);
        int k = layout.sums(r);
        Arrays.fill(vmax, 0, n, Double.NEGATIVE_INFINITY);
        for (int j = 0; j < c; j++) {
            double[] v = child[j];
            for (int row = 0; row < n; row++) {
                vmax[row] = Math.max(vmax[row], v[row]);
            }
        }
        if (s.isLeaf(r)) {
            for (int j = 0; j < c; j++) {
                double[] v = child[j];
                double[] e = expChild[j];
                for (int row = 0; row < n; row++) {
                    e[row] = Math.exp(v[row] - vmax[row]);
                }
            }
        } else {
            linearProducts(r, n);
        }
        for (int q = 0; q < k; q++) {
            product(scaled[r], q, c, n);
            finish(r, q, n, c, t[q]);
        }
    }

    /**
     * The products of inner region r in linear space, e^(v - vmax) for each product's log-value v, into
     * {@link #expChild} in layout order: per partition, each part's largest value at the row, one
     * exponential per part node after its part's largest is subtracted, the products of those, times
     * e^(sum of the parts' largest - vmax). The sum of the largest parts is the partition's largest
     * product, so every factor is at most 1; a part whose nodes are all 0 (log -inf) gives 0. One exponential
     * per part node instead of one per product: the exponentials were most of this evaluation's time (3.5 ns
     * each here, against a fraction of a nanosecond for a vectorised add or multiply).
     */
    private void linearProducts(int r, int n) {
        final double neg = Double.NEGATIVE_INFINITY;
        int c = 0;
        for (int part : s.partitionsOf(r)) {
            int[] parts = s.parts(part);
            int m = parts.length;
            if (partFirst.length < m) {
                partFirst = new int[m];
            }
            Arrays.fill(partScale, 0, n, 0);
            int rows = 0;
            for (int t = 0; t < m; t++) {
                double[][] src = block[slot[parts[t]]];
                int size = layout.size(parts[t]);
                System.arraycopy(src[0], 0, partMax, 0, n);
                for (int u = 1; u < size; u++) {
                    double[] v = src[u];
                    for (int row = 0; row < n; row++) {
                        partMax[row] = Math.max(partMax[row], v[row]);
                    }
                }
                if (partExp.length < rows + size) {
                    double[][] grown = Arrays.copyOf(partExp, rows + size);
                    for (int i = partExp.length; i < grown.length; i++) {
                        grown[i] = new double[CHUNK_ROWS];
                    }
                    partExp = grown;
                }
                partFirst[t] = rows;
                for (int u = 0; u < size; u++) {
                    double[] v = src[u];
                    double[] e = partExp[rows + u];
                    for (int row = 0; row < n; row++) {
                        double pm = partMax[row];
                        e[row] = pm == neg ? 0 : Math.exp(v[row] - pm);
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
            firstProduct(m);
            boolean more = true;
            while (more) {
                double[] dst = expChild[c];
                System.arraycopy(partScale, 0, dst, 0, n);
                for (int t = 0; t < m; t++) {
                    double[] e = partExp[partFirst[t] + digit[t]];
                    for (int row = 0; row < n; row++) {
                        dst[row] *= e[row];
                    }
                }
                c++;
                more = nextProduct(parts, m);
            }
        }
    }

    /**
     * {@code dot[q][row] = sum_j scaled(q, j) * expChild[j][row]} for each row below {@code n}, the products
     * added in child order from the first, one child's row at a time.
     */
    private void product(double[] sw, int q, int c, int n) {
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

    /** Sum q of region r from its scaled sum in {@link #dot}, at each row, into {@code t}. */
    private void finish(int r, int q, int n, int c, double[] t) {
        double sh = shift[r][q];
        double[] a = dot[q];
        for (int row = 0; row < n; row++) {
            double m = vmax[row];
            if (m == Double.NEGATIVE_INFINITY) {
                t[row] = m;
            } else if (a[row] >= SCALED_FLOOR && m < Double.POSITIVE_INFINITY && !Double.isNaN(sh)) {
                t[row] = m + sh + Math.log(a[row]);
            } else {
                t[row] = exact(r, q, row, c);
            }
        }
    }

    /** Sum q of region r at one row by the per-edge log-sum-exp. */
    private double exact(int r, int q, int row, int c) {
        for (int j = 0; j < c; j++) {
            column[j] = child[j][row];
        }
        return LogSumExp.weighted(p.weights(r, q), p.logWeights(r), column, c);
    }
}
