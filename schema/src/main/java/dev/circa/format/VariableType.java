package dev.circa.format;

import java.util.Locale;

/** The type of a variable: what values it takes (FORMAT.md section 1). */
public enum VariableType {
    /** A real number. */
    REAL,
    /** 0 or 1, optionally with two state labels. */
    BINARY,
    /** A state index into the variable's labels (at least two). */
    CATEGORICAL,
    /** A non-negative integer. */
    COUNT;

    /** The name used in documents, e.g. {@code "real"}. */
    public String jsonName() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether values are discrete (masses rather than densities). */
    public boolean isDiscrete() {
        return this != REAL;
    }

    /** The type named {@code name} in a document, or {@code null} when there is none. */
    public static VariableType fromJsonName(String name) {
        for (VariableType t : values()) {
            if (t.jsonName().equals(name)) {
                return t;
            }
        }
        return null;
    }
}
