package dev.circa.report;

import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.List;

/** Parses {@code --pairs a:b,c:d} against a model's variables. */
public final class VariablePairs {
    private VariablePairs() {
    }

    /**
     * The pairs named in {@code spec} as variable indices.
     *
     * @throws IllegalArgumentException naming the fault: a pair not written {@code a:b}, an unknown variable (the
     *     known ones listed), a variable paired with itself, more than {@link ReportOptions#MAX_PAIRS} pairs
     */
    public static List<int[]> parse(String spec, List<Variable> variables) {
        List<int[]> pairs = new ArrayList<>();
        if (spec == null || spec.isBlank()) {
            return pairs;
        }
        for (String item : spec.split(",", -1)) {
            String[] names = item.trim().split(":", -1);
            if (names.length != 2 || names[0].isBlank() || names[1].isBlank()) {
                throw new IllegalArgumentException("--pairs: \"" + item.trim() + "\" is not a pair; expected two "
                        + "variable names joined by a colon, e.g. inlet_pressure:outlet_pressure");
            }
            int a = index(names[0].trim(), variables);
            int b = index(names[1].trim(), variables);
            if (a == b) {
                throw new IllegalArgumentException("--pairs: \"" + item.trim() + "\" pairs a variable with itself; "
                        + "expected two different variables");
            }
            pairs.add(new int[] {a, b});
        }
        if (pairs.size() > ReportOptions.MAX_PAIRS) {
            throw new IllegalArgumentException("--pairs names " + pairs.size() + " pairs; at most "
                    + ReportOptions.MAX_PAIRS + " are drawn");
        }
        return pairs;
    }

    private static int index(String name, List<Variable> variables) {
        List<String> known = new ArrayList<>();
        for (int v = 0; v < variables.size(); v++) {
            if (variables.get(v).name().equals(name)) {
                return v;
            }
            known.add(variables.get(v).name());
        }
        String list = known.size() <= 20 ? String.join(", ", known) : String.join(", ", known.subList(0, 20)) + ", ...";
        throw new IllegalArgumentException("--pairs: the model has no variable \"" + name + "\"; expected one of " + list);
    }
}
