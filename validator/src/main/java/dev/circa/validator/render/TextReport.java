package dev.circa.validator.render;

import dev.circa.format.Counts;
import dev.circa.validator.CircuitStats;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/** The text form of validation reports. */
public final class TextReport {
    private TextReport() {
    }

    public static String render(List<ValidationReport> reports) {
        StringBuilder sb = new StringBuilder();
        for (ValidationReport r : reports) {
            if (sb.length() > 0) {
                sb.append('\n');
            }
            String file = r.file() == null ? "<input>" : r.file();
            sb.append(String.format(Locale.ROOT, "%s: %s (%s, %s, %d info)%n", file,
                    r.valid() ? "valid" : "INVALID", Counts.of(r.count(Severity.ERROR), "error"),
                    Counts.of(r.count(Severity.WARNING), "warning"), r.count(Severity.INFO)));
            for (Diagnostic d : r.diagnostics()) {
                sb.append("  ").append(d.severity().jsonName()).append(' ').append(d.render()).append('\n');
            }
            sb.append("  properties:");
            boolean first = true;
            for (Property p : Property.values()) {
                sb.append(first ? " " : ", ").append(p.optionName()).append(' ').append(verdict(r.property(p)));
                first = false;
            }
            sb.append('\n');
            if (r.logPartition() != null) {
                sb.append("  log Z:");
                first = true;
                for (Map.Entry<String, Double> e : r.logPartition().entrySet()) {
                    sb.append(first ? " " : ", ").append(e.getKey()).append(' ')
                            .append(String.format(Locale.ROOT, "%s", e.getValue()));
                    first = false;
                }
                sb.append('\n');
            }
            if (r.variableTree() != null) {
                sb.append("  variable tree: ").append(r.variableTree()).append('\n');
            }
            ExactQueries q = r.exactQueries();
            sb.append(String.format(Locale.ROOT, "  exact queries: density %s, marginal %s, conditional %s, mpe %s, sampling %s%n",
                    yes(q.density()), yes(q.marginal()), yes(q.conditional()), yes(q.mpe()), yes(q.sampling())));
            CircuitStats s = r.stats();
            sb.append(String.format(Locale.ROOT, "  %s, %s, %s, depth %d%n", Counts.of(s.variables(), "variable"),
                    Counts.of(s.nodes(), "node"), Counts.of(s.edges(), "edge"), s.depth()));
        }
        return sb.toString();
    }

    private static String verdict(Verdict v) {
        return v == Verdict.UNKNOWN ? "unknown" : v == Verdict.TRUE ? "true" : "false";
    }

    private static String yes(boolean b) {
        return b ? "yes" : "no";
    }
}
