package dev.circa.validator;

import dev.circa.validator.render.JsonReport;
import dev.circa.validator.render.SarifReport;
import dev.circa.validator.render.TextReport;
import java.util.List;
import java.util.Locale;

/** The output formats of {@code circa validate --format}. */
public enum ReportFormat {
    /** For people: one line per diagnostic, then a summary of properties and exact queries. */
    TEXT,
    /** CLI.md's report object; a JSON array of them when there are several files. */
    JSON,
    /** One SARIF 2.1.0 log with rule metadata and one result per diagnostic. */
    SARIF;

    /** The format named {@code text}, {@code json} or {@code sarif}. */
    public static ReportFormat fromName(String name) {
        return switch (name.trim().toLowerCase(Locale.ROOT)) {
            case "text" -> TEXT;
            case "json" -> JSON;
            case "sarif" -> SARIF;
            default -> throw new IllegalArgumentException("unknown format \"" + name + "\"; expected text, json or sarif");
        };
    }

    /** {@code reports} (one per file, in the order given) in this format, ending with a newline. */
    public String render(List<ValidationReport> reports) {
        return renderOutcomes(reports.stream().map(ValidationOutcome::of).toList());
    }

    /**
     * One entry per file given, in order, ending with a newline. JSON gives a file that could not be
     * read a status-2 entry with its located message; SARIF puts it among the invocation's tool
     * execution notifications; the text form leaves it out (its message goes to standard error).
     */
    public String renderOutcomes(List<ValidationOutcome> outcomes) {
        return switch (this) {
            case TEXT -> TextReport.render(outcomes.stream().filter(o -> o.report() != null)
                    .map(ValidationOutcome::report).toList());
            case JSON -> JsonReport.render(outcomes);
            case SARIF -> SarifReport.render(outcomes);
        };
    }
}
