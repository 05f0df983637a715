package dev.circa.cli;

import dev.circa.format.Checks;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.Tolerance;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * The options of a regression check and its ending (the report printed, the exit status), shared by
 * {@code circa check} and the commands that run the same check elsewhere.
 */
public final class CheckOptions {
    @Option(names = "--reference", paramLabel = "REF.csv", description = "A reference set (repeatable).")
    List<Path> references = new ArrayList<>();

    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance (default: the file's checks value, else 1e-9).")
    Double atol;

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance (default: the file's checks value, else 1e-9).")
    Double rtol;

    @Mixin
    TextOrJson format;

    /** The reference sets in the order given. */
    public List<Path> references() {
        return List.copyOf(references);
    }

    /** The tolerance in force for a circuit with {@code checks} (see {@link Tolerance#resolve}). */
    public Tolerance tolerance(Checks checks) {
        try {
            return Tolerance.resolve(checks, atol, rtol);
        } catch (IllegalArgumentException e) {
            throw new UsageException("--atol and --rtol must be finite and >= 0");
        }
    }

    /**
     * Prints {@code report} in the chosen form and gives the exit status.
     *
     * @throws UsageException when nothing was checked
     */
    public int finish(CheckReport report, Path circuitFile, PrintWriter out) {
        if (report.cases() == 0) {
            throw new UsageException("nothing to check: " + circuitFile + " has no embedded checks"
                    + (references.isEmpty() ? " and no --reference was given" : " and the reference sets have no rows"));
        }
        out.print(format.json() ? report.toJson() : report.toText());
        out.flush();
        return report.passed() ? ExitStatus.OK : ExitStatus.FAILED;
    }
}
