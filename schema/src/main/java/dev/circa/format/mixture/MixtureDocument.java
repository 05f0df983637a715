package dev.circa.format.mixture;

import dev.circa.format.Provenance;
import dev.circa.format.ReadFinding;
import dev.circa.format.Variable;
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
public final class MixtureDocument {
    /** The value of {@code format} for a mixture document. */
    public static final String FORMAT = "circa.mixture";

    private final String version;
    private final String name;
    private final String description;
    private final Provenance provenance;
    private final List<Variable> variables;
    private final Map<String, Definition> definitions;
    private final Expression model;
    private final List<ReadFinding> findings;
    private final String source;

    /**
     * @param definitions by name, in document order
     * @param findings unknown properties ignored in a document of a newer minor version
     * @param source the file it was read from, or {@code null}
     */
    public MixtureDocument(String version, String name, String description, Provenance provenance,
            List<Variable> variables, Map<String, Definition> definitions, Expression model,
            List<ReadFinding> findings, String source) {
        this.version = version;
        this.name = name;
        this.description = description;
        this.provenance = provenance;
        this.variables = List.copyOf(variables);
        this.definitions = Collections.unmodifiableMap(new LinkedHashMap<>(definitions));
        this.model = model;
        this.findings = List.copyOf(findings);
        this.source = source;
    }

    /** The document's {@code version}, e.g. {@code "1.0"}. */
    public String version() {
        return version;
    }

    /** Optional name, or {@code null}. */
    public String name() {
        return name;
    }

    /** Optional description, or {@code null}. */
    public String description() {
        return description;
    }

    /** Optional provenance, or {@code null}. */
    public Provenance provenance() {
        return provenance;
    }

    /** The variables, by index. */
    public List<Variable> variables() {
        return variables;
    }

    /** The definitions by name, in document order. */
    public Map<String, Definition> definitions() {
        return definitions;
    }

    /** The model expression. */
    public Expression model() {
        return model;
    }

    /** Unknown properties that were ignored (only in a document of a newer minor version). */
    public List<ReadFinding> findings() {
        return findings;
    }

    /** The file it was read from (for messages), or {@code null}. */
    public String source() {
        return source;
    }
}
