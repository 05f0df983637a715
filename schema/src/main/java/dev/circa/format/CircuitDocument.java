package dev.circa.format;

import java.util.List;

/**
 * A circuit document (FORMAT.md section 2) as read, before any validation: node ids, child
 * references and variable indices are kept as written, so a validator can report what is wrong
 * with them. {@link #nodeLocation(int)} gives where each node starts in the source. The nodes are
 * held in flat columns ({@link #nodeTable()}); {@link #nodes()} shows them as records.
 *
 * <p>Instances are immutable once built and safe to share between threads.
 */
public final class CircuitDocument implements Document {
    /** The value of {@code format} for a circuit. */
    public static final String FORMAT = "circa.circuit";

    private final Header header;
    private final NodeTable table;
    private final List<Node> nodes;
    private final List<Output> outputs;
    private final Checks checks;
    private final NodeLocations nodeLocations;
    private final DocumentLocations locations;

    private CircuitDocument(Builder b) {
        this.header = b.header();
        this.table = b.table != null ? b.table : NodeTable.of(b.nodes);
        this.nodes = table.nodes();
        this.outputs = List.copyOf(b.outputs);
        this.checks = b.checks;
        this.nodeLocations = b.nodeLocations == null ? NodeLocations.NONE : b.nodeLocations;
        this.locations = b.locations == null ? DocumentLocations.NONE : b.locations;
    }

    /** A builder for documents made in code (converters, tests). */
    public static Builder builder() {
        return new Builder();
    }

    @Override
    public Header header() {
        return header;
    }

    /**
     * The nodes in document order, as records made on each access (their arrays are copies): fine
     * for a node at a time; passes over a large circuit read {@link #nodeTable()}.
     */
    public List<Node> nodes() {
        return nodes;
    }

    /** The nodes in flat columns. */
    public NodeTable nodeTable() {
        return table;
    }

    /** The outputs in document order. */
    public List<Output> outputs() {
        return outputs;
    }

    /** The embedded checks, or {@code null}. */
    public Checks checks() {
        return checks;
    }

    /** Where node {@code index} (its position in {@link #nodes()}) starts: pointer {@code /nodes/INDEX}. */
    public SourceLocation nodeLocation(int index) {
        return new SourceLocation("/nodes/" + index, nodeLocations.line(index), nodeLocations.column(index));
    }

    /** Where the member at {@code pointer} (other than a node) starts, when the reader recorded it. */
    public SourceLocation location(String pointer) {
        return locations.get(pointer);
    }

    /** Total number of child references (duplicates counted). */
    public long edgeCount() {
        return table.edgeCount();
    }

    /** Builds a {@link CircuitDocument}. Not thread-safe. */
    public static final class Builder extends Header.Setters<Builder> {
        private List<Node> nodes = List.of();
        private NodeTable table;
        private List<Output> outputs = List.of();
        private Checks checks;
        private NodeLocations nodeLocations;
        private DocumentLocations locations;

        private Builder() {
        }

        public Builder nodes(List<Node> v) {
            this.nodes = v;
            this.table = null;
            return this;
        }

        /** The nodes as a table already built (readers). */
        public Builder nodeTable(NodeTable v) {
            this.table = v;
            return this;
        }

        public Builder outputs(List<Output> v) {
            this.outputs = v;
            return this;
        }

        public Builder checks(Checks v) {
            this.checks = v;
            return this;
        }

        public Builder nodeLocations(NodeLocations v) {
            this.nodeLocations = v;
            return this;
        }

        public Builder locations(DocumentLocations v) {
            this.locations = v;
            return this;
        }

        public CircuitDocument build() {
            return new CircuitDocument(this);
        }
    }
}
