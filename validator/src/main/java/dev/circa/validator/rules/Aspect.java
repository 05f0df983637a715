package dev.circa.validator.rules;

import dev.circa.validator.Property;

/** What a rule guards: a part of the document's validity or one of the {@link Property properties}. */
public enum Aspect {
    /** Schema conformance and known members. */
    DOCUMENT(null),
    /** Ids, children-first order, outputs, variable indices and types. */
    REFERENCES(null),
    /** Input parameters and weights. */
    PARAMETERS(null),
    /** {@link Property#SMOOTH}. */
    SMOOTH(Property.SMOOTH),
    /** {@link Property#DECOMPOSABLE}. */
    DECOMPOSABLE(Property.DECOMPOSABLE),
    /** {@link Property#DETERMINISTIC}. */
    DETERMINISTIC(Property.DETERMINISTIC),
    /** {@link Property#STRUCTURED_DECOMPOSABLE}. */
    STRUCTURED_DECOMPOSABLE(Property.STRUCTURED_DECOMPOSABLE),
    /** {@link Property#NORMALIZED}. */
    NORMALIZED(Property.NORMALIZED),
    /** The embedded check cases. */
    CHECKS(null),
    /** The {@code --require} list as a whole. */
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
