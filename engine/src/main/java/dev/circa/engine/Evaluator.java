package dev.circa.engine;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.MvNormal;
import dev.circa.engine.family.MvNormalWorkspace;
import dev.circa.engine.internal.CircuitData;
import dev.circa.engine.internal.DenseBlocks;
import dev.circa.engine.internal.DenseKernel;
import dev.circa.engine.internal.DenseWorkspace;
import dev.circa.engine.internal.ForwardKernel;
import java.util.Arrays;

/**
 * Evaluates a {@link CompiledCircuit} on batches of rows in log space, so nothing underflows.
 *
 * <p>Data layout (every method): {@code data} is row-major, {@code rows x variableCount()} cells; NaN is a
 * missing value, which is marginalised (an input over a missing variable has value 1); a discrete value
 * is the double of its state index or count. A value outside an input's support has density 0 (log -inf).
 *
 * <p>Not thread-safe: use one evaluator per thread (they may share the circuit). An evaluator owns a
 * workspace of about {@code nodeCount x chunk} doubles (and, for {@link #mpe}, as many ints: the child
 * each sum chose) that is grown on first use and reused by every later call; rows are processed in
 * chunks of at most {@value #MAX_CHUNK_ROWS} rows, fewer for circuits so large that the workspace
 * would pass {@value #VALUE_BUDGET} doubles, so memory stays bounded for any
 * batch size. On the automatic path with dense blocks, a node's values are kept only while a later node
 * reads them, so the workspace is {@code slots x chunk} doubles for far fewer slots than nodes, and chunks
 * of up to {@value #DENSE_CHUNK_ROWS} rows (longer matrix products: on the 10^6-edge circuit of bench/run at
 * batch 1024, 8.3e8 edge evaluations per second against 7.4e8 with chunks of 64).
 * No call allocates inside its evaluation loop.
 *
 * <p>Two evaluation paths give the same results to rounding (within 1e-12 relative, tested): the generic
 * one, node by node in log space, and the automatic one (the default), which evaluates the circuit's
 * dense blocks ({@link CompiledCircuit#denseBlockSummary()}) as matrix products in linear space with
 * per-row scaling and every other node the generic way. The automatic path serves {@link #logDensity},
 * {@link #conditional} and {@link #logPartition}; for {@link #mpe} it evaluates products of inputs without
 * storing the inputs (the same values, so the same explanation, tested). On a region-graph
 * circuit of 10^6 edges at batch 1024 the automatic path is about 5 times faster on one thread (bench/run).
 *
 * <p>Reproducible to the bit: on either path a row's values are summed in one fixed order that does not
 * depend on the other rows of the call, the chunking or the thread, so a row gives the same doubles alone,
 * anywhere in any batch, and on any number of threads of a {@link BatchRunner} (tested).
 */
public final class Evaluator {
    /** Largest number of rows evaluated together. */
    public static final int MAX_CHUNK_ROWS = 64;
    /** Largest number of rows evaluated together on the automatic path when the circuit has dense blocks. */
    public static final int DENSE_CHUNK_ROWS = 256;
    /** Largest number of doubles in the value workspace (64 MiB), unless one row alone needs more. */
    public static final int VALUE_BUDGET = 1 << 23;

    /** Which evaluation path an evaluator takes. */
    public enum Mode {
        /** Dense blocks as matrix products where the circuit has them, every other node generic. */
        AUTOMATIC,
        /** Every node by itself in log space. */
        GENERIC
    }

    private final CompiledCircuit circuit;
    private final CircuitData c;
    private final DenseBlocks blocks;
    private DenseWorkspace dense;
    private final int chunk;
    private final int genericChunk;
    private final int[] outputRow;
    private final double[] scratch;
    private final MvNormalWorkspace mvn;
    private double[] value = new double[0];
    /** Per sum and row of the last max-product pass, the child edge a backtrack takes (node-major, as {@link #value}). */
    private int[] choice = new int[0];
    private double[] denseValue = new double[0];
    private double[] partial = new double[0];
    private boolean[] hide;
    private int[] stack;
    private int[] stamp;
    private int generation;

    /** An evaluator for {@code circuit} on the automatic path. */
    public Evaluator(CompiledCircuit circuit) {
        this(circuit, Mode.AUTOMATIC);
    }

    /** An evaluator for {@code circuit} on the path {@code mode}. */
    public Evaluator(CompiledCircuit circuit, Mode mode) {
        this(circuit, mode == Mode.AUTOMATIC ? circuit.denseBlocks() : null);
    }

    /** An evaluator that takes every candidate group of sums as a dense block: for tests of the kernel. */
    static Evaluator everyCandidateBlock(CompiledCircuit circuit) {
        return new Evaluator(circuit, circuit.everyCandidateBlocks());
    }

    private Evaluator(CompiledCircuit circuit, DenseBlocks blocks) {
        this.circuit = circuit;
        this.blocks = blocks == null || blocks.blockCount() == 0 ? null : blocks;
        this.c = circuit.data();
        this.genericChunk = Math.max(1, Math.min(MAX_CHUNK_ROWS, VALUE_BUDGET / Math.max(1, c.nodeCount)));
        this.chunk = this.blocks == null ? genericChunk
                : Math.max(1, Math.min(DENSE_CHUNK_ROWS, VALUE_BUDGET / this.blocks.slotCount));
        this.outputRow = new int[c.outputNode.length];
        for (int o = 0; o < outputRow.length; o++) {
            outputRow[o] = this.blocks == null ? c.outputNode[o] : this.blocks.nodeSlot[c.outputNode[o]];
        }
        this.scratch = new double[Math.max(chunk, genericChunk)];
        this.mvn = new MvNormalWorkspace(c.maxInputDimension);
    }

    /** Whether this evaluator evaluates some dense blocks as matrix products (else it is generic throughout). */
    public boolean usesDenseBlocks() {
        return blocks != null;
    }

    /** The circuit this evaluator evaluates. */
    public CompiledCircuit circuit() {
        return circuit;
    }

    /**
     * Log-density of every output at every row, missing values marginalised.
     *
     * @param data input: {@code rows x variableCount()} cells, row-major, NaN = missing
     * @param rows input: number of rows
     * @param out output: {@code out[r * outputCount() + o]} = log value of output o at row r (-inf where 0)
     */
    public void logDensity(double[] data, int rows, double[] out) {
        checkBatch(data, rows, out, (long) rows * c.outputNode.length);
        logDensityRange(data, 0, rows, out);
    }

    /** {@link #logDensity} on rows {@code from .. to-1} only; arguments checked by the caller. */
    void logDensityRange(double[] data, int from, int to, double[] out) {
        for (int row0 = from; row0 < to; row0 += chunk) {
            int n = Math.min(chunk, to - row0);
            double[] v = run(data, row0, n, null);
            copyOutputs(v, row0, n, out);
        }
    }

    /**
     * Conditional log-density log p(observed cells not given | observed cells given) of every output,
     * computed in two passes as log p(all observed) - log p(observed given). Missing cells are
     * marginalised in both. NaN where the given cells have probability 0.
     *
     * @param data input: as {@link #logDensity}
     * @param rows input: number of rows
     * @param given input: per variable, whether its column is evidence ({@code variableCount()} entries)
     * @param out output: as {@link #logDensity}
     */
    public void conditional(double[] data, int rows, boolean[] given, double[] out) {
        checkConditional(data, rows, given, out);
        conditionalRange(data, 0, rows, given, out);
    }

    /** Throws when the arguments of {@link #conditional} do not fit the circuit. */
    void checkConditional(double[] data, int rows, boolean[] given, double[] out) {
        checkBatch(data, rows, out, (long) rows * c.outputNode.length);
        if (given.length != c.variableCount) {
            throw new IllegalArgumentException("given has " + given.length + " entries (expected "
                    + c.variableCount + ", one per variable)");
        }
    }

    /** {@link #conditional} on rows {@code from .. to-1} only; arguments checked by the caller. */
    void conditionalRange(double[] data, int from, int to, boolean[] given, double[] out) {
        int outs = c.outputNode.length;
        if (hide == null) {
            hide = new boolean[c.variableCount];
        }
        for (int v = 0; v < given.length; v++) {
            hide[v] = !given[v];
        }
        if (partial.length < chunk * outs) {
            partial = new double[chunk * outs];
        }
        for (int row0 = from; row0 < to; row0 += chunk) {
            int n = Math.min(chunk, to - row0);
            double[] v = run(data, row0, n, null);
            for (int r = 0; r < n; r++) {
                for (int o = 0; o < outs; o++) {
                    partial[r * outs + o] = v[outputRow[o] * n + r];
                }
            }
            v = run(data, row0, n, hide);
            for (int r = 0; r < n; r++) {
                for (int o = 0; o < outs; o++) {
                    double evidence = v[outputRow[o] * n + r];
                    out[(row0 + r) * outs + o] = evidence == Double.NEGATIVE_INFINITY ? Double.NaN
                            : partial[r * outs + o] - evidence;
                }
            }
        }
    }

    /**
     * Log-partition log Z of every output: its value with every variable missing. For a smooth,
     * decomposable circuit, 0 means normalised.
     *
     * @return a new array, one entry per output
     */
    public double[] logPartition() {
        double[] missing = new double[c.variableCount];
        Arrays.fill(missing, Double.NaN);
        double[] out = new double[c.outputNode.length];
        logDensity(missing, 1, out);
        return out;
    }

    /**
     * Most probable explanation by max-product and backtracking: each row's missing cells filled with the
     * values of the best assignment reached from {@code output}. For a smooth, decomposable and
     * deterministic circuit this is the exact MPE and {@code logValue} its log-density; for other circuits
     * it is an approximation (the caller states which). Variables outside the output's scope stay NaN. At a
     * sum the backtrack takes the first of its children with the largest weighted value, in the sum's order.
     *
     * @param data input: as {@link #logDensity}
     * @param rows input: number of rows
     * @param output input: the output's index
     * @param completed output: {@code rows x variableCount()} cells, {@code data} with missing cells filled
     * @param logValue output: per row, the max-product value of the output
     */
    public void mpe(double[] data, int rows, int output, double[] completed, double[] logValue) {
        checkMpe(data, rows, output, completed, logValue);
        mpeRange(data, 0, rows, output, completed, logValue);
    }

    /** The argument checks of {@link #mpe}. */
    void checkMpe(double[] data, int rows, int output, double[] completed, double[] logValue) {
        checkBatch(data, rows, completed, (long) rows * c.variableCount);
        if (logValue.length < rows) {
            throw new IllegalArgumentException("logValue has " + logValue.length + " entries (expected " + rows + ")");
        }
        if (output < 0 || output >= c.outputNode.length) {
            throw new IllegalArgumentException("no output " + output);
        }
    }

    /** {@link #mpe} of rows {@code from .. to-1} (arguments checked by the caller). */
    void mpeRange(double[] data, int from, int to, int output, double[] completed, double[] logValue) {
        int nv = c.variableCount;
        if (stack == null) {
            stack = new int[c.nodeCount];
            stamp = new int[c.nodeCount];
        }
        int root = c.outputNode[output];
        for (int row0 = from; row0 < to; row0 += genericChunk) {
            int n = Math.min(genericChunk, to - row0);
            double[] v = runMax(data, row0, n);
            for (int r = 0; r < n; r++) {
                logValue[row0 + r] = v[root * n + r];
                System.arraycopy(data, (row0 + r) * nv, completed, (row0 + r) * nv, nv);
                backtrack(n, r, root, completed, (row0 + r) * nv);
            }
        }
    }

    private void backtrack(int n, int r, int root, double[] completed, int rowBase) {
        int mark = nextGeneration();
        int top = 0;
        stack[top++] = root;
        stamp[root] = mark;
        while (top > 0) {
            int i = stack[--top];
            int s = c.childStart[i];
            int end = c.childStart[i + 1];
            if (c.kind[i] == CircuitData.PRODUCT) {
                for (int e = end - 1; e >= s; e--) {
                    int child = c.childIndex[e];
                    if (stamp[child] != mark) {
                        stamp[child] = mark;
                        stack[top++] = child;
                    }
                }
            } else if (c.kind[i] == CircuitData.SUM) {
                // the child the forward pass chose (ForwardKernel.run with a choice): no scan of the children here
                int best = c.childIndex[choice[i * n + r]];
                if (stamp[best] != mark) {
                    stamp[best] = mark;
                    stack[top++] = best;
                }
            } else {
                fillMode(c.inputSlot[i], completed, rowBase);
            }
        }
    }

    private void fillMode(int slot, double[] completed, int rowBase) {
        int code = c.family[slot];
        int off = c.paramStart[slot];
        int vs = c.varStart[slot];
        if (code == Families.MVNORMAL) {
            int d = c.varStart[slot + 1] - vs;
            for (int a = 0; a < d; a++) {
                mvn.value[a] = completed[rowBase + c.varIndex[vs + a]];
            }
            MvNormal.maxLogDensity(c.params, off, d, c.factor, c.factorStart[slot], mvn);
            for (int a = 0; a < d; a++) {
                completed[rowBase + c.varIndex[vs + a]] = mvn.value[a];
            }
            return;
        }
        int var = c.varIndex[vs];
        if (Double.isNaN(completed[rowBase + var])) {
            completed[rowBase + var] = Families.mode(code, c.params, off, c.paramStart[slot + 1] - off);
        }
    }

    private int nextGeneration() {
        if (++generation == Integer.MAX_VALUE) {
            Arrays.fill(stamp, 0);
            generation = 1;
        }
        return generation;
    }

    /** Max-product values of every node (node-major), fused products on the automatic path. */
    private double[] runMax(double[] data, int row0, int n) {
        growValue(n);
        if (choice.length < value.length) {
            choice = new int[value.length];
        }
        if (blocks == null) {
            ForwardKernel.run(c, data, row0, n, null, true, value, choice, scratch, mvn);
        } else {
            DenseKernel.runMax(c, blocks, data, row0, n, value, choice, scratch, mvn);
        }
        return value;
    }

    /** Sum-product values (of slots on the automatic path with dense blocks, else node-major) of a chunk. */
    private double[] run(double[] data, int row0, int n, boolean[] hidden) {
        if (blocks != null) {
            long need = (long) blocks.slotCount * n;
            if (denseValue.length < need) {
                denseValue = new double[(int) Math.min(Integer.MAX_VALUE - 8, (long) blocks.slotCount * chunk)];
            }
            if (dense == null) {
                dense = new DenseWorkspace(blocks, chunk);
            }
            DenseKernel.run(c, blocks, data, row0, n, hidden, denseValue, scratch, mvn, dense);
            return denseValue;
        }
        growValue(n);
        ForwardKernel.run(c, data, row0, n, hidden, false, value, scratch, mvn);
        return value;
    }

    /** Makes {@link #value} hold every node at {@code n} rows (sized once for the largest chunk). */
    private void growValue(int n) {
        if (value.length < (long) c.nodeCount * n) {
            value = new double[(int) Math.min(Integer.MAX_VALUE - 8, (long) c.nodeCount * genericChunk)];
        }
    }

    private void copyOutputs(double[] v, int row0, int n, double[] out) {
        int outs = c.outputNode.length;
        for (int r = 0; r < n; r++) {
            for (int o = 0; o < outs; o++) {
                out[(row0 + r) * outs + o] = v[outputRow[o] * n + r];
            }
        }
    }

    void checkBatch(double[] data, int rows, double[] out, long outNeeded) {
        if (rows < 0) {
            throw new IllegalArgumentException("rows = " + rows + " (expected >= 0)");
        }
        if (data.length < (long) rows * c.variableCount) {
            throw new IllegalArgumentException("data has " + data.length + " cells (expected at least "
                    + (long) rows * c.variableCount + " for " + rows + " rows)");
        }
        if (out.length < outNeeded) {
            throw new IllegalArgumentException("output has " + out.length + " entries (expected at least " + outNeeded + ")");
        }
    }
}
