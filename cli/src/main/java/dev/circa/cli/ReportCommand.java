package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.io.AtomicOutput;
import dev.circa.model.Model;
import dev.circa.report.ModelReport;
import dev.circa.report.ReportOptions;
import dev.circa.report.ReportSource;
import dev.circa.report.VariablePairs;
import java.io.BufferedWriter;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa report}: one self-contained HTML page a reviewer reads before signing a model off. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Writes a model report: one self-contained HTML page (inline SVG plots and CSS, nothing",
            "fetched, printable) with the summary and the file's SHA-256, the validator's verdict with proofs or",
            "witnesses, the regression checks (embedded and each --reference) with a scatter, an error histogram",
            "against the tolerance band and the worst cases, every variable's exact marginal under each output,",
            "2-D marginals of the --pairs, and the structure by depth with its DOT summary. The model must be",
            "smooth and decomposable (its marginals are then exact)."})
final class ReportCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL", description = "The circuit file (.json or .json.gz).")
    Path modelFile;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "REPORT.html", description = "The page to write.")
    Path output;

    @Option(names = "--reference", paramLabel = "REF.csv", description = "A reference set to check against (repeatable).")
    List<Path> references = new ArrayList<>();

    @Option(names = "--pairs", paramLabel = "A:B,...",
            description = "Up to 6 pairs of variables drawn as 2-D marginal heat maps, e.g. inlet_pressure:outlet_pressure.")
    String pairs;

    @Mixin
    CheckTolerance tolerance;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = read.err();
        List<Path> inputs = new ArrayList<>(references);
        inputs.add(modelFile);
        if (read.certified()) {
            inputs.add(read.certificateFile);
        }
        Path[] in = inputs.toArray(new Path[0]);
        AtomicOutput.refuseInputs(output, in);
        Model model = read.use(modelFile);
        ReportOptions options = options(model);
        if (read.certified()) {
            options = options.withCertificateState("the file's bytes match the certificate " + read.certificateFile
                    + " (SHA-256 and size); it proves " + model.requirement() + "; not validated again");
        }
        ReportSource src = ReportSource.of(modelFile, model.document(), model.circuit());
        write(src, options, output, in);
        err.println("circa report: wrote " + output + " (" + (src.validation().valid() ? "valid" : "NOT valid")
                + " model, " + Counts.of(model.circuit().variableCount(), "marginal") + ", "
                + Counts.of(options.pairs().size(), "pair") + ", " + Counts.of(references.size(), "reference set") + ")");
        return ExitStatus.OK;
    }

    private ReportOptions options(Model model) {
        ReportOptions o = ReportOptions.defaults("circa " + Main.VERSION).withReferences(references)
                .withLimits(read.limits());
        try {
            o = o.withPairs(VariablePairs.parse(pairs, model.document().variables()));
        } catch (IllegalArgumentException e) {
            throw new UsageException(e.getMessage());
        }
        return o.withTolerance(tolerance.resolve(model.document().checks()));
    }

    /** Writes the report of {@code src} to {@code target} whole or not at all (also used by {@code circa demo}). */
    static void write(ReportSource src, ReportOptions options, Path target, Path... inputs) throws Exception {
        AtomicOutput.write(target, stream -> {
            BufferedWriter w = new BufferedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8), 1 << 16);
            ModelReport.write(src, options, w);
            w.flush();
        }, inputs);
    }
}
