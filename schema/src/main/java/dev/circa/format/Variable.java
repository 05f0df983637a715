package dev.circa.format;

import java.util.List;

/**
 * A variable of a document, referred to by its 0-based index.
 *
 * @param name unique, non-empty
 * @param type what values it takes
 * @param states state labels ({@code categorical}: at least two; {@code binary}: optional, two); empty when absent
 * @param unit optional unit, or {@code null}
 * @param description optional description, or {@code null}
 */
public record Variable(String name, VariableType type, List<String> states, String unit, String description) {
    public Variable {
        states = states == null ? List.of() : List.copyOf(states);
    }

    /** A variable without labels, unit or description. */
    public static Variable of(String name, VariableType type) {
        return new Variable(name, type, List.of(), null, null);
    }

    /** Number of states of a categorical or binary variable (2 for binary), or 0 for other types. */
    public int stateCount() {
        return switch (type) {
            case CATEGORICAL -> states.size();
            case BINARY -> 2;
            default -> 0;
        };
    }

    /** The index of the state labelled {@code label}, or -1. */
    public int stateIndex(String label) {
        return states.indexOf(label);
    }
}
