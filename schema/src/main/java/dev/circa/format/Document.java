package dev.circa.format;

import java.util.List;
import tools.jackson.databind.JsonNode;

/**
 * What the three document kinds (circuit, region graph, mixture) have in common: their {@link Header},
 * with its members as accessors, the reader's findings and the file read.
 */
public interface Document {
    /** The shared members. */
    Header header();

    /** The document's {@code version}, e.g. {@code "1.0"}. */
    default String version() {
        return header().version();
    }

    /** Optional name, or {@code null}. */
    default String name() {
        return header().name();
    }

    /** Optional description, or {@code null}. */
    default String description() {
        return header().description();
    }

    /** Optional provenance, or {@code null}. */
    default Provenance provenance() {
        return header().provenance();
    }

    /** The variables, by index. */
    default List<Variable> variables() {
        return header().variables();
    }

    /** The free-form {@code extensions} object, or {@code null}. */
    default JsonNode extensions() {
        return header().extensions();
    }

    /** Things the reader noticed that did not stop it (unknown properties). */
    default List<ReadFinding> findings() {
        return header().findings();
    }

    /** The file the document was read from (for messages), or {@code null}. */
    default String source() {
        return header().source();
    }
}
