package dev.circa.validator;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.IoMessages;
import dev.circa.format.schema.SchemaCatalog;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
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
     * The bundled circuit schema, checked streaming, holding one node at a time (never a schema the
     * document names); a file is read a second time only for the nodes the first look cannot vouch for
     * ({@link SchemaCatalog#validateCircuit(Path, ReadLimits)}).
     */
    SchemaCheck BUNDLED = new BundledSchemaCheck();

    /**
     * Every violation of the schema by the document in {@code in}, in document order.
     *
     * @param file names the input in messages
     * @throws FormatException when the text is not JSON or a read limit is hit
     */
    List<SchemaFinding> check(InputStream in, String file, ReadLimits limits) throws FormatException;

    /**
     * Every violation of the schema by the document in {@code file} ({@code .gz} decompressed, {@code -}
     * for standard input), in document order; by default {@link #check(InputStream, String, ReadLimits)}
     * on the file's text.
     */
    default List<SchemaFinding> check(Path file, ReadLimits limits) throws FormatException {
        String name = InputFiles.displayName(file);
        try (InputStream in = InputFiles.open(file, limits.maxBytes())) {
            return check(in, name, limits);
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(name, 0, 0, null, "cannot be read: " + IoMessages.of(e));
        }
    }
}
