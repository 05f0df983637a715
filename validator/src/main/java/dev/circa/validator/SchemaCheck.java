package dev.circa.validator;

import java.util.List;
import tools.jackson.databind.JsonNode;

/**
 * Conformance of a whole document tree to the bundled circuit schema. The validator only calls it;
 * the schema itself lives with the format.
 */
@FunctionalInterface
public interface SchemaCheck {
    /** No schema: reports nothing. */
    SchemaCheck NONE = doc -> List.of();

    /** Every violation of the bundled schema by {@code document}, in document order. */
    List<SchemaFinding> check(JsonNode document);
}
