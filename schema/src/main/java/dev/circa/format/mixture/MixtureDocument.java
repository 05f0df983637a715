package dev.circa.format.mixture;

import dev.circa.format.Document;
import dev.circa.format.Header;
import dev.circa.format.ReadFinding;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
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
    private final List<ReadFinding> findings;
    private final String source;

    /**
     * @param header version, name, description, provenance and variables
     * @param definitions by name, in document order
     * @param findings unknown properties ignored in a document of a newer minor version
     * @param source the file it was read from, or {@code null}
     */
    public MixtureDocument(Header header, Map<String, Definition> definitions, Expression model,
            List<ReadFinding> findings, String source) {
        this.header = header;
        this.definitions = Collections.unmodifiableMap(new LinkedHashMap<>(definitions));
        this.model = model;
        this.findings = List.copyOf(findings);
        this.source = source;
    }

    @Override
    public Header header() {
        return header;
    }

    /** Unknown properties that were ignored (only in a document of a newer minor version). */
    @Override
    public List<ReadFinding> findings() {
        return findings;
    }

    @Override
    public String source() {
        return source;
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
