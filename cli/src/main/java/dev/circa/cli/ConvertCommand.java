package dev.circa.cli;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.converter.regions.RegionParameters;
import dev.circa.converter.regions.RegionStructure;
import dev.circa.converter.regions.RegionVerifier;
import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.DocumentKind;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphReader;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa convert}: a region graph or a mixture document into a circuit, verified numerically. */
@Command(name = "convert", mixinStandardHelpOptions = true,
        description = {"Converts a region graph (with --params FILE.npz or --seed) or a mixture document (JSON",
            "or YAML) into a circuit, then proves the two equal: the circuit, evaluated by the engine, is",
            "compared with an independent evaluation of the source at --verify N points sampled from the",
            "source and at the same points with random variables missing. Exit 1 when they disagree beyond",
            "--atol/--rtol (the circuit is then not written). With --to-params, writes a compiled circuit's",
            "parameters back in the layout of FORMAT.md section 3."})
final class ConvertCommand implements Callable<Integer> {
    /** Heap per node while converting (document, compiled arrays, verification): 376 MiB peak was measured for 514,057 nodes. */
    private static final double BYTES_PER_NODE = 700;

    @Parameters(index = "0", paramLabel = "SOURCE", description = "Region graph, mixture document, or (with --to-params) a compiled circuit.")
    Path source;

    @Option(names = {"-o", "--output"}, paramLabel = "OUT", description = "The circuit to write (.json or .json.gz).")
    Path output;

    @Option(names = "--sums", paramLabel = "K", description = "Sums per inner region (default: ${DEFAULT-VALUE}).")
    int sums = 4;

    @Option(names = "--inputs", paramLabel = "I", description = "Input bundles per leaf region (default: ${DEFAULT-VALUE}).")
    int inputs = 4;

    @Option(names = "--outputs", paramLabel = "C", description = "Outputs at the root (default: ${DEFAULT-VALUE}).")
    int outputs = 1;

    @Option(names = "--family", paramLabel = "TYPE=FAMILY",
            description = "Input family per variable type, repeatable (defaults real=normal, binary=bernoulli, "
                    + "categorical=categorical, count=poisson).")
    List<String> families = new ArrayList<>();

    @Option(names = "--seed", paramLabel = "S", description = "Seed of the parameters of a region graph and of the verification points (default: ${DEFAULT-VALUE}).")
    long seed = 0;

    @Option(names = "--params", paramLabel = "FILE.npz", description = "Parameters of a region graph from a NumPy archive.")
    Path params;

    @Option(names = "--normalize-weights", description = "Rescale mixture weights that do not add to 1 (otherwise an error).")
    boolean normalizeWeights;

    @Option(names = "--verify", paramLabel = "N", description = "Points sampled from the source for verification (default: ${DEFAULT-VALUE}).")
    int verify = 1000;

    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance of the verification (default: ${DEFAULT-VALUE}).")
    double atol = 1e-9;

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance of the verification (default: ${DEFAULT-VALUE}).")
    double rtol = 1e-9;

    @Option(names = "--to-params", paramLabel = "OUT.npz", description = "Export a compiled circuit's parameters (needs --regions).")
    Path toParams;

    @Option(names = "--regions", paramLabel = "RG.json", description = "The region graph a circuit was compiled from (with --to-params).")
    Path regions;

    @Mixin
    ReadOptions read;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = spec.commandLine().getErr();
        ReadLimits limits = read.limits();
        if (verify < 0) {
            throw new UsageException("--verify must be >= 0, got " + verify);
        }
        if (toParams != null) {
            return exportParams(limits, err);
        }
        if (output == null) {
            throw new UsageException("missing -o OUT: the circuit to write");
        }
        DocumentKind kind = DocumentKind.detect(source, limits);
        return switch (kind) {
            case MIXTURE -> convertMixture(limits, err);
            case REGIONS -> convertRegions(limits, err);
            case CIRCUIT -> throw new UsageException(source + " is already a circuit; convert takes a region graph or a "
                    + "mixture document (or use --to-params with --regions to export a compiled circuit's parameters)");
        };
    }

    private int convertMixture(ReadLimits limits, PrintWriter err) throws Exception {
        if (params != null) {
            throw new UsageException("--params applies to region graphs; " + source + " is a mixture document");
        }
        MixtureOptions options = MixtureOptions.DEFAULT.withNormalizeWeights(normalizeWeights)
                .withVerifyPoints(verify).withTolerances(atol, rtol).withSeed(seed);
        MixtureConverter.Result result = MixtureConverter.convert(MixtureReader.read(source, limits), options);
        err.print(result.summary());
        err.println();
        return finish(result.circuit(), result.verification().passed(), err);
    }

    private int convertRegions(ReadLimits limits, PrintWriter err) throws Exception {
        RegionGraph graph = new RegionGraphReader(limits).read(source);
        CompileOptions options;
        try {
            options = new CompileOptions(sums, inputs, outputs, CompileOptions.defaults().families());
            for (String f : families) {
                options = options.withFamilyOption(f);
            }
        } catch (IllegalArgumentException e) {
            throw new UsageException(e.getMessage());
        }
        RegionStructure structure = RegionStructure.of(graph);
        long nodes = RegionCompiler.nodeCount(structure, options);
        if (nodes > limits.maxNodes()) {
            throw LimitExceededException.of(source.toString(), 0, 0, null, "the compiled circuit would have "
                    + (nodes == Long.MAX_VALUE ? "more than 9.2e18" : Long.toString(nodes)) + " nodes, which",
                    ReadLimits.MAX_NODES, limits.maxNodes());
        }
        refuseOversized(nodes, RegionCompiler.productEdgeCount(structure, options));
        RegionParameters p = params == null ? RegionParameters.seeded(structure, options, seed)
                : RegionParameters.fromArchive(structure, options, NpzArchive.read(params, limits.maxBytes()));
        CircuitDocument circuit = RegionCompiler.compile(p);
        CompiledCircuit compiled = compile(circuit);
        RegionVerifier.Result v = RegionVerifier.verify(p, compiled, verify, seed, atol, rtol);
        err.printf("converted %s: %d variables, %d nodes, %d edges, %d output%s%n", source, circuit.variables().size(),
                circuit.nodes().size(), circuit.edgeCount(), outputs, outputs == 1 ? "" : "s");
        err.println(v.summary() + String.format(java.util.Locale.ROOT,
                " (the engine against a direct region-by-region tensor evaluation, atol %.3g, rtol %.3g)", atol, rtol));
        return finish(circuit, v.passed(), err);
    }

    /**
     * Refuses, before allocating anything, a circuit that cannot fit in this JVM's heap (a small region
     * graph can describe a huge circuit), so that the user gets a message instead of running out of memory.
     */
    private void refuseOversized(long nodes, long productEdges) throws FormatException {
        double needed = BYTES_PER_NODE * (double) nodes + 4.0 * productEdges;
        long heap = Runtime.getRuntime().maxMemory();
        if (needed > 0.8 * heap) {
            throw new FormatException(source.toString(), 0, 0, null, String.format(java.util.Locale.ROOT,
                    "the compiled circuit would have %d nodes and %d product edges, about %.1f GB in memory, more than"
                            + " the %.1f GB Java heap allows; use fewer sums, inputs or parts, or raise the heap with"
                            + " CIRCA_JAVA_OPTS=-Xmx...", nodes, productEdges, needed / 1e9, heap / 1e9));
        }
    }

    private int finish(CircuitDocument circuit, boolean verified, PrintWriter err) throws Exception {
        ValidationReport report = new Validator(ValidationOptions.defaults()).validate(circuit);
        for (Diagnostic d : report.diagnostics()) {
            if (d.severity() == Severity.ERROR || d.severity() == Severity.WARNING) {
                err.println("circa convert: " + d.render());
            }
        }
        if (!verified) {
            err.println("circa convert: " + output + " not written: the circuit and the source disagree beyond tolerance");
            return ExitStatus.FAILED;
        }
        if (!report.valid()) {
            err.println("circa convert: " + output + " not written: the converted circuit does not validate");
            return ExitStatus.FAILED;
        }
        new CircuitWriter().write(circuit, output, inputsOf());
        err.println("wrote " + output);
        return ExitStatus.OK;
    }

    private Path[] inputsOf() {
        List<Path> in = new ArrayList<>();
        in.add(source);
        if (params != null) {
            in.add(params);
        }
        if (regions != null) {
            in.add(regions);
        }
        return in.toArray(new Path[0]);
    }

    private int exportParams(ReadLimits limits, PrintWriter err) throws Exception {
        if (regions == null) {
            throw new UsageException("--to-params needs --regions RG.json, the region graph the circuit was compiled from");
        }
        CircuitDocument circuit = new CircuitReader(limits).read(source);
        RegionGraph graph = new RegionGraphReader(limits).read(regions);
        NpzArchive archive = RegionCompiler.exportParameters(circuit, graph);
        archive.write(toParams, false, source, regions);
        err.println("wrote " + archive.size() + " arrays to " + toParams);
        return ExitStatus.OK;
    }

    private CompiledCircuit compile(CircuitDocument circuit) throws FormatException {
        try {
            return CompiledCircuit.compile(circuit);
        } catch (CompileException e) {
            throw new FormatException(source.toString(), 0, 0, null, "the compiled circuit is broken: " + e.getMessage());
        }
    }
}
