package dev.circa.cli;

import dev.circa.format.Checks;
import dev.circa.validator.regression.Tolerance;
import picocli.CommandLine.Option;

/** {@code --atol} and {@code --rtol} of the commands that run regression checks ({@code check}, {@code report}). */
final class CheckTolerance {
    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance (default: the file's checks value, else 1e-9).")
    Double atol;

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance (default: the file's checks value, else 1e-9).")
    Double rtol;

    /** The tolerance in force for a document with {@code checks} (may be {@code null}). */
    Tolerance resolve(Checks checks) {
        try {
            return Tolerance.resolve(checks, atol, rtol);
        } catch (IllegalArgumentException e) {
            throw new UsageException("--atol and --rtol must be finite and >= 0");
        }
    }
}
