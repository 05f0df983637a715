package dev.circa.spark;

import dev.circa.cli.ExitStatus;
import dev.circa.cli.ReadOptions;
import dev.circa.cli.UsageException;
import dev.circa.format.io.FormatException;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.Tolerance;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa-spark check}: {@code circa check} with its reference sets checked in parallel on Spark. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Checks a circuit against its embedded checks and every --reference set (CSV, or",
            "Parquet when the name ends in .parquet), the rows checked in parallel. Prints the report",
            "of circa check; exit status 1 when any case fails."})
final class SparkCheckCommand implements Callable<Integer> {
    /** Report forms. */
    enum Format { text, json }

    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file (.json or .json.gz).")
    Path circuitFile;

    @Option(names = "--reference", paramLabel = "REF", description = "A reference set (repeatable).")
    List<String> references = new ArrayList<>();

    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance (default: the file's checks value, else 1e-9).")
    Double atol;

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance (default: the file's checks value, else 1e-9).")
    Double rtol;

    @Option(names = "--format", paramLabel = "FORMAT", description = "text (default) or json.")
    Format format = Format.text;

    @Mixin
    ReadOptions read;

    @Mixin
    SparkOptions sparkOptions;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws FormatException {
        PrintWriter out = spec.commandLine().getOut();
        SparkModel model = SparkModel.load(circuitFile, read.limits(), spec.commandLine().getErr());
        Tolerance tol;
        try {
            tol = Tolerance.resolve(model.driverModel().document().checks(), atol, rtol);
        } catch (IllegalArgumentException e) {
            throw new UsageException("--atol and --rtol must be finite and >= 0");
        }
        Sessions.Opened opened = sparkOptions.open();
        CheckReport report;
        try {
            DistributedCheck check = new DistributedCheck(opened.spark(), model, tol);
            for (String ref : references) {
                check.checkReference(ref);
            }
            report = check.report();
        } finally {
            if (opened.created()) {
                opened.spark().stop();
            }
        }
        if (report.cases() == 0) {
            throw new UsageException("nothing to check: " + circuitFile + " has no embedded checks"
                    + (references.isEmpty() ? " and no --reference was given" : " and the reference sets have no rows"));
        }
        out.print(format == Format.json ? report.toJson() : report.toText());
        out.flush();
        return report.passed() ? ExitStatus.OK : ExitStatus.FAILED;
    }
}
