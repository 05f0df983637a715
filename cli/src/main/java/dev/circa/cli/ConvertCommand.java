package dev.circa.cli;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.ParameterSource;
import dev.circa.converter.regions.RegionConverter;
import dev.circa.format.io.DocumentKind;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphReader;
import dev.circa.validator.ValidationOptions;
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
            "parameters back in the layout of docs/region-graph.md."})
final class ConvertCommand implements Callable<Integer> {
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
            return ParameterExport.run(source, regions, toParams, read);
        }
        if (output == null) {
            throw new UsageException("missing -o OUT: the circuit to write");
        }
        DocumentKind kind = DocumentKind.detect(source, limits);
        ConvertedOutput out = new ConvertedOutput(output, err, source, params, regions);
        return switch (kind) {
            case MIXTURE -> convertMixture(limits, out, err);
            case REGIONS -> convertRegions(limits, out, err);
            case CIRCUIT -> throw new UsageException(source + " is already a circuit; convert takes a region graph or a "
                    + "mixture document (or use --to-params with --regions to export a compiled circuit's parameters)");
        };
    }

    private int convertMixture(ReadLimits limits, ConvertedOutput out, PrintWriter err) throws Exception {
        if (params != null) {
            throw new UsageException("--params applies to region graphs; " + source + " is a mixture document");
        }
        MixtureOptions options = MixtureOptions.DEFAULT.withNormalizeWeights(normalizeWeights)
                .withVerifyPoints(verify).withTolerances(atol, rtol).withSeed(seed);
        MixtureConverter.Result result;
        try (Progress progress = Progress.start(err, "circa convert: converting and verifying " + source)) {
            result = MixtureConverter.convert(MixtureReader.read(source, limits), options);
        }
        err.print(result.summary());
        err.println();
        return out.finish(result.circuit(), result.verification().passed(),
                new Validator(ValidationOptions.defaults()).validate(result.circuit()));
    }

    private int convertRegions(ReadLimits limits, ConvertedOutput out, PrintWriter err) throws Exception {
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
        RegionConverter.Result r;
        try (Progress progress = Progress.start(err, "circa convert: compiling and verifying " + source)) {
            r = RegionConverter.convert(graph, options, params == null ? ParameterSource.seed(seed) : ParameterSource.file(params),
                    new RegionConverter.Verification(verify, seed, atol, rtol), limits);
        }
        err.println(r.summary());
        return out.finish(r.circuit(), r.verification().passed(), r.validation());
    }
}
