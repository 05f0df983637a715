package dev.circa.validator;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.format.schema.SchemaViolation;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.List;

/**
 * Conformance of a circuit document's text to a JSON Schema. The validator only calls it; the
 * schema itself lives with the format ({@link SchemaCatalog}).
 */
@FunctionalInterface
public interface SchemaCheck {
    /** No schema: reports nothing. */
    SchemaCheck NONE = (in, file, limits) -> List.of();

    /**
     * The bundled circuit schema, checked in one streaming pass holding one node at a time (never a
     * schema the document names).
     */
    SchemaCheck BUNDLED = (in, file, limits) -> {
        List<SchemaFinding> out = new ArrayList<>();
        for (SchemaViolation v : SchemaCatalog.get().validateCircuit(in, file, limits)) {
            out.add(new SchemaFinding(v.pointer(), v.keyword(), v.message()));
        }
        return out;
    };

    /**
     * Every violation of the schema by the document in {@code in}, in document order.
     *
     * @param file names the input in messages
     * @throws FormatException when the text is not JSON or a read limit is hit
     */
    List<SchemaFinding> check(InputStream in, String file, ReadLimits limits) throws FormatException;
}
