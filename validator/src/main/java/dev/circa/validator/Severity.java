package dev.circa.validator;

import java.util.Locale;

/** How serious a {@link Diagnostic} is; an {@link #ERROR} makes the model invalid. */
public enum Severity {
    /** The model is invalid (exit status 1). */
    ERROR,
    /** Something suspicious that does not make the model invalid. */
    WARNING,
    /** A fact worth knowing, such as a property that is false but not required. */
    INFO;

    /** The lower-case name used in reports: {@code error}, {@code warning}, {@code info}. */
    public String jsonName() {
        return name().toLowerCase(Locale.ROOT);
    }
}
