package dev.circa.validator;

import java.util.Locale;

/** The structural properties FORMAT.md defines, with their names in JSON reports and on the command line. */
public enum Property {
    /** Every sum's children have the same scope. */
    SMOOTH("smooth", "smooth"),
    /** Every product's children have pairwise disjoint scopes. */
    DECOMPOSABLE("decomposable", "decomposable"),
    /** At most one child of each sum is positive at every assignment, up to measure zero. */
    DETERMINISTIC("deterministic", "deterministic"),
    /** One variable tree fits every product. */
    STRUCTURED_DECOMPOSABLE("structuredDecomposable", "structured-decomposable"),
    /** Every output integrates (sums) to 1. */
    NORMALIZED("normalized", "normalized");

    private final String jsonName;
    private final String optionName;

    Property(String jsonName, String optionName) {
        this.jsonName = jsonName;
        this.optionName = optionName;
    }

    /** The camelCase key in JSON reports, e.g. {@code structuredDecomposable}. */
    public String jsonName() {
        return jsonName;
    }

    /** The kebab-case name used by {@code --require}, e.g. {@code structured-decomposable}. */
    public String optionName() {
        return optionName;
    }

    /**
     * The property named {@code name} (option or JSON spelling, any case).
     *
     * @throws IllegalArgumentException naming the accepted names when there is none
     */
    public static Property fromName(String name) {
        String n = name.trim();
        for (Property p : values()) {
            if (p.optionName.equalsIgnoreCase(n) || p.jsonName.equalsIgnoreCase(n)) {
                return p;
            }
        }
        throw new IllegalArgumentException(String.format(Locale.ROOT,
                "unknown property \"%s\"; expected one of smooth, decomposable, deterministic, "
                        + "structured-decomposable, normalized", name));
    }
}
