package dev.circa.validator.rules;

import dev.circa.validator.Severity;

/** A check of the validator; its metadata is the {@link RuleInfo} on its class. */
public abstract class Rule {
    private final RuleInfo info;
    /** The id and severity, read once: rules ask for them per finding, and an annotation answers slowly. */
    private final String id;
    private final Severity severity;

    protected Rule() {
        info = getClass().getAnnotation(RuleInfo.class);
        if (info == null) {
            throw new IllegalStateException(getClass().getName() + " has no @RuleInfo");
        }
        id = info.id();
        severity = info.severity();
    }

    /** Stable id, also the diagnostic code. */
    public final String id() {
        return id;
    }

    /** One-line summary without a final period. */
    public final String summary() {
        return info.summary();
    }

    /** Default severity. */
    public final Severity severity() {
        return severity;
    }

    /** What the rule guards. */
    public final Aspect guards() {
        return info.guards();
    }

    /** Reports this rule's findings on the circuit of {@code ctx}. */
    public abstract void check(RuleContext ctx);
}
