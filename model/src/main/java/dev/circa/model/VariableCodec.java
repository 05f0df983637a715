package dev.circa.model;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.Arrays;
import java.util.List;

/**
 * Turns named values into the engine's cells and back: a real is a finite number, a count a
 * non-negative integer, a categorical or binary value a state label or a state index (a binary one also
 * a boolean); {@code null} and NaN are missing. Immutable; lookups allocate nothing.
 */
final class VariableCodec {
    /** Largest count that a double holds exactly. */
    private static final double MAX_EXACT = 9007199254740992.0;
    /**
     * Most names and labels of a model interned at load, so that literals are found by reference: interning
     * costs about 3 microseconds a name (2.9 s for 10^6 names, measured), so a model of more keeps its own.
     */
    private static final int MAX_INTERNED = 4096;
    private static final byte REAL = 0;
    private static final byte COUNT = 1;
    /** Categorical or binary: a state index below {@link #stateCounts}. */
    private static final byte STATES = 2;

    private final List<Variable> variables;
    private final String[] names;
    private final NameTable index;
    private final NameTable[] labels;
    private final byte[] kinds;
    private final int[] stateCounts;
    private final boolean[] binary;

    VariableCodec(List<Variable> variables) {
        int n = variables.size();
        this.variables = variables;
        this.names = new String[n];
        this.labels = new NameTable[n];
        this.kinds = new byte[n];
        this.stateCounts = new int[n];
        this.binary = new boolean[n];
        long all = n;
        for (Variable var : variables) {
            all += var.states().size();
        }
        boolean intern = all <= MAX_INTERNED;
        for (int v = 0; v < n; v++) {
            Variable var = variables.get(v);
            // interned: a map filled with string literals finds the name by reference, as the table does
            names[v] = intern ? var.name().intern() : var.name();
            labels[v] = var.states().isEmpty() ? NameTable.EMPTY : new NameTable(var.states(), intern);
            kinds[v] = switch (var.type()) {
                case REAL -> REAL;
                case COUNT -> COUNT;
                default -> STATES;
            };
            stateCounts[v] = var.stateCount();
            binary[v] = var.type() == VariableType.BINARY;
        }
        this.index = new NameTable(Arrays.asList(names), false);
    }

    int count() {
        return names.length;
    }

    /** The name of variable {@code v}. */
    String name(int v) {
        return names[v];
    }

    /** The index of the variable named {@code name}; IllegalArgumentException naming the variables when none. */
    int indexOf(String name) {
        int i = index.find(name);
        if (i < 0) {
            throw new IllegalArgumentException("\"" + name + "\" is not a variable of this model; expected one of "
                    + String.join(", ", names));
        }
        return i;
    }

    /** The index of {@code name}, or -1. */
    int find(String name) {
        return index.find(name);
    }

    /** The cell of {@code value} (a Number, a String label, a Boolean, or null for missing) for variable {@code v}. */
    double encode(int v, Object value) {
        if (value == null) {
            return Double.NaN;
        }
        // Double first: the common case, one class compare
        if (value instanceof Double d) {
            return number(v, d.doubleValue());
        }
        if (value instanceof String s) {
            return label(v, s);
        }
        if (value instanceof Number n) {
            return number(v, n.doubleValue());
        }
        if (value instanceof Boolean b && binary[v]) {
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
        boolean ok;
        switch (kinds[v]) {
            case REAL:
                ok = Double.isFinite(x);
                break;
            case COUNT:
                // within [0, 2^53] a double is a whole number exactly when the cast to long keeps it
                ok = x >= 0 && x <= MAX_EXACT && (long) x == x;
                break;
            default:
                ok = x >= 0 && x < stateCounts[v] && (int) x == x;
        }
        if (!ok) {
            throw new IllegalArgumentException(describe(v) + ": " + x + " is not a value; expected " + expected(v));
        }
        return x + 0.0;
    }

    /** The state index of {@code label} for variable {@code v}. */
    double label(int v, String label) {
        int s = labels[v].find(label);
        if (s < 0) {
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
