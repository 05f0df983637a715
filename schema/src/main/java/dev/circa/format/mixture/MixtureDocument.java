package dev.circa.format.mixture;

import dev.circa.format.Document;
import dev.circa.format.Header;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A mixture document (FORMAT.md section 4) as read: named variables, named definitions and one
 * model expression, with every variable name, state label and {@code use} resolved. Whether the
 * model is decomposable, smooth, normalised and free of {@code use} cycles is not judged here.
 * Immutable and safe to share between threads.
 */
public final class MixtureDocument implements Document {
    /** The value of {@code format} for a mixture document. */
    public static final String FORMAT = "circa.mixture";

    private final Header header;
    private final Map<String, Definition> definitions;
    private final Expression model;

    /**
     * @param header version, name, description, provenance and variables; the findings (unknown
     *     properties ignored in a document of a newer minor version) and the file read, or {@code null}
     * @param definitions by name, in document order
     */
    public MixtureDocument(Header header, Map<String, Definition> definitions, Expression model) {
        this.header = header;
        this.definitions = Collections.unmodifiableMap(new LinkedHashMap<>(definitions));
        this.model = model;
    }

    @Override
    public Header header() {
        return header;
    }

    /** The definitions by name, in document order. */
    public Map<String, Definition> definitions() {
        return definitions;
    }

    /** The model expression. */
    public Expression model() {
        return model;
    }

}
