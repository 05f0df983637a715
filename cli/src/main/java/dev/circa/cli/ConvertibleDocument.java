package dev.circa.cli;

import dev.circa.format.io.DocumentKind;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import java.nio.file.Path;

/**
 * Turns the failure of reading a region graph or a mixture document as a circuit into a message that
 * says what the file is and that {@code circa convert} takes it, for every command that reads a circuit.
 */
final class ConvertibleDocument {
    private ConvertibleDocument() {
    }

    /** {@code failure} rephrased when {@code file} is a region graph or a mixture document, else {@code failure} itself. */
    static FormatException explain(Path file, FormatException failure, ReadLimits limits) {
        boolean atFormat = "/format".equals(failure.pointer());
        DocumentKind kind;
        try {
            kind = DocumentKind.detect(file, limits);
            if (kind == DocumentKind.MIXTURE && !atFormat) {
                // YAML: only a document that reads as a mixture is called one
                MixtureReader.read(file, limits);
            }
        } catch (FormatException | RuntimeException e) {
            return failure;
        }
        if (kind == DocumentKind.CIRCUIT) {
            return failure;
        }
        String what = kind == DocumentKind.REGIONS ? "a region graph" : "a mixture document";
        String name = failure.file() != null ? failure.file() : file.toString();
        FormatException e = new FormatException(name, atFormat ? failure.line() : 0, atFormat ? failure.column() : 0,
                null, what + " (format \"" + kind.format() + "\"), not a circuit; circa convert compiles it into one: "
                        + "circa convert " + file + " -o OUT.json");
        e.initCause(failure);
        return e;
    }
}
