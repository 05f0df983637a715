package dev.circa.validator.rules;

import dev.circa.format.CheckCase;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/** Turns embedded check cases into data rows (NaN = missing), or says why one cannot be. */
final class CheckRows {
    private CheckRows() {
    }

    /** The output index of {@code c}, or -1. */
    static int output(CircuitDocument doc, CheckCase c) {
        if (c.output() == null) {
            return doc.outputs().isEmpty() ? -1 : 0;
        }
        for (int o = 0; o < doc.outputs().size(); o++) {
            if (doc.outputs().get(o).name().equals(c.output())) {
                return o;
            }
        }
        return -1;
    }

    /** Why {@code c} cannot be evaluated, or {@code null}. */
    static String problem(CircuitDocument doc, CheckCase c) {
        if (output(doc, c) < 0) {
            return c.output() == null ? "the case needs an output, and the circuit has none"
                    : "the case names output \"" + c.output() + "\", which the circuit does not have";
        }
        double[] row = new double[doc.variables().size()];
        return fill(doc, c, row);
    }

    /** Fills {@code row} with the case's values; returns why it cannot, or {@code null}. */
    static String fill(CircuitDocument doc, CheckCase c, double[] row) {
        java.util.Arrays.fill(row, Double.NaN);
        List<Variable> vars = doc.variables();
        for (Map.Entry<String, Object> e : c.values().entrySet()) {
            int v = -1;
            for (int i = 0; i < vars.size(); i++) {
                if (vars.get(i).name().equals(e.getKey())) {
                    v = i;
                    break;
                }
            }
            if (v < 0) {
                return "the case gives a value for \"" + e.getKey() + "\", which is not a variable of the circuit";
            }
            Variable var = vars.get(v);
            Object x = e.getValue();
            if (x instanceof String label) {
                int s = var.stateIndex(label);
                if (s < 0) {
                    return String.format(Locale.ROOT, "the case gives %s the value \"%s\"; expected one of its states %s",
                            var.name(), label, var.states());
                }
                row[v] = s;
            } else {
                double d = (Double) x;
                boolean discrete = var.type() != VariableType.REAL;
                int states = var.stateCount();
                if (discrete && (d != Math.rint(d) || d < 0 || (states > 0 && d >= states))) {
                    return String.format(Locale.ROOT, "the case gives %s the value %s; expected %s", var.name(), dev.circa.validator.analysis.Numbers.text(d),
                            states > 0 ? "a state index 0.." + (states - 1) : "a count 0, 1, 2, ...");
                }
                row[v] = d;
            }
        }
        return null;
    }
}
