package dev.circa.engine;

import dev.circa.engine.family.Families;
import dev.circa.engine.internal.CircuitCompiler;
import dev.circa.engine.internal.CircuitData;
import dev.circa.engine.internal.DenseBlockFinder;
import dev.circa.engine.internal.DenseBlocks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.Variable;
import java.util.Arrays;
import java.util.List;

/**
 * A circuit compiled into flat arrays for evaluation. Nodes keep the document's order, which is children
 * first, and are addressed by their index 0..{@link #nodeCount()}-1 (not their id). Child lists are in
 * compressed sparse row form: the children of node i are {@code childIndex()[childStart()[i] ..
 * childStart()[i+1]-1]}, node indices, with one log-weight per edge in {@link #logWeight()} (sum edges;
 * 0 on product edges). Weights given in linear form are stored as their logarithm. A multivariate
 * normal input's covariance is factorised once here.
 *
 * <p>Immutable and thread-safe: any number of {@link Evaluator}s and {@link Sampler}s may share one.
 * Arrays returned by accessors named after a role ({@code childStart}, {@code childIndex},
 * {@code logWeight}) are the circuit's own and must not be modified.
 */
public final class CompiledCircuit {
    private final CircuitData data;
    private final List<Variable> variables;
    private volatile DenseBlocks denseBlocks;
    private volatile DenseBlocks everyCandidateBlocks;

    private CompiledCircuit(CircuitData data, List<Variable> variables) {
        this.data = data;
        this.variables = variables;
    }

    /**
     * Compiles {@code doc}.
     *
     * @throws CompileException when a child id is dangling or not earlier, an id repeats, a variable index
     *     is out of range, a family does not fit its variable's type, a sum's weight count differs from
     *     its child count, a parameter count or value is impossible (e.g. sd {@literal <=} 0, a covariance that is not
     *     positive definite, mvnormal variables that are not distinct), or an output names no node
     */
    public static CompiledCircuit compile(CircuitDocument doc) throws CompileException {
        return new CompiledCircuit(CircuitCompiler.compile(doc), List.copyOf(doc.variables()));
    }

    CircuitData data() {
        return data;
    }

    /** The dense blocks the automatic evaluators use, found on first request and cached. */
    DenseBlocks denseBlocks() {
        DenseBlocks d = denseBlocks;
        if (d == null) {
            synchronized (this) {
                d = denseBlocks;
                if (d == null) {
                    d = DenseBlockFinder.find(data, false);
                    denseBlocks = d;
                }
            }
        }
        return d;
    }

    /** Every candidate group as a block, whatever it saves: for tests of the dense kernel. */
    DenseBlocks everyCandidateBlocks() {
        DenseBlocks d = everyCandidateBlocks;
        if (d == null) {
            synchronized (this) {
                d = everyCandidateBlocks;
                if (d == null) {
                    d = DenseBlockFinder.find(data, true);
                    everyCandidateBlocks = d;
                }
            }
        }
        return d;
    }

    /**
     * What the automatic evaluation path found in this circuit's structure: groups of sums over one
     * common list of products that are cross products of node groups (the dense blocks of region-graph
     * circuits), evaluated as matrix products. The analysis runs once, on first use by this method or by
     * an {@link Evaluator}, and is cached; safe to call from any thread. It takes one pass over the edges
     * (about 0.1 s at 10^6 edges) and keeps about 12 bytes per edge (the blocks' linear weights and a slot
     * table).
     */
    public DenseBlockSummary denseBlockSummary() {
        DenseBlocks d = denseBlocks();
        return new DenseBlockSummary(d.blockCount(), d.sumCount(), d.blockEdges);
    }

    /** The document's variables; index = column of a data row. */
    public List<Variable> variables() {
        return variables;
    }

    /** Number of variables (cells per data row). */
    public int variableCount() {
        return data.variableCount;
    }

    /** Number of nodes. */
    public int nodeCount() {
        return data.nodeCount;
    }

    /** Number of child references (duplicates counted). */
    public int edgeCount() {
        return data.childIndex.length;
    }

    /** Number of outputs. */
    public int outputCount() {
        return data.outputNode.length;
    }

    /** The name of output {@code o}. */
    public String outputName(int o) {
        return data.outputName[o];
    }

    /** The index of the output named {@code name} (the first one when repeated), or -1. */
    public int outputIndex(String name) {
        for (int o = 0; o < data.outputName.length; o++) {
            if (data.outputName[o].equals(name)) {
                return o;
            }
        }
        return -1;
    }

    /** The node index of output {@code o}. */
    public int outputNode(int o) {
        return data.outputNode[o];
    }

    /** The document id of node {@code i}. */
    public int nodeId(int i) {
        return data.nodeId[i];
    }

    /** The index of the node with document id {@code id}, or -1. */
    public int nodeIndexOfId(int id) {
        return data.indexOf(id);
    }

    /** The kind of node {@code i}. */
    public NodeKind kind(int i) {
        return switch (data.kind[i]) {
            case CircuitData.INPUT -> NodeKind.INPUT;
            case CircuitData.PRODUCT -> NodeKind.PRODUCT;
            default -> NodeKind.SUM;
        };
    }

    /** CSR offsets, length {@code nodeCount() + 1}; read-only. */
    public int[] childStart() {
        return data.childStart;
    }

    /** Child node indices per edge; read-only. */
    public int[] childIndex() {
        return data.childIndex;
    }

    /** Log-weight per edge (0 on product edges); read-only. */
    public double[] logWeight() {
        return data.logWeight;
    }

    /** The family of input node {@code i}. */
    public Family inputFamily(int i) {
        return Families.family(data.family[slot(i)]);
    }

    /** Whether input node {@code i} is a categorical given by log-probabilities. */
    public boolean inputLogForm(int i) {
        return data.family[slot(i)] == Families.CATEGORICAL_LOG;
    }

    /** A copy of the variable indices of input node {@code i}. */
    public int[] inputVars(int i) {
        int s = slot(i);
        return Arrays.copyOfRange(data.varIndex, data.varStart[s], data.varStart[s + 1]);
    }

    /** A copy of the parameters of input node {@code i}, in the layout of {@link dev.circa.format.InputNode#params()}. */
    public double[] inputParams(int i) {
        int s = slot(i);
        return Arrays.copyOfRange(data.params, data.paramStart[s], data.paramStart[s + 1]);
    }

    private int slot(int i) {
        int s = data.inputSlot[i];
        if (s < 0) {
            throw new IllegalArgumentException("node " + data.nodeId[i] + " (index " + i + ") is not an input");
        }
        return s;
    }
}
