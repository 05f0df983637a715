package dev.circa.model;

import dev.circa.validator.Property;
import dev.circa.validator.ValidationOptions;
import java.util.Collections;
import java.util.EnumSet;
import java.util.Locale;
import java.util.Set;

/**
 * What must be proven about a circuit before a {@link Model} serves it ("fit to serve"). The defaults,
 * listed once here ({@link #DEFAULT}):
 * <ul>
 *   <li>properties: smooth and decomposable, which make marginals (missing values) and conditionals
 *       exact in one or two passes; deterministic (exact MPE), normalized and structured-decomposable
 *       can be added;</li>
 *   <li>tolerance 1e-9 on |sum of weights - 1|, |sum of probabilities - 1| and |log Z|
 *       (the validator's {@code --tolerance});</li>
 *   <li>at most 65,536 assignments enumerated to decide one sum's determinism
 *       ({@code --max-enumeration});</li>
 *   <li>embedded check cases not run (they are regression evidence for {@code circa check}).</li>
 * </ul>
 * Unless normalized is required, weights or probabilities that do not add to 1 are warnings in the
 * report, not errors: the model then serves the unnormalised circuit's values ({@link Model#normalized()}
 * says which). A required property that the validator finds false or cannot prove is an error.
 *
 * @param properties the properties that must be proven true
 * @param tolerance the bound on normalisation errors, finite and at least 0
 * @param maxEnumeration the largest number of assignments enumerated per sum, at least 1
 * @param embeddedChecks whether the document's embedded check cases must pass as well
 */
public record Requirement(Set<Property> properties, double tolerance, int maxEnumeration, boolean embeddedChecks) {
    /** Smooth and decomposable, tolerance 1e-9, enumeration bound 65,536, embedded checks not run. */
    public static final Requirement DEFAULT = new Requirement(EnumSet.of(Property.SMOOTH, Property.DECOMPOSABLE),
            ValidationOptions.DEFAULT_TOLERANCE, ValidationOptions.DEFAULT_MAX_ENUMERATION, false);

    /**
     * Checks and copies the fields.
     *
     * @param properties the properties that must be proven true
     * @param tolerance the bound on normalisation errors
     * @param maxEnumeration the largest number of assignments enumerated per sum
     * @param embeddedChecks whether the embedded check cases must pass
     * @throws IllegalArgumentException when the tolerance is negative or not finite, or the bound below 1
     */
    public Requirement {
        properties = properties.isEmpty() ? Collections.unmodifiableSet(EnumSet.noneOf(Property.class))
                : Collections.unmodifiableSet(EnumSet.copyOf(properties));
        if (!(tolerance >= 0) || Double.isInfinite(tolerance)) {
            throw new IllegalArgumentException(String.format(Locale.ROOT,
                    "the tolerance must be a finite number >= 0, found %s", tolerance));
        }
        if (maxEnumeration < 1) {
            throw new IllegalArgumentException("the enumeration bound must be at least 1, found " + maxEnumeration);
        }
    }

    /**
     * The default requirement with {@code more} properties required as well.
     *
     * @param more the properties to add, e.g. {@link Property#DETERMINISTIC}
     * @return a new requirement
     */
    public static Requirement also(Property... more) {
        return DEFAULT.and(more);
    }

    /**
     * The default requirement with exactly the properties named in {@code list}, comma-separated as the
     * command line's {@code --require} takes them (e.g. {@code "smooth,decomposable,deterministic"}).
     *
     * @param list the property names; empty requires none
     * @return a new requirement
     * @throws IllegalArgumentException on an unknown name
     */
    public static Requirement parse(String list) {
        EnumSet<Property> set = EnumSet.noneOf(Property.class);
        for (String part : list.split(",")) {
            if (!part.isBlank()) {
                set.add(Property.fromName(part));
            }
        }
        return DEFAULT.withProperties(set);
    }

    /**
     * This requirement with {@code more} properties required as well.
     *
     * @param more the properties to add
     * @return a new requirement
     */
    public Requirement and(Property... more) {
        EnumSet<Property> set = properties.isEmpty() ? EnumSet.noneOf(Property.class) : EnumSet.copyOf(properties);
        Collections.addAll(set, more);
        return new Requirement(set, tolerance, maxEnumeration, embeddedChecks);
    }

    /**
     * This requirement with exactly {@code set} required.
     *
     * @param set the properties
     * @return a new requirement
     */
    public Requirement withProperties(Set<Property> set) {
        return new Requirement(set, tolerance, maxEnumeration, embeddedChecks);
    }

    /**
     * This requirement with another tolerance.
     *
     * @param t the bound on normalisation errors
     * @return a new requirement
     */
    public Requirement withTolerance(double t) {
        return new Requirement(properties, t, maxEnumeration, embeddedChecks);
    }

    /**
     * This requirement with another enumeration bound.
     *
     * @param n the largest number of assignments enumerated per sum
     * @return a new requirement
     */
    public Requirement withMaxEnumeration(int n) {
        return new Requirement(properties, tolerance, n, embeddedChecks);
    }

    /**
     * This requirement with embedded check cases run or not.
     *
     * @param run whether the document's check cases must pass
     * @return a new requirement
     */
    public Requirement withEmbeddedChecks(boolean run) {
        return new Requirement(properties, tolerance, maxEnumeration, run);
    }

    /**
     * Whether {@code p} is required.
     *
     * @param p a property
     * @return true when it must be proven
     */
    public boolean requires(Property p) {
        return properties.contains(p);
    }

    /**
     * The validator settings that prove this requirement.
     *
     * @return the options of one validation
     */
    public ValidationOptions validationOptions() {
        ValidationOptions o = ValidationOptions.defaults().withRequire(properties).withTolerance(tolerance)
                .withMaxEnumeration(maxEnumeration);
        if (!embeddedChecks) {
            o = o.withRule("CheckCaseFailed:off");
        }
        if (!requires(Property.NORMALIZED)) {
            o = o.withRule("WeightsNotNormalized:warn").withRule("ProbabilitiesNotNormalized:warn");
        }
        return o;
    }
}
