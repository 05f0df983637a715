package dev.circa.format;

import java.util.List;
import tools.jackson.databind.JsonNode;

/**
 * The members every document kind shares (FORMAT.md: circuit, region graph, mixture): {@code version},
 * {@code name}, {@code description}, {@code provenance}, {@code variables} and {@code extensions}, with
 * what every reader keeps beside them: its findings and the file it read. Immutable and safe to share
 * between threads.
 */
public final class Header {
    private final String version;
    private final String name;
    private final String description;
    private final Provenance provenance;
    private final List<Variable> variables;
    private final JsonNode extensions;
    private final List<ReadFinding> findings;
    private final String source;

    private Header(Setters<?> b) {
        this.version = b.version;
        this.name = b.name;
        this.description = b.description;
        this.provenance = b.provenance;
        this.variables = List.copyOf(b.variables);
        this.extensions = b.extensions;
        this.findings = List.copyOf(b.findings);
        this.source = b.source;
    }

    /** A builder for a header on its own (readers, tests). */
    public static Builder builder() {
        return new Builder();
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

    /** The free-form {@code extensions} object, or {@code null}. */
    public JsonNode extensions() {
        return extensions;
    }

    /** Things the reader noticed that did not stop it (unknown properties). */
    public List<ReadFinding> findings() {
        return findings;
    }

    /** The file the document was read from (for messages), or {@code null}. */
    public String source() {
        return source;
    }

    /**
     * The header's setters, shared by the builder of every document kind. Not thread-safe.
     *
     * @param <B> the builder that extends it, returned by each setter
     */
    public abstract static class Setters<B extends Setters<B>> {
        private String version = "1.0";
        private String name;
        private String description;
        private Provenance provenance;
        private List<Variable> variables = List.of();
        private JsonNode extensions;
        private List<ReadFinding> findings = List.of();
        private String source;

        protected Setters() {
        }

        @SuppressWarnings("unchecked")
        private B self() {
            return (B) this;
        }

        public B version(String v) {
            this.version = v;
            return self();
        }

        public B name(String v) {
            this.name = v;
            return self();
        }

        public B description(String v) {
            this.description = v;
            return self();
        }

        public B provenance(Provenance v) {
            this.provenance = v;
            return self();
        }

        public B variables(List<Variable> v) {
            this.variables = v;
            return self();
        }

        public B extensions(JsonNode v) {
            this.extensions = v;
            return self();
        }

        public B findings(List<ReadFinding> v) {
            this.findings = v;
            return self();
        }

        public B source(String v) {
            this.source = v;
            return self();
        }

        /** The header set so far. */
        public Header header() {
            return new Header(this);
        }
    }

    /** Builds a {@link Header}. Not thread-safe. */
    public static final class Builder extends Setters<Builder> {
        private Builder() {
        }

        public Header build() {
            return header();
        }
    }
}
