package dev.circa.validator;

/** The value of a property in a {@link ValidationReport}: proven true, proven false, or not decided. */
public enum Verdict {
    /** Proven true. */
    TRUE,
    /** Proven false; a diagnostic names a node that breaks it. */
    FALSE,
    /** Neither proven nor refuted (shown as {@code "unknown"}). */
    UNKNOWN;

    /** {@code TRUE} or {@code FALSE} for a decided boolean. */
    public static Verdict of(boolean value) {
        return value ? TRUE : FALSE;
    }
}
