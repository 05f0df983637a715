package dev.circa.model;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Turns named values into the engine's cells and back: a real is a finite number, a count a
 * non-negative integer, a categorical or binary value a state label or a state index (a binary one also
 * a boolean); {@code null} and NaN are missing. Immutable; lookups allocate nothing.
 */
final class VariableCodec {
    /** Largest count that a double holds exactly. */
    private static final double MAX_EXACT = 9007199254740992.0;

    private final List<Variable> variables;
    private final Map<String, Integer> index = new HashMap<>();
    private final Map<String, Integer>[] labels;

    @SuppressWarnings("unchecked")
    VariableCodec(List<Variable> variables) {
        this.variables = variables;
        this.labels = new Map[variables.size()];
        for (int v = 0; v < variables.size(); v++) {
            Variable var = variables.get(v);
            index.put(var.name(), v);
            Map<String, Integer> m = new HashMap<>();
            for (int s = 0; s < var.states().size(); s++) {
                m.putIfAbsent(var.states().get(s), s);
            }
            labels[v] = m;
        }
    }

    int count() {
        return variables.size();
    }

    /** The index of the variable named {@code name}; IllegalArgumentException naming the variables when none. */
    int indexOf(String name) {
        Integer i = index.get(name);
        if (i == null) {
            throw new IllegalArgumentException("\"" + name + "\" is not a variable of this model; expected one of "
                    + String.join(", ", variables.stream().map(Variable::name).toList()));
        }
        return i;
    }

    /** The index of {@code name}, or -1. */
    int find(String name) {
        Integer i = index.get(name);
        return i == null ? -1 : i;
    }

    /** The cell of {@code value} (a Number, a String label, a Boolean, or null for missing) for variable {@code v}. */
    double encode(int v, Object value) {
        if (value == null) {
            return Double.NaN;
        }
        if (value instanceof Number n) {
            return number(v, n.doubleValue());
        }
        if (value instanceof String s) {
            return label(v, s);
        }
        if (value instanceof Boolean b && variables.get(v).type() == VariableType.BINARY) {
            return b ? 1 : 0;
        }
        throw new IllegalArgumentException(describe(v) + ": a " + value.getClass().getSimpleName()
                + " is not a value; expected " + expected(v));
    }

    /** {@code x} checked as a value of variable {@code v}; NaN (missing) passes. */
    double number(int v, double x) {
        if (Double.isNaN(x)) {
            return x;
        }
        Variable var = variables.get(v);
        boolean ok = switch (var.type()) {
            case REAL -> Double.isFinite(x);
            case COUNT -> x >= 0 && x <= MAX_EXACT && x == Math.rint(x);
            default -> x >= 0 && x < var.stateCount() && x == Math.rint(x);
        };
        if (!ok) {
            throw new IllegalArgumentException(describe(v) + ": " + x + " is not a value; expected " + expected(v));
        }
        return x + 0.0;
    }

    /** The state index of {@code label} for variable {@code v}. */
    double label(int v, String label) {
        Integer s = labels[v].get(label);
        if (s == null) {
            throw new IllegalArgumentException(describe(v) + ": \"" + label + "\" is not a value; expected "
                    + expected(v));
        }
        return s;
    }

    /** The value of a cell as an object: Double (real), Long (count), label or Integer state index, null (missing). */
    Object decode(int v, double cell) {
        if (Double.isNaN(cell)) {
            return null;
        }
        Variable var = variables.get(v);
        switch (var.type()) {
            case REAL:
                return cell;
            case COUNT:
                return (long) cell;
            default:
                int k = (int) cell;
                return var.states().isEmpty() ? Integer.valueOf(k) : var.states().get(k);
        }
    }

    private String describe(int v) {
        Variable var = variables.get(v);
        return "variable " + var.name() + " (" + var.type().jsonName() + ")";
    }

    private String expected(int v) {
        Variable var = variables.get(v);
        return switch (var.type()) {
            case REAL -> "a finite number, or null for missing";
            case COUNT -> "an integer count 0, 1, 2, ..., or null for missing";
            default -> (var.states().isEmpty() ? "" : "one of " + String.join(", ", var.states()) + ", or ")
                    + "a state index from 0 to " + (var.stateCount() - 1)
                    + (var.type() == VariableType.BINARY ? ", a boolean" : "") + ", or null for missing";
        };
    }
}
