package dev.circa.validator.rules;

import dev.circa.validator.Severity;

/** A check of the validator; its metadata is the {@link RuleInfo} on its class. */
public abstract class Rule {
    private final RuleInfo info;

    protected Rule() {
        info = getClass().getAnnotation(RuleInfo.class);
        if (info == null) {
            throw new IllegalStateException(getClass().getName() + " has no @RuleInfo");
        }
    }

    /** Stable id, also the diagnostic code. */
    public final String id() {
        return info.id();
    }

    /** One-line summary without a final period. */
    public final String summary() {
        return info.summary();
    }

    /** Default severity. */
    public final Severity severity() {
        return info.severity();
    }

    /** What the rule guards. */
    public final Aspect guards() {
        return info.guards();
    }

    /** Reports this rule's findings on the circuit of {@code ctx}. */
    public abstract void check(RuleContext ctx);
}
