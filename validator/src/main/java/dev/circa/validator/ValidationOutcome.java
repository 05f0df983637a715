package dev.circa.validator;

import dev.circa.format.io.FormatException;
import java.util.List;

/**
 * What validating one file gave: its report, or the located reason no model could be built from it
 * (exit status 2). Machine-readable reports list one entry per file given, failures included.
 *
 * @param file the file as given
 * @param report the report, or {@code null} when the file could not be read
 * @param failure why the file could not be read (file, line, column, what was expected), or {@code null}
 */
public record ValidationOutcome(String file, ValidationReport report, FormatException failure) {
    public ValidationOutcome {
        if ((report == null) == (failure == null)) {
            throw new IllegalArgumentException("an outcome has either a report or a failure");
        }
    }

    /** The outcome of a file that was read and judged. */
    public static ValidationOutcome of(ValidationReport report) {
        return new ValidationOutcome(report.file(), report, null);
    }

    /** The outcome of a file from which no model could be built. */
    public static ValidationOutcome failed(String file, FormatException failure) {
        return new ValidationOutcome(file, null, failure);
    }

    /** CLI.md's exit status for this file: 0 valid, 1 an error diagnostic, 2 unreadable. */
    public int exitStatus() {
        return failure != null ? 2 : report.exitStatus();
    }

    /** The highest exit status of {@code outcomes} (0 for none). */
    public static int exitStatus(List<ValidationOutcome> outcomes) {
        int s = 0;
        for (ValidationOutcome o : outcomes) {
            s = Math.max(s, o.exitStatus());
        }
        return s;
    }
}
