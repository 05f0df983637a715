package dev.circa.converter.regions;

import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.Provenance;
import dev.circa.format.io.FormatException;
import dev.circa.format.regions.RegionGraph;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;

/**
 * Compiles a region graph into a circuit exactly as FORMAT.md section 3 says: I input bundles per
 * leaf region, one product per combination of one node from each part of each partition (first
 * part varying slowest), K sums per inner region over all products of all its partitions in
 * document order, C sums at the root named {@code joint} (C = 1) or {@code out0} ... The circuit's
 * node ids are 0 ... n-1, children first (the order of the region graph's depth-first post-order).
 * The result is smooth and decomposable by construction.
 *
 * <p>Memory: the nodes of the circuit and, per region, the ids its parents need; the sums of a
 * region share one child array and use the parameter arrays without copying. Stateless.
 */
public final class RegionCompiler {
    private RegionCompiler() {
    }

    /** Compiles {@code graph} with parameters drawn from {@code seed} ({@link RegionParameters#seeded}). */
    public static CircuitDocument compile(RegionGraph graph, CompileOptions options, long seed) throws FormatException {
        return compile(graph, options, ParameterSource.seed(seed));
    }

    /** Compiles {@code graph} with parameters from a NumPy archive ({@link RegionParameters#fromArchive}). */
    public static CircuitDocument compile(RegionGraph graph, CompileOptions options, NpzArchive params)
            throws FormatException {
        return compile(graph, options, ParameterSource.archive(params));
    }

    private static CircuitDocument compile(RegionGraph graph, CompileOptions options, ParameterSource params)
            throws FormatException {
        RegionParameters p = params.load(RegionStructure.of(graph), options, Long.MAX_VALUE);
        return compile(p, provenance(graph, options, params.describe()));
    }

    /** Compiles with the given parameters; the provenance says what was compiled. */
    public static CircuitDocument compile(RegionParameters params) {
        RegionGraph g = params.structure().graph();
        return compile(params, provenance(g, params.options(), "given parameters"));
    }

    /**
     * Compiles with the given parameters.
     *
     * @param provenance the circuit's provenance, or {@code null} for none
     */
    public static CircuitDocument compile(RegionParameters params, Provenance provenance) {
        RegionStructure s = params.structure();
        int nv = s.variables().size();
        Family[] family = new Family[nv];
        for (int v = 0; v < nv; v++) {
            family[v] = params.family(v);
        }
        // straight into the node columns: no record per node
        NodeTable.Builder nodes = new NodeTable.Builder();
        Layout.Visitor visitor = new Layout.Visitor() {
            @Override
            public void input(int position, int region, int bundle, int varPos) {
                int var = s.vars(region)[varPos];
                nodes.appendVar(var);
                for (double x : params.inputParams(region, bundle, varPos)) {
                    nodes.appendValue(x);
                }
                nodes.close(NodeTable.INPUT, position, null, family[var], false);
            }

            @Override
            public void product(int position, int region, int[] children) {
                for (int c : children) {
                    nodes.appendChild(c);
                }
                nodes.close(NodeTable.PRODUCT, position, null, null, false);
            }

            @Override
            public void sum(int position, int region, int k, int[] children) {
                for (int c : children) {
                    nodes.appendChild(c);
                }
                for (double w : params.weights(region, k)) {
                    nodes.appendValue(w);
                }
                nodes.close(NodeTable.SUM, position, null, null, params.logWeights(region));
            }
        };
        int[] roots;
        try {
            roots = params.layout().walk(visitor);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        List<Output> outputs = new ArrayList<>(roots.length);
        for (int k = 0; k < roots.length; k++) {
            outputs.add(new Output(outputName(k, roots.length), roots[k]));
        }
        RegionGraph g = s.graph();
        return CircuitDocument.builder().name(g.name()).description(g.description()).provenance(provenance)
                .variables(s.variables()).nodeTable(nodes.build()).outputs(outputs).build();
    }

    /**
     * The number of nodes the circuit compiled from {@code s} under {@code options} has, computed
     * without compiling (saturating at {@link Long#MAX_VALUE}); callers compare it with
     * {@code --max-nodes} before compiling, since a small region graph can describe a circuit too
     * large for memory.
     */
    public static long nodeCount(RegionStructure s, CompileOptions options) {
        return Layout.nodeCount(s, options);
    }

    /**
     * The number of child references of the products compiling {@code s} under {@code options} would
     * emit, counted without building anything (saturating at {@link Long#MAX_VALUE}).
     */
    public static long productEdgeCount(RegionStructure s, CompileOptions options) {
        return Layout.productEdgeCount(s, options);
    }

    /** The name of output {@code k} of {@code count}: {@code joint} when there is one, else {@code out<k>}. */
    public static String outputName(int k, int count) {
        return count == 1 ? "joint" : "out" + k;
    }

    /**
     * The parameters of {@code circuit}, compiled from {@code graph}, as an archive in the layout of
     * FORMAT.md section 3 (see {@link RegionParameters#toArchive()}): compiling {@code graph} with
     * the result and the same K, I, C and families gives the same circuit, bit for bit.
     *
     * @throws FormatException when the graph is not valid or the circuit is not laid out as compiling it gives
     */
    public static NpzArchive exportParameters(CircuitDocument circuit, RegionGraph graph) throws FormatException {
        return RegionParameters.fromCircuit(RegionStructure.of(graph), circuit).toArchive();
    }

    /** The provenance of a circuit compiled from {@code g} with {@code o} and parameters described by {@code params}. */
    static Provenance provenance(RegionGraph g, CompileOptions o, String params) {
        StringBuilder sb = new StringBuilder("compiled from the region graph");
        if (g.source() != null) {
            sb.append(' ').append(g.source());
        }
        sb.append(" with ").append(o.sums()).append(" sums per inner region, ").append(o.inputs())
                .append(" input bundles per leaf region, ").append(o.outputs()).append(" output")
                .append(o.outputs() == 1 ? "" : "s").append(", ").append(params);
        return new Provenance(null, null, sb.toString());
    }
}
