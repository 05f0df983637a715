package dev.circa.converter.regions;

import dev.circa.converter.npz.NpzArchive;
import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.regions.RegionGraph;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.util.Locale;

/**
 * Converts a region graph into a circuit and proves the two equal, the twin of the mixture
 * converter: one call from a region graph, {@link CompileOptions} and a {@link ParameterSource} to a
 * compiled, verified and validated {@link Result} whose provenance names the seed or the parameter
 * file. Before allocating anything it refuses a circuit over {@code --max-nodes} or one that cannot fit
 * in this JVM's heap (a small region graph can describe a huge circuit). Disagreement with the source
 * and validation errors are not exceptions: they are in the result. Stateless.
 */
public final class RegionConverter {
    /** Heap per node while converting (document, compiled arrays, verification): 376 MiB peak was measured for 514,057 nodes. */
    private static final double BYTES_PER_NODE = 700;

    private RegionConverter() {
    }

    /**
     * How a conversion is verified.
     *
     * @param points points sampled from the source (then each with random variables missing)
     * @param seed the seed of the sampled points
     * @param atol absolute tolerance
     * @param rtol relative tolerance
     */
    public record Verification(int points, long seed, double atol, double rtol) {
        /** Checks the numbers. */
        public Verification {
            if (points < 0) {
                throw new IllegalArgumentException("--verify must be >= 0, got " + points);
            }
        }
    }

    /**
     * A conversion.
     *
     * @param circuit the circuit, with its provenance
     * @param parameters the parameters it was compiled with
     * @param compiled the circuit compiled by the engine
     * @param verification its comparison with a direct region-by-region evaluation
     * @param tolerance the verification's settings
     * @param validation the validator's report on the circuit
     * @param nanos the time of each phase: compile, engine compile and verify, validate
     */
    public record Result(CircuitDocument circuit, RegionParameters parameters, CompiledCircuit compiled,
            RegionVerifier.Result verification, Verification tolerance, ValidationReport validation, long[] nanos) {
        /** Whether the circuit agrees with the source and validates. */
        public boolean passed() {
            return verification.passed() && validation.valid();
        }

        /** Sizes and the verification verdict, for people (two lines). */
        public String summary() {
            int outputs = circuit.outputs().size();
            return String.format(Locale.ROOT, "converted %s: %d variables, %d nodes, %d edges, %d output%s%n",
                    name(parameters.structure().graph()), circuit.variables().size(), circuit.nodes().size(),
                    circuit.edgeCount(), outputs, outputs == 1 ? "" : "s")
                    + verification.summary() + String.format(Locale.ROOT, " (the engine against a direct "
                    + "region-by-region tensor evaluation, atol %.3g, rtol %.3g)", tolerance.atol(), tolerance.rtol());
        }
    }

    /**
     * Compiles {@code graph} with the parameters of {@code params}, then verifies and validates the circuit.
     *
     * @throws FormatException when the graph is not a valid region graph, the circuit would exceed
     *     {@code limits.maxNodes()} or the heap, or the parameters cannot be read; located in the file at fault
     */
    public static Result convert(RegionGraph graph, CompileOptions options, ParameterSource params,
            Verification verify, ReadLimits limits) throws FormatException {
        RegionStructure structure = RegionStructure.of(graph);
        long nodes = RegionCompiler.nodeCount(structure, options);
        if (nodes > limits.maxNodes()) {
            throw LimitExceededException.of(name(graph), 0, 0, null, "the compiled circuit would have "
                    + (nodes == Long.MAX_VALUE ? "more than 9.2e18" : Long.toString(nodes)) + " nodes, which",
                    ReadLimits.MAX_NODES, limits.maxNodes());
        }
        refuseOversized(name(graph), nodes, RegionCompiler.productEdgeCount(structure, options));
        RegionParameters p = params.load(structure, options, limits.maxBytes());
        long t0 = System.nanoTime();
        CircuitDocument circuit = RegionCompiler.compile(p, RegionCompiler.provenance(graph, options, params.describe()));
        long t1 = System.nanoTime();
        CompiledCircuit compiled;
        try {
            compiled = CompiledCircuit.compile(circuit);
        } catch (CompileException e) {
            throw new FormatException(name(graph), 0, 0, null, "the compiled circuit is broken: " + e.getMessage());
        }
        RegionVerifier.Result v = RegionVerifier.verify(p, compiled, verify.points(), verify.seed(), verify.atol(),
                verify.rtol());
        long t2 = System.nanoTime();
        ValidationReport report = new Validator(ValidationOptions.defaults()).validate(circuit);
        long t3 = System.nanoTime();
        return new Result(circuit, p, compiled, v, verify, report, new long[] {t1 - t0, t2 - t1, t3 - t2});
    }

    /**
     * The parameters of {@code circuit}, compiled from {@code graph}, as an archive in the layout of
     * FORMAT.md section 3 ({@link RegionCompiler#exportParameters}).
     *
     * @throws FormatException when the graph is not valid or the circuit is not laid out as compiling it gives
     */
    public static NpzArchive exportParameters(CircuitDocument circuit, RegionGraph graph) throws FormatException {
        return RegionCompiler.exportParameters(circuit, graph);
    }

    private static String name(RegionGraph graph) {
        return graph.source() == null ? "the region graph" : graph.source();
    }

    /** Refuses a circuit that cannot fit in this JVM's heap, so that the user gets a message instead of running out of memory. */
    private static void refuseOversized(String file, long nodes, long productEdges) throws FormatException {
        double needed = BYTES_PER_NODE * (double) nodes + 4.0 * productEdges;
        long heap = Runtime.getRuntime().maxMemory();
        if (needed > 0.8 * heap) {
            throw new FormatException(file, 0, 0, null, String.format(Locale.ROOT,
                    "the compiled circuit would have %d nodes and %d product edges, about %.1f GB in memory, more than"
                            + " the %.1f GB Java heap allows; use fewer sums, inputs or parts, or raise the heap with"
                            + " CIRCA_JAVA_OPTS=-Xmx...", nodes, productEdges, needed / 1e9, heap / 1e9));
        }
    }
}
