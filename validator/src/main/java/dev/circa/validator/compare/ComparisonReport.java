package dev.circa.validator.compare;

import static dev.circa.validator.ReportNumbers.g;
import static dev.circa.validator.ReportNumbers.ld;

import dev.circa.format.Variable;
import dev.circa.format.csv.CellValues;
import dev.circa.validator.ReportJson;
import java.util.List;
import java.util.Locale;
import tools.jackson.core.JsonGenerator;

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
        ReportJson json = new ReportJson(ReportJson.Escapes.UNICODE);
        JsonGenerator g = json.generator();
        g.writeStartObject();
        g.writeBooleanProperty("structurallyIdentical", structurallyIdentical);
        g.writeBooleanProperty("passed", passed());
        g.writeNumberProperty("points", points);
        g.writeNumberProperty("failures", failures);
        json.number("maxAbsError", maxAbsError);
        json.number("maxRelError", maxRelError);
        g.writeNumberProperty("samples", options.samples());
        g.writeNumberProperty("seed", options.seed());
        json.number("atol", options.atol());
        json.number("rtol", options.rtol());
        g.writeArrayPropertyStart("outputs");
        for (OutputComparison o : outputs) {
            g.writeStartObject();
            g.writeStringProperty("outputA", o.outputA());
            g.writeStringProperty("outputB", o.outputB());
            g.writeNumberProperty("points", o.points());
            g.writeNumberProperty("failures", o.failures());
            json.number("maxAbsError", o.maxAbsError());
            json.number("logPartitionA", o.logPartitionA());
            json.number("logPartitionB", o.logPartitionB());
            g.writeEndObject();
        }
        g.writeEndArray();
        json.startLinedArray("worst");
        for (Disagreement d : worst) {
            g.writeStartObject();
            g.writeStringProperty("output", d.output());
            g.writeStringProperty("sampledFrom", d.sampledFrom());
            g.writeNumberProperty("point", d.point());
            json.number("logA", d.logA());
            json.number("logB", d.logB());
            json.number("absError", d.absError());
            g.writeBooleanProperty("agree", d.agree());
            g.writeObjectPropertyStart("values");
            for (int v = 0; v < variables.size(); v++) {
                Variable x = variables.get(v);
                double value = d.values()[v];
                if (Double.isNaN(value)) {
                    continue;
                }
                if (x.type().isDiscrete() && !x.states().isEmpty()) {
                    g.writeStringProperty(x.name(), CellValues.format(x, value));
                } else {
                    json.number(x.name(), value);
                }
            }
            g.writeEndObject();
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
        return json.finish();
    }

    private String point(double[] values) {
        StringBuilder sb = new StringBuilder("{");
        for (int v = 0; v < variables.size(); v++) {
            sb.append(v == 0 ? "" : ", ").append(variables.get(v).name()).append('=');
            sb.append(Double.isNaN(values[v]) ? "missing" : CellValues.format(variables.get(v), values[v]));
        }
        return sb.append('}').toString();
    }
}
