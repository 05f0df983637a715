package dev.circa.validator.rules;

import dev.circa.validator.Property;

/** What a rule guards: a part of the document's validity or one of the {@link Property properties}. */
public enum Aspect {
    DOCUMENT(null),
    REFERENCES(null),
    PARAMETERS(null),
    SMOOTH(Property.SMOOTH),
    DECOMPOSABLE(Property.DECOMPOSABLE),
    DETERMINISTIC(Property.DETERMINISTIC),
    STRUCTURED_DECOMPOSABLE(Property.STRUCTURED_DECOMPOSABLE),
    NORMALIZED(Property.NORMALIZED),
    CHECKS(null),
    PROPERTIES(null);

    private final Property property;

    Aspect(Property property) {
        this.property = property;
    }

    /** The property guarded, or {@code null} for the other aspects. */
    public Property property() {
        return property;
    }
}
