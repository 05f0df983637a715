package dev.circa.validator;

import java.util.Collections;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The result of validating one file, with the fields of CLI.md's {@code validate} report.
 *
 * @param file the file as given (for messages), or {@code null}
 * @param valid whether no diagnostic has severity {@link Severity#ERROR}
 * @param properties each property's verdict, every {@link Property} present
 * @param logPartition log Z of each output by name, in output order, or {@code null} when not computable in one pass
 * @param variableTree the variable tree when structured-decomposable, else {@code null}
 * @param exactQueries which queries are exact
 * @param stats sizes
 * @param diagnostics every diagnostic, in the order found
 */
public record ValidationReport(String file, boolean valid, Map<Property, Verdict> properties,
        Map<String, Double> logPartition, VariableTree variableTree, ExactQueries exactQueries,
        CircuitStats stats, List<Diagnostic> diagnostics) {

    public ValidationReport {
        properties = Collections.unmodifiableMap(new EnumMap<>(properties));
        logPartition = logPartition == null ? null : Collections.unmodifiableMap(new LinkedHashMap<>(logPartition));
        diagnostics = List.copyOf(diagnostics);
    }

    /** The verdict on {@code p}. */
    public Verdict property(Property p) {
        return properties.get(p);
    }

    /** CLI.md's exit status for this file: 0 when valid, 1 when an error diagnostic was found. */
    public int exitStatus() {
        return valid ? 0 : 1;
    }

    /** The highest exit status of {@code reports} (0 for none). */
    public static int exitStatus(List<ValidationReport> reports) {
        int s = 0;
        for (ValidationReport r : reports) {
            s = Math.max(s, r.exitStatus());
        }
        return s;
    }

    /** Number of diagnostics of severity {@code s}. */
    public int count(Severity s) {
        int n = 0;
        for (Diagnostic d : diagnostics) {
            if (d.severity() == s) {
                n++;
            }
        }
        return n;
    }
}
