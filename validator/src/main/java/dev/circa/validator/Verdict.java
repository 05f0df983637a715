package dev.circa.validator;

/** The value of a property in a {@link ValidationReport}: proven true, proven false, or not decided. */
public enum Verdict {
    TRUE,
    FALSE,
    UNKNOWN;

    /** {@code TRUE} or {@code FALSE} for a decided boolean. */
    public static Verdict of(boolean value) {
        return value ? TRUE : FALSE;
    }
}
