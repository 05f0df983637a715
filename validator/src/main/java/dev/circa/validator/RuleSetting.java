package dev.circa.validator;

import java.util.Locale;

/** What {@code --rule CODE:SETTING} does to a rule's diagnostics. */
public enum RuleSetting {
    /** Drop the rule's diagnostics. */
    OFF,
    /** Report the rule's diagnostics as warnings. */
    WARN,
    /** Report the rule's diagnostics as errors. */
    ERROR;

    /** The setting named {@code off}, {@code warn} or {@code error}. */
    public static RuleSetting fromName(String name) {
        return switch (name.trim().toLowerCase(Locale.ROOT)) {
            case "off" -> OFF;
            case "warn", "warning" -> WARN;
            case "error" -> ERROR;
            default -> throw new IllegalArgumentException(
                    "unknown rule setting \"" + name + "\"; expected off, warn or error");
        };
    }
}
