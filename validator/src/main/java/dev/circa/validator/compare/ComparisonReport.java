package dev.circa.validator.compare;

import dev.circa.format.Variable;
import dev.circa.format.csv.CellValues;
import java.util.List;
import java.util.Locale;

/**
 * The outcome of a comparison of circuits A and B.
 *
 * @param options the settings used
 * @param variables A's variables (the order of {@link Disagreement#values()})
 * @param structurallyIdentical whether A and B are identical up to node order ({@link StructuralIdentity})
 * @param points points compared over all outputs
 * @param failures points beyond tolerance
 * @param maxAbsError the largest |logA - logB| (0 without points)
 * @param maxRelError the largest |logA - logB| / |logB| over finite logB other than 0
 * @param outputs one entry per pair of corresponding outputs
 * @param worst up to {@link #WORST} points, the largest disagreements first
 */
public record ComparisonReport(CompareOptions options, List<Variable> variables, boolean structurallyIdentical,
                               long points, long failures, double maxAbsError, double maxRelError,
                               List<OutputComparison> outputs, List<Disagreement> worst) {
    /** How many worst points a report keeps. */
    public static final int WORST = 10;

    public ComparisonReport {
        variables = List.copyOf(variables);
        outputs = List.copyOf(outputs);
        worst = List.copyOf(worst);
    }

    /** Whether every point agreed. */
    public boolean passed() {
        return failures == 0;
    }

    /** A summary for people. */
    public String toText() {
        StringBuilder sb = new StringBuilder();
        if (structurallyIdentical) {
            sb.append("the circuits are structurally identical (up to node order)\n");
        }
        sb.append(String.format(Locale.ROOT, "%s: %d points, %d disagreeing (atol %s, rtol %s, %d samples from each, seed %d)%n",
                passed() ? "AGREE" : "DISAGREE", points, failures, g(options.atol()), g(options.rtol()),
                options.samples(), options.seed()));
        sb.append(String.format(Locale.ROOT, "largest absolute difference %s, largest relative difference %s%n",
                g(maxAbsError), g(maxRelError)));
        for (OutputComparison o : outputs) {
            sb.append(String.format(Locale.ROOT, "  output %s%s: %d points, %d disagreeing, log Z %s vs %s%n",
                    o.outputA(), o.outputA().equals(o.outputB()) ? "" : " / " + o.outputB(), o.points(), o.failures(),
                    ld(o.logPartitionA()), ld(o.logPartitionB())));
        }
        for (OutputComparison o : outputs) {
            if (!options.agree(o.logPartitionA(), o.logPartitionB())) {
                sb.append(String.format(Locale.ROOT, "note: output %s integrates to different totals (log Z %s vs %s); "
                        + "if only normalisation differs, circa normalize makes both integrate to 1%n",
                        o.outputA(), ld(o.logPartitionA()), ld(o.logPartitionB())));
            }
        }
        if (!worst.isEmpty() && (failures > 0 || maxAbsError > 0)) {
            sb.append("largest disagreements:\n");
            for (Disagreement d : worst) {
                sb.append(String.format(Locale.ROOT, "  %s output %s, point %d sampled from %s: A %s, B %s, difference %s at %s%n",
                        d.agree() ? "ok  " : "DIFF", d.output(), d.point(), d.sampledFrom(), ld(d.logA()), ld(d.logB()),
                        g(d.absError()), point(d.values())));
            }
        }
        return sb.toString();
    }

    /** The JSON form (non-finite numbers as {@code null}). */
    public String toJson() {
        StringBuilder sb = new StringBuilder();
        sb.append("{\"structurallyIdentical\": ").append(structurallyIdentical)
                .append(", \"passed\": ").append(passed())
                .append(", \"points\": ").append(points)
                .append(", \"failures\": ").append(failures)
                .append(", \"maxAbsError\": ").append(num(maxAbsError))
                .append(", \"maxRelError\": ").append(num(maxRelError))
                .append(", \"samples\": ").append(options.samples())
                .append(", \"seed\": ").append(options.seed())
                .append(", \"atol\": ").append(num(options.atol()))
                .append(", \"rtol\": ").append(num(options.rtol()))
                .append(", \"outputs\": [");
        for (int i = 0; i < outputs.size(); i++) {
            OutputComparison o = outputs.get(i);
            sb.append(i == 0 ? "" : ", ").append("{\"outputA\": ").append(str(o.outputA()))
                    .append(", \"outputB\": ").append(str(o.outputB()))
                    .append(", \"points\": ").append(o.points())
                    .append(", \"failures\": ").append(o.failures())
                    .append(", \"maxAbsError\": ").append(num(o.maxAbsError()))
                    .append(", \"logPartitionA\": ").append(num(o.logPartitionA()))
                    .append(", \"logPartitionB\": ").append(num(o.logPartitionB())).append('}');
        }
        sb.append("], \"worst\": [");
        for (int i = 0; i < worst.size(); i++) {
            Disagreement d = worst.get(i);
            sb.append(i == 0 ? "\n  " : ",\n  ").append("{\"output\": ").append(str(d.output()))
                    .append(", \"sampledFrom\": ").append(str(d.sampledFrom()))
                    .append(", \"point\": ").append(d.point())
                    .append(", \"logA\": ").append(num(d.logA()))
                    .append(", \"logB\": ").append(num(d.logB()))
                    .append(", \"absError\": ").append(num(d.absError()))
                    .append(", \"agree\": ").append(d.agree())
                    .append(", \"values\": {");
            boolean first = true;
            for (int v = 0; v < variables.size(); v++) {
                if (Double.isNaN(d.values()[v])) {
                    continue;
                }
                sb.append(first ? "" : ", ").append(str(variables.get(v).name())).append(": ");
                Variable x = variables.get(v);
                sb.append(x.type().isDiscrete() && !x.states().isEmpty()
                        ? str(CellValues.format(x, d.values()[v])) : num(d.values()[v]));
                first = false;
            }
            sb.append("}}");
        }
        sb.append(worst.isEmpty() ? "]}\n" : "\n]}\n");
        return sb.toString();
    }

    private String point(double[] values) {
        StringBuilder sb = new StringBuilder("{");
        for (int v = 0; v < variables.size(); v++) {
            sb.append(v == 0 ? "" : ", ").append(variables.get(v).name()).append('=');
            sb.append(Double.isNaN(values[v]) ? "missing" : CellValues.format(variables.get(v), values[v]));
        }
        return sb.append('}').toString();
    }

    private static String num(double d) {
        return Double.isFinite(d) ? Double.toString(d) : "null";
    }

    private static String str(String s) {
        StringBuilder sb = new StringBuilder(s.length() + 2).append('"');
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            if (ch == '"' || ch == '\\') {
                sb.append('\\').append(ch);
            } else if (ch < 0x20) {
                sb.append(String.format(Locale.ROOT, "\\u%04x", (int) ch));
            } else {
                sb.append(ch);
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
