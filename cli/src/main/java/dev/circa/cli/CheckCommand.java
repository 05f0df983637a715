package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import java.io.PrintWriter;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa check}: regression check against the embedded checks and reference CSV files. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Checks a circuit against reference log-densities: its embedded checks and",
            "every --reference CSV (header: variable names, log_density, optionally",
            "output; an empty cell is missing). A case passes when",
            "|computed - expected| <= atol + rtol * |expected|; a -inf reference only",
            "when the circuit computes -inf. Prints the cases, failures, largest errors",
            "and the worst 10 cases with their rows. Exit status 1 when any case fails."})
final class CheckCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file (.json or .json.gz).")
    Path circuitFile;

    @Option(names = "--reference", paramLabel = "REF.csv", description = "A reference set (repeatable).")
    List<Path> references = new ArrayList<>();

    @Mixin
    CheckTolerance tolerance;

    @Mixin
    TextOrJson format;

    @Mixin
    ReadOptions read;

    @Override
    public Integer call() throws FormatException {
        PrintWriter out = read.out();
        Model model = read.load(circuitFile);
        RegressionCheck check = new RegressionCheck(model.circuit(), tolerance.resolve(model.document().checks()));
        check.checkEmbedded(model.document());
        for (Path ref : references) {
            check.checkReference(ref, read.limits());
        }
        CheckReport report = check.report();
        if (report.cases() == 0) {
            throw new UsageException("nothing to check: " + circuitFile + " has no embedded checks"
                    + (references.isEmpty() ? " and no --reference was given" : " and the reference sets have no rows"));
        }
        out.print(format.json() ? report.toJson() : report.toText());
        out.flush();
        return report.passed() ? ExitStatus.OK : ExitStatus.FAILED;
    }
}
