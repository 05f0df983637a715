package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.ParameterSource;
import dev.circa.converter.regions.RegionConverter;
import dev.circa.converter.render.DotRenderer;
import dev.circa.converter.render.RenderOptions;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.regions.RegionGraphReader;
import dev.circa.report.ReportOptions;
import dev.circa.report.ReportSource;
import dev.circa.report.VariablePairs;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Parameters;

/** {@code circa demo}: the pump-station scenario end to end, writing its files to a folder. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs the pump-station scenario end to end: converts a hand-written regime mixture,",
            "compiles a region-graph model from bundled NumPy parameters, validates both, checks a reference",
            "set computed with NumPy and SciPy, catches a deliberately broken export, and renders the small",
            "model as Graphviz DOT, and writes the HTML report a reviewer reads. Writes every file to DIR",
            "(default: circa-demo)."})
final class DemoCommand implements Callable<Integer> {
    private static final ReadLimits LIMITS = ReadLimits.DEFAULT;

    @Parameters(index = "0", arity = "0..1", paramLabel = "DIR", description = "Folder for the demo's files (created if needed).")
    Path dir = Path.of("circa-demo");

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        DemoFolder f = new DemoFolder(dir, spec.commandLine().getOut());
        f.say("circa demo: the pump-station scenario, files in " + dir.toAbsolutePath().normalize());
        f.say("");
        f.say("1. The regime mixture an engineer wrote by hand: three regimes (normal operation, cavitation, a blocked");
        f.say("   outlet) and a worn-valve definition shared by two of them, converted into a circuit and proved equal");
        f.say("   to the mixture at sampled points.");
        Path yaml = f.extract("mixtures/pump-station-regimes.yaml", "pump-station-regimes.yaml");
        MixtureConverter.Result mix = MixtureConverter.convert(MixtureReader.read(yaml, LIMITS), MixtureOptions.DEFAULT);
        f.indent(mix.summary());
        Path regimes = f.write(mix.circuit(), "regimes.circuit.json", "the converted regime mixture");

        f.say("");
        f.say("2. A model trained elsewhere from a region graph; its parameters came from NumPy (example-params.npz).");
        Path rg = f.extract("npz/example-regions.json", "station-regions.json");
        Path npz = f.extract("npz/example-params.npz", "station-params.npz");
        RegionConverter.Result stations = RegionConverter.convert(new RegionGraphReader(LIMITS).read(rg),
                new CompileOptions(3, 2, 1, CompileOptions.defaults().families()), ParameterSource.file(npz),
                new RegionConverter.Verification(500, 0, 1e-9, 1e-9), LIMITS);
        CircuitDocument doc = stations.circuit();
        f.indent("compiled with 3 sums per region, 2 input bundles per leaf region: " + Counts.of(doc.nodes().size(), "node")
                + ", " + Counts.of(doc.edgeCount(), "edge") + "\n" + stations.verification().summary());
        Path stationsFile = f.write(doc, "stations.circuit.json", "the compiled region-graph model");

        f.say("");
        f.say("3. Both files through the validator (schema, references, scopes, parameters, normalisation).");
        Validator validator = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
        boolean ok = true;
        for (Path p : List.of(regimes, stationsFile)) {
            ValidationReport r = validator.validate(p, LIMITS);
            ok &= r.valid();
            f.indent(p.getFileName() + ": " + (r.valid() ? "valid" : "INVALID") + ", smooth "
                    + lower(r.property(Property.SMOOTH)) + ", decomposable " + lower(r.property(Property.DECOMPOSABLE))
                    + ", log Z " + r.logPartition() + ", exact marginals " + r.exactQueries().marginal());
        }

        f.say("");
        f.say("4. The region-graph model against reference log-densities its training code computed");
        f.say("   (NumPy 1.24 and SciPy 1.10, including rows with missing values).");
        Path ref = f.extract("npz/example-reference.csv", "station-reference.csv");
        RegressionCheck check = new RegressionCheck(stations.compiled(), Tolerance.DEFAULT);
        check.checkReference(ref, LIMITS);
        CheckReport cr = check.report();
        f.indent(cr.toText());
        ok &= cr.passed();

        f.say("");
        f.say("5. A deliberately broken export of the regime model: one product given a variable twice and one");
        f.say("   sum's weights scaled by 1.25. The validator must catch both.");
        ok &= caught(f, validator, f.write(BrokenExport.of(mix.circuit()), "broken-export.circuit.json", "the broken export"));

        f.say("");
        f.say("6. A picture of the small model as a Graphviz DOT graph.");
        String text = DotRenderer.render(CompiledCircuit.compile(mix.circuit()), new RenderOptions(true,
                RenderOptions.DEFAULT_MAX_NODES));
        f.writeText(text, "regimes.dot", "the regime model as a DOT graph, with scopes");
        f.indent("draw it with: dot -Tsvg " + f.file("regimes.dot") + " -o " + f.file("regimes.svg"));

        f.say("");
        f.say("7. The page a reviewer reads before signing the region-graph model off: verdict, the reference check,");
        f.say("   every variable's exact marginal, a pair, the structure (one HTML file, open it in a browser).");
        Path report = f.file("stations.report.html");
        ReportCommand.write(ReportSource.of(stationsFile, doc, stations.compiled()), ReportOptions.defaults("circa "
                + Main.VERSION).withReferences(List.of(ref)).withPairs(VariablePairs.parse("inlet_pressure:motor_current",
                doc.variables())), report, stationsFile, ref);
        f.wrote(report, "the model report of stations.circuit.json");

        f.say("");
        f.listWritten();
        f.say("");
        f.say(ok ? "Every step behaved as expected. Remember: a valid file is not a good model; circa proves structure"
                + " and numbers, not fitness for a decision."
                : "Some step did not behave as expected; see above.");
        spec.commandLine().getOut().flush();
        return ok ? ExitStatus.OK : ExitStatus.FAILED;
    }

    /** Validates the broken export and prints what the validator caught; whether it was found invalid. */
    private static boolean caught(DemoFolder f, Validator validator, Path broken) throws Exception {
        ValidationReport br = validator.validate(broken, LIMITS);
        int caught = 0;
        for (Diagnostic d : br.diagnostics()) {
            if (d.severity() == Severity.ERROR || d.severity() == Severity.WARNING) {
                f.indent(d.render());
                caught++;
            }
        }
        f.indent("verdict: " + (br.valid() ? "valid (unexpected!)" : "INVALID, as it should be") + " ("
                + Counts.of(caught, "diagnostic") + ")");
        return !br.valid();
    }

    private static String lower(Object value) {
        return value.toString().toLowerCase(Locale.ROOT);
    }
}
