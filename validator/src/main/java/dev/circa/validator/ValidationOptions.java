package dev.circa.validator;

import dev.circa.validator.rules.Rules;
import java.util.Collections;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * The settings of one validation: {@code --require}, {@code --tolerance}, {@code --max-enumeration}
 * and {@code --rule CODE:off|warn|error}. Immutable; the {@code with...} methods return a copy.
 *
 * @param require properties that must be proven true (default smooth, decomposable, normalized)
 * @param tolerance bound on |sum of weights - 1|, |sum of probabilities - 1| and |log Z| (default 1e-9)
 * @param maxEnumeration most assignments enumerated to decide one sum's determinism (default 65,536)
 * @param ruleSettings severity overrides keyed by rule code
 */
public record ValidationOptions(Set<Property> require, double tolerance, int maxEnumeration,
        Map<String, RuleSetting> ruleSettings) {
    /** Default of {@code --tolerance}. */
    public static final double DEFAULT_TOLERANCE = 1e-9;
    /** Default of {@code --max-enumeration}. */
    public static final int DEFAULT_MAX_ENUMERATION = 65_536;

    public ValidationOptions {
        require = require.isEmpty() ? Collections.unmodifiableSet(EnumSet.noneOf(Property.class))
                : Collections.unmodifiableSet(EnumSet.copyOf(require));
        ruleSettings = Collections.unmodifiableMap(new LinkedHashMap<>(ruleSettings));
        if (!(tolerance >= 0) || Double.isInfinite(tolerance)) {
            throw new IllegalArgumentException(String.format(Locale.ROOT,
                    "--tolerance must be a finite number >= 0, found %s", tolerance));
        }
        if (maxEnumeration < 1) {
            throw new IllegalArgumentException("--max-enumeration must be at least 1, found " + maxEnumeration);
        }
    }

    /** The defaults of CLI.md. */
    public static ValidationOptions defaults() {
        return new ValidationOptions(EnumSet.of(Property.SMOOTH, Property.DECOMPOSABLE, Property.NORMALIZED),
                DEFAULT_TOLERANCE, DEFAULT_MAX_ENUMERATION, Map.of());
    }

    /** A copy requiring exactly {@code properties}. */
    public ValidationOptions withRequire(Set<Property> properties) {
        return new ValidationOptions(properties, tolerance, maxEnumeration, ruleSettings);
    }

    /**
     * A copy requiring the comma-separated {@code list} of property names (as {@code --require}
     * takes them); an empty list requires nothing.
     *
     * @throws IllegalArgumentException on an unknown name
     */
    public ValidationOptions withRequire(String list) {
        EnumSet<Property> set = EnumSet.noneOf(Property.class);
        for (String part : list.split(",")) {
            if (!part.isBlank()) {
                set.add(Property.fromName(part));
            }
        }
        return withRequire(set);
    }

    /** A copy with another tolerance. */
    public ValidationOptions withTolerance(double t) {
        return new ValidationOptions(require, t, maxEnumeration, ruleSettings);
    }

    /** A copy with another enumeration bound. */
    public ValidationOptions withMaxEnumeration(int n) {
        return new ValidationOptions(require, tolerance, n, ruleSettings);
    }

    /** A copy in which rule {@code code} has {@code setting}. */
    public ValidationOptions withRule(String code, RuleSetting setting) {
        if (Rules.byId(code) == null) {
            throw new IllegalArgumentException("unknown rule \"" + code + "\" in --rule; expected one of "
                    + String.join(", ", Rules.ids()));
        }
        Map<String, RuleSetting> m = new LinkedHashMap<>(ruleSettings);
        m.put(code, setting);
        return new ValidationOptions(require, tolerance, maxEnumeration, m);
    }

    /**
     * A copy with one {@code --rule} value applied, {@code CODE:off}, {@code CODE:warn} or {@code CODE:error}.
     *
     * @throws IllegalArgumentException on a malformed value or an unknown code
     */
    public ValidationOptions withRule(String spec) {
        int colon = spec.lastIndexOf(':');
        if (colon <= 0) {
            throw new IllegalArgumentException("--rule expects CODE:off|warn|error, found \"" + spec + "\"");
        }
        return withRule(spec.substring(0, colon).trim(), RuleSetting.fromName(spec.substring(colon + 1)));
    }
}
