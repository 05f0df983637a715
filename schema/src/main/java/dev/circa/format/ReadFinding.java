package dev.circa.format;

/**
 * Something a reader noticed that does not stop it building the model, such as an unknown
 * property. The validator turns findings into diagnostics.
 *
 * @param kind what was noticed
 * @param message a sentence saying what was seen and what was expected
 * @param location where
 */
public record ReadFinding(Kind kind, String message, SourceLocation location) {
    /** The kinds of finding. */
    public enum Kind {
        /** A property the format does not define, outside {@code extensions}, in a document of a known version. */
        UNKNOWN_PROPERTY,
        /** A property the format does not define, in a document of a newer minor version (ignored). */
        UNKNOWN_PROPERTY_NEWER_MINOR
    }
}
