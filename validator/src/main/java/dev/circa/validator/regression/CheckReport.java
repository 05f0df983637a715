package dev.circa.validator.regression;

import java.util.List;
import java.util.Locale;

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
     * followed by {@code passed}, {@code atol}, {@code rtol} and {@code outputs}. A non-finite number is {@code null}.
     */
    public String toJson() {
        StringBuilder sb = new StringBuilder(512);
        sb.append("{\"cases\": ").append(cases)
                .append(", \"failures\": ").append(failures)
                .append(", \"maxAbsError\": ").append(num(maxAbsError))
                .append(", \"maxRelError\": ").append(num(maxRelError))
                .append(", \"worst\": [");
        for (int i = 0; i < worst.size(); i++) {
            CaseResult c = worst.get(i);
            sb.append(i == 0 ? "\n  " : ",\n  ");
            sb.append("{\"source\": ").append(str(c.source()))
                    .append(", \"row\": ").append(c.row())
                    .append(", \"line\": ").append(c.line());
            if (c.pointer() != null) {
                sb.append(", \"pointer\": ").append(str(c.pointer()));
            }
            sb.append(", \"output\": ").append(str(c.output()))
                    .append(", \"expected\": ").append(num(c.expected()))
                    .append(", \"computed\": ").append(num(c.computed()))
                    .append(", \"absError\": ").append(num(c.absError()))
                    .append(", \"relError\": ").append(num(c.relError()))
                    .append(", \"passed\": ").append(c.passed()).append('}');
        }
        sb.append(worst.isEmpty() ? "]" : "\n]");
        sb.append(", \"passed\": ").append(passed())
                .append(", \"atol\": ").append(num(tolerance.atol()))
                .append(", \"rtol\": ").append(num(tolerance.rtol()))
                .append(", \"outputs\": [");
        for (int i = 0; i < outputs.size(); i++) {
            OutputSummary o = outputs.get(i);
            sb.append(i == 0 ? "" : ", ")
                    .append("{\"output\": ").append(str(o.output()))
                    .append(", \"cases\": ").append(o.cases())
                    .append(", \"failures\": ").append(o.failures())
                    .append(", \"maxAbsError\": ").append(num(o.maxAbsError()))
                    .append(", \"maxRelError\": ").append(num(o.maxRelError())).append('}');
        }
        sb.append("]}\n");
        return sb.toString();
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
            sb.append("worst cases:\n");
            for (CaseResult c : worst) {
                String where = c.pointer() != null
                        ? c.source() + " " + c.pointer() + (c.line() > 0 ? " (line " + c.line() + ")" : "")
                        : c.source() + " row " + c.row() + " (line " + c.line() + ")";
                sb.append(String.format(Locale.ROOT, "  %s %s output %s: expected %s, computed %s, abs error %s, rel error %s%n",
                        c.passed() ? "pass" : "FAIL", where, c.output(), ld(c.expected()), ld(c.computed()),
                        g(c.absError()), g(c.relError())));
            }
        }
        return sb.toString();
    }

    static String num(double d) {
        return Double.isFinite(d) ? Double.toString(d) : "null";
    }

    static String str(String s) {
        StringBuilder sb = new StringBuilder(s.length() + 2).append('"');
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            switch (ch) {
                case '"' -> sb.append("\\\"");
                case '\\' -> sb.append("\\\\");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                default -> {
                    if (ch < 0x20) {
                        sb.append(String.format(Locale.ROOT, "\\u%04x", (int) ch));
                    } else {
                        sb.append(ch);
                    }
                }
            }
        }
        return sb.append('"').toString();
    }

    private static String g(double d) {
        if (Double.isNaN(d)) {
            return "n/a";
        }
        if (Double.isInfinite(d)) {
            return d > 0 ? "inf" : "-inf";
        }
        return String.format(Locale.ROOT, "%.3g", d);
    }

    private static String ld(double d) {
        return d == Double.NEGATIVE_INFINITY ? "-inf" : Double.isNaN(d) ? "NaN" : Double.toString(d);
    }
}
