package dev.circa.validator;

/**
 * One way a document does not conform to the bundled JSON Schema.
 *
 * @param pointer JSON pointer of the instance, e.g. {@code /nodes/7/sd}
 * @param keyword the schema keyword that failed, e.g. {@code exclusiveMinimum}
 * @param message what the schema expected
 */
public record SchemaFinding(String pointer, String keyword, String message) {
}
