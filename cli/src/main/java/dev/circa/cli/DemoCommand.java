package dev.circa.cli;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.converter.regions.RegionParameters;
import dev.circa.converter.regions.RegionStructure;
import dev.circa.converter.regions.RegionVerifier;
import dev.circa.converter.render.DotRenderer;
import dev.circa.converter.render.RenderOptions;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.regions.RegionGraphReader;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Parameters;

/** {@code circa demo}: the pump-station scenario end to end, writing its files to a folder. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs the pump-station scenario end to end: converts a hand-written regime mixture,",
            "compiles a region-graph model from bundled NumPy parameters, validates both, checks a reference",
            "set computed with NumPy and SciPy, catches a deliberately broken export, and renders the small",
            "model as Graphviz DOT. Writes every file to DIR (default: circa-demo)."})
final class DemoCommand implements Callable<Integer> {
    private static final String RESOURCES = "/dev/circa/cli/demo/";

    @Parameters(index = "0", arity = "0..1", paramLabel = "DIR", description = "Folder for the demo's files (created if needed).")
    Path dir = Path.of("circa-demo");

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    private PrintWriter out;
    private final List<String> written = new ArrayList<>();

    @Override
    public Integer call() throws Exception {
        out = spec.commandLine().getOut();
        Files.createDirectories(dir);
        ReadLimits limits = ReadLimits.DEFAULT;
        say("circa demo: the pump-station scenario, files in " + dir.toAbsolutePath().normalize());
        say("");
        say("1. The regime mixture an engineer wrote by hand (normal operation, cavitation, worn valve),");
        say("   converted into a circuit and proved equal to the mixture at sampled points.");
        Path yaml = extract("mixtures/pump-station-regimes.yaml", "pump-station-regimes.yaml");
        MixtureConverter.Result mix = MixtureConverter.convert(MixtureReader.read(yaml, limits), MixtureOptions.DEFAULT);
        indent(mix.summary());
        Path regimes = dir.resolve("regimes.circuit.json");
        write(mix.circuit(), regimes, "the converted regime mixture");

        say("");
        say("2. A model trained elsewhere from a region graph; its parameters came from NumPy (example-params.npz).");
        Path rg = extract("npz/example-regions.json", "station-regions.json");
        Path npz = extract("npz/example-params.npz", "station-params.npz");
        RegionStructure structure = RegionStructure.of(new RegionGraphReader(limits).read(rg));
        CompileOptions options = new CompileOptions(3, 2, 1, CompileOptions.defaults().families());
        RegionParameters params = RegionParameters.fromArchive(structure, options, NpzArchive.read(npz, limits.maxBytes()));
        CircuitDocument stations = RegionCompiler.compile(params);
        CompiledCircuit stationsCompiled = CompiledCircuit.compile(stations);
        RegionVerifier.Result v = RegionVerifier.verify(params, stationsCompiled, 500, 0, 1e-9, 1e-9);
        indent("compiled with 3 sums per region, 2 input bundles per leaf region: " + stations.nodes().size()
                + " nodes, " + stations.edgeCount() + " edges\n" + v.summary());
        Path stationsFile = dir.resolve("stations.circuit.json");
        write(stations, stationsFile, "the compiled region-graph model");

        say("");
        say("3. Both files through the validator (schema, references, scopes, parameters, normalisation).");
        Validator validator = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
        boolean ok = true;
        for (Path f : List.of(regimes, stationsFile)) {
            ValidationReport r = validator.validate(f, limits);
            ok &= r.valid();
            indent(f.getFileName() + ": " + (r.valid() ? "valid" : "INVALID") + ", smooth " + r.property(
                    dev.circa.validator.Property.SMOOTH).toString().toLowerCase(java.util.Locale.ROOT)
                    + ", decomposable " + r.property(dev.circa.validator.Property.DECOMPOSABLE).toString()
                            .toLowerCase(java.util.Locale.ROOT)
                    + ", log Z " + r.logPartition() + ", exact marginals " + r.exactQueries().marginal());
        }

        say("");
        say("4. The region-graph model against reference log-densities its training code computed");
        say("   (NumPy 1.24 and SciPy 1.10, including rows with missing values).");
        Path ref = extract("npz/example-reference.csv", "station-reference.csv");
        RegressionCheck check = new RegressionCheck(stationsCompiled, Tolerance.DEFAULT);
        check.checkReference(ref, limits);
        CheckReport cr = check.report();
        indent(cr.toText());
        ok &= cr.passed();

        say("");
        say("5. A deliberately broken export of the regime model: one product given a variable twice and one");
        say("   sum's weights scaled by 1.25. The validator must catch both.");
        Path broken = dir.resolve("broken-export.circuit.json");
        write(breakExport(mix.circuit()), broken, "the broken export");
        ValidationReport br = validator.validate(broken, limits);
        int caught = 0;
        for (Diagnostic d : br.diagnostics()) {
            if (d.severity() == Severity.ERROR || d.severity() == Severity.WARNING) {
                indent(d.render());
                caught++;
            }
        }
        indent("verdict: " + (br.valid() ? "valid (unexpected!)" : "INVALID, as it should be") + " (" + caught
                + " diagnostics)");
        ok &= !br.valid();

        say("");
        say("6. A picture of the small model (Graphviz DOT; draw it with: dot -Tsvg regimes.dot -o regimes.svg).");
        Path dot = dir.resolve("regimes.dot");
        String text = DotRenderer.render(CompiledCircuit.compile(mix.circuit()), new RenderOptions(true,
                RenderOptions.DEFAULT_MAX_NODES));
        AtomicOutput.write(dot, s -> s.write(text.getBytes(StandardCharsets.UTF_8)));
        written.add(dot + "  (the regime model as a DOT graph, with scopes)");

        say("");
        say("Files written:");
        for (String w : written) {
            say("  " + w);
        }
        say("");
        say(ok ? "Every step behaved as expected. Remember: a valid file is not a good model; circa proves structure"
                + " and numbers, not fitness for a decision."
                : "Some step did not behave as expected; see above.");
        out.flush();
        return ok ? ExitStatus.OK : ExitStatus.FAILED;
    }

    /** A copy of {@code circuit} with one product's first child repeated and one sum's weights scaled. */
    private static CircuitDocument breakExport(CircuitDocument circuit) {
        List<Node> nodes = new ArrayList<>(circuit.nodes());
        boolean productBroken = false;
        boolean sumBroken = false;
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            if (!productBroken && n instanceof ProductNode p && p.children().length >= 2) {
                int[] c = java.util.Arrays.copyOf(p.children(), p.children().length + 1);
                c[c.length - 1] = c[0];
                nodes.set(i, new ProductNode(p.id(), p.label(), c));
                productBroken = true;
            } else if (!sumBroken && n instanceof SumNode s && !s.logWeights()) {
                double[] w = s.weights().clone();
                for (int j = 0; j < w.length; j++) {
                    w[j] *= 1.25;
                }
                nodes.set(i, new SumNode(s.id(), s.label(), s.children(), w, false));
                sumBroken = true;
            }
        }
        return CircuitDocument.builder().name("pump-station-regimes (broken export)")
                .provenance(circuit.provenance()).variables(circuit.variables()).nodes(nodes)
                .outputs(circuit.outputs()).build();
    }

    private Path extract(String resource, String name) throws Exception {
        Path target = dir.resolve(name);
        try (InputStream in = DemoCommand.class.getResourceAsStream(RESOURCES + resource)) {
            if (in == null) {
                throw new UsageException("the demo's bundled file " + resource + " is missing from the jar");
            }
            byte[] bytes = in.readAllBytes();
            AtomicOutput.write(target, s -> s.write(bytes));
        }
        written.add(target + "  (bundled input)");
        return target;
    }

    private void write(CircuitDocument doc, Path target, String what) throws Exception {
        new CircuitWriter().write(doc, target);
        written.add(target + "  (" + what + ")");
        indent("wrote " + target);
    }

    private void say(String s) {
        out.println(s);
    }

    private void indent(String text) {
        for (String line : text.split("\n")) {
            if (!line.isBlank()) {
                out.println("   " + line);
            }
        }
    }
}
