package dev.circa.format.io;

import java.io.ByteArrayInputStream;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

/**
 * What the readers of the JSON document kinds share: their limits and the three ways to open an input
 * (a path, a stream, a string). A reader says only how to read a document from an opened
 * {@link JsonInput}. Instances hold only their limits and are safe to share between threads.
 *
 * @param <T> the document kind
 */
public abstract class JsonDocumentReader<T> {
    private final ReadLimits limits;

    protected JsonDocumentReader(ReadLimits limits) {
        this.limits = limits;
    }

    /** The limits this reader reads under. */
    protected final ReadLimits limits() {
        return limits;
    }

    /** Reads {@code path} ({@code .gz} decompressed, {@code -} for standard input). */
    public T read(Path path) throws FormatException {
        try (JsonInput in = JsonInput.openJson(path, limits)) {
            return read(in);
        }
    }

    /** Reads from {@code stream}; {@code file} names it in messages. */
    public final T read(InputStream stream, String file) throws FormatException {
        try (JsonInput in = JsonInput.fromStream(stream, file, limits)) {
            return read(in);
        }
    }

    /** Reads a document from text (tests, small inputs). */
    public final T readString(String json, String file) throws FormatException {
        return read(new ByteArrayInputStream(json.getBytes(StandardCharsets.UTF_8)), file);
    }

    /** Reads one document from {@code in}, which the caller closes. */
    protected abstract T read(JsonInput in) throws FormatException;
}
