package dev.circa.validator.regression;

import static dev.circa.validator.ReportNumbers.g;
import static dev.circa.validator.ReportNumbers.ld;

import dev.circa.validator.ReportJson;
import java.util.List;
import java.util.Locale;
import tools.jackson.core.JsonGenerator;

/**
 * The outcome of a regression check: counts, the largest errors, the worst cases and a breakdown per
 * output. {@link #toJson()} gives the form of CLI.md, {@link #toText()} the form for people.
 *
 * @param tolerance the tolerance applied
 * @param cases cases checked
 * @param failures cases beyond tolerance
 * @param maxAbsError the largest |computed - expected| (0 without cases; infinite when a case
 *     disagrees on -inf; NaN when the circuit computed NaN)
 * @param maxRelError the largest relative error over references other than 0 and -inf (0 when there is none)
 * @param worst up to {@link #WORST} cases, the furthest beyond their allowance first
 * @param outputs one summary per output that had cases, in the circuit's output order
 */
public record CheckReport(Tolerance tolerance, long cases, long failures, double maxAbsError, double maxRelError,
                          List<CaseResult> worst, List<OutputSummary> outputs) {
    /** How many worst cases a report keeps. */
    public static final int WORST = 10;

    public CheckReport {
        worst = List.copyOf(worst);
        outputs = List.copyOf(outputs);
    }

    /** Whether every case passed. */
    public boolean passed() {
        return failures == 0;
    }

    /**
     * The JSON form: {@code {"cases": N, "failures": F, "maxAbsError": ..., "maxRelError": ..., "worst": [...]}}
     * (each worst case with its {@code margin}, |computed - expected| / (atol + rtol * |expected|))
     * followed by {@code passed}, {@code atol}, {@code rtol} and {@code outputs}. A non-finite number is {@code null}.
     */
    public String toJson() {
        ReportJson json = new ReportJson(ReportJson.Escapes.SHORT_FORMS);
        JsonGenerator g = json.generator();
        g.writeStartObject();
        g.writeNumberProperty("cases", cases);
        g.writeNumberProperty("failures", failures);
        json.number("maxAbsError", maxAbsError);
        json.number("maxRelError", maxRelError);
        json.startLinedArray("worst");
        for (CaseResult c : worst) {
            g.writeStartObject();
            g.writeStringProperty("source", c.source());
            g.writeNumberProperty("row", c.row());
            g.writeNumberProperty("line", c.line());
            if (c.pointer() != null) {
                g.writeStringProperty("pointer", c.pointer());
            }
            g.writeStringProperty("output", c.output());
            json.number("expected", c.expected());
            json.number("computed", c.computed());
            json.number("absError", c.absError());
            json.number("relError", c.relError());
            json.number("margin", c.excess());
            g.writeBooleanProperty("passed", c.passed());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeBooleanProperty("passed", passed());
        json.number("atol", tolerance.atol());
        json.number("rtol", tolerance.rtol());
        g.writeArrayPropertyStart("outputs");
        for (OutputSummary o : outputs) {
            g.writeStartObject();
            g.writeStringProperty("output", o.output());
            g.writeNumberProperty("cases", o.cases());
            g.writeNumberProperty("failures", o.failures());
            json.number("maxAbsError", o.maxAbsError());
            json.number("maxRelError", o.maxRelError());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
        return json.finish();
    }

    /** A summary for people: counts, largest errors, per output when several, and the worst cases with their rows. */
    public String toText() {
        StringBuilder sb = new StringBuilder(512);
        sb.append(String.format(Locale.ROOT, "%s: %d case%s, %d failure%s (atol %s, rtol %s)%n",
                passed() ? "PASSED" : "FAILED", cases, cases == 1 ? "" : "s", failures, failures == 1 ? "" : "s",
                g(tolerance.atol()), g(tolerance.rtol())));
        sb.append(String.format(Locale.ROOT, "largest absolute error %s, largest relative error %s%n",
                g(maxAbsError), g(maxRelError)));
        if (outputs.size() > 1) {
            for (OutputSummary o : outputs) {
                sb.append(String.format(Locale.ROOT, "  output %s: %d cases, %d failures, largest absolute error %s, relative %s%n",
                        o.output(), o.cases(), o.failures(), g(o.maxAbsError()), g(o.maxRelError())));
            }
        }
        if (!worst.isEmpty()) {
            sb.append("worst cases, furthest past the pass rule first (margin = |computed - expected| / (atol + rtol * "
                    + "|expected|); a case passes at margin <= 1):\n");
            for (CaseResult c : worst) {
                String where = c.pointer() != null
                        ? c.source() + " " + c.pointer() + (c.line() > 0 ? " (line " + c.line() + ")" : "")
                        : c.source() + " row " + c.row() + " (line " + c.line() + ")";
                sb.append(String.format(Locale.ROOT, "  %s margin %s, %s output %s: expected %s, computed %s, abs error %s, rel error %s%n",
                        c.passed() ? "pass" : "FAIL", g(c.excess()), where, c.output(), ld(c.expected()), ld(c.computed()),
                        g(c.absError()), g(c.relError())));
            }
        }
        return sb.toString();
    }
}
