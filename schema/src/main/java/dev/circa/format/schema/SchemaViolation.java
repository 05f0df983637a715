package dev.circa.format.schema;

/**
 * One way in which a document breaks its JSON Schema.
 *
 * @param pointer JSON pointer of the offending value ({@code ""} for the root); for a property that is
 *     not allowed, the pointer of that property; for a missing one, the pointer of its object
 * @param keyword the schema keyword that failed, e.g. {@code "required"}, {@code "minimum"}
 * @param message what is wrong, in words
 */
public record SchemaViolation(String pointer, String keyword, String message) {
}
