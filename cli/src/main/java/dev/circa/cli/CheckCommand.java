package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
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

    @Mixin
    CheckOptions check;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws FormatException {
        RegressionCheck regression;
        try (Progress progress = Progress.start(read.err(), "circa check: reading " + circuitFile)) {
            Model model = read.use(circuitFile);
            regression = new RegressionCheck(model.circuit(), check.tolerance(model.document().checks()));
            progress.phase("circa check: checking the embedded cases");
            regression.checkEmbedded(model.document());
            for (Path ref : check.references()) {
                progress.phase("circa check: checking " + ref);
                regression.checkReference(ref, read.limits());
            }
        }
        return check.finish(regression.report(), circuitFile, read.out());
    }
}
