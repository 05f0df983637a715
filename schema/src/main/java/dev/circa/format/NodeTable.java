package dev.circa.format;

import java.util.AbstractList;
import java.util.Arrays;
import java.util.List;
import java.util.RandomAccess;

/**
 * A circuit's nodes in flat columns, one entry per node position: kind, id, family and flags in
 * primitive arrays, child ids and numbers (a sum's weights, an input's parameters) each in one
 * array shared by all nodes and sliced by start offsets, variable indices likewise. No object per
 * node and no boxed number: a 10^7-edge circuit costs its 10^7 child ids and weights and a few bytes
 * per node. {@link #nodes()} shows the same nodes as {@link Node} records, made on each access (for
 * code that reads a node at a time; large passes use the columns).
 *
 * <p>Instances are immutable once built and safe to share between threads.
 */
public final class NodeTable {
    /** {@link #kind(int)} of an input. */
    public static final byte INPUT = 0;
    /** {@link #kind(int)} of a product. */
    public static final byte PRODUCT = 1;
    /** {@link #kind(int)} of a sum. */
    public static final byte SUM = 2;

    private static final Family[] FAMILIES = Family.values();
    private static final byte LOG_FORM = 1;

    private final int size;
    private final byte[] kind;
    private final int[] id;
    private final byte[] family;
    private final byte[] flags;
    private final String[] labels;
    private final int[] childStart;
    private final int[] children;
    private final int[] valueStart;
    private final double[] values;
    private final int[] varStart;
    private final int[] vars;

    private NodeTable(Builder b) {
        size = b.size;
        kind = b.kind;
        id = b.id;
        family = b.family;
        flags = b.flags;
        labels = b.labels;
        childStart = b.childStart;
        children = b.children;
        valueStart = b.valueStart;
        values = b.values;
        varStart = b.varStart;
        vars = b.vars;
    }

    /** The table of {@code nodes} (documents built in code). */
    public static NodeTable of(List<? extends Node> nodes) {
        Builder b = new Builder();
        for (Node n : nodes) {
            b.add(n);
        }
        return b.build();
    }

    public int size() {
        return size;
    }

    /** {@link #INPUT}, {@link #PRODUCT} or {@link #SUM}. */
    public byte kind(int i) {
        return kind[i];
    }

    public int id(int i) {
        return id[i];
    }

    /** The label of node {@code i}, or {@code null}. */
    public String label(int i) {
        return labels == null ? null : labels[i];
    }

    /** The family of input {@code i}, {@code null} for products and sums. */
    public Family family(int i) {
        return family[i] == 0 ? null : FAMILIES[family[i] - 1];
    }

    /** Whether sum {@code i} has log-weights, or categorical {@code i} log-probabilities. */
    public boolean logForm(int i) {
        return (flags[i] & LOG_FORM) != 0;
    }

    /** The first position of node {@code i}'s child ids in {@link #childId(int)}. */
    public int childStart(int i) {
        return childStart[i];
    }

    /** One past the last position of node {@code i}'s child ids. */
    public int childEnd(int i) {
        return childStart[i + 1];
    }

    /** The child id at position {@code e} (see {@link #childStart(int)}). */
    public int childId(int e) {
        return children[e];
    }

    /** The first position of node {@code i}'s numbers (weights or parameters) in {@link #value(int)}. */
    public int valueStart(int i) {
        return valueStart[i];
    }

    /** One past the last position of node {@code i}'s numbers. */
    public int valueEnd(int i) {
        return valueStart[i + 1];
    }

    /** The number at position {@code k}: a weight (or log-weight) of a sum, a parameter of an input. */
    public double value(int k) {
        return values[k];
    }

    /** The first position of input {@code i}'s variable indices in {@link #var(int)}. */
    public int varStart(int i) {
        return varStart[i];
    }

    /** One past the last position of input {@code i}'s variable indices. */
    public int varEnd(int i) {
        return varStart[i + 1];
    }

    /** The variable index at position {@code k}. */
    public int var(int k) {
        return vars[k];
    }

    /** Total number of child references (duplicates counted). */
    public long edgeCount() {
        return size == 0 ? 0 : childStart[size];
    }

    /** Total number of numbers held (weights and parameters of all nodes). */
    public long valueCount() {
        return size == 0 ? 0 : valueStart[size];
    }

    /**
     * The bytes of the primitive columns this table holds (array capacities, headers not counted):
     * what a document's nodes cost in memory, to compare with what they contain.
     */
    public long retainedBytes() {
        long b = (long) kind.length + family.length + flags.length + 4L * id.length;
        b += 4L * (childStart.length + valueStart.length + varStart.length);
        b += 4L * children.length + 8L * values.length + 4L * vars.length;
        return b + (labels == null ? 0 : 4L * labels.length);
    }

    /** Node {@code i} as a record (its arrays are copies). */
    public Node node(int i) {
        int[] ch = Arrays.copyOfRange(children, childStart[i], childStart[i + 1]);
        double[] v = Arrays.copyOfRange(values, valueStart[i], valueStart[i + 1]);
        return switch (kind[i]) {
            case PRODUCT -> new ProductNode(id[i], label(i), ch);
            case SUM -> new SumNode(id[i], label(i), ch, v, logForm(i));
            default -> new InputNode(id[i], label(i), family(i), Arrays.copyOfRange(vars, varStart[i], varStart[i + 1]), v,
                    logForm(i));
        };
    }

    /** The nodes as records, each made when it is read. */
    public List<Node> nodes() {
        return new Records();
    }

    /** A read-only list view whose elements are made on access. */
    private final class Records extends AbstractList<Node> implements RandomAccess {
        @Override
        public Node get(int index) {
            if (index < 0 || index >= size) {
                throw new IndexOutOfBoundsException(index);
            }
            return node(index);
        }

        @Override
        public int size() {
            return size;
        }
    }

    /**
     * Builds a table node by node. A node's child ids and numbers may be appended while it is read
     * ({@link #appendChild}, {@link #appendValue}), then the node is closed with its kind; a reader that
     * abandons the document simply drops the builder. Columns grow by half their size, so building
     * costs at most the final size plus the largest column's growth step. Not thread-safe.
     */
    public static final class Builder {
        private int size;
        private byte[] kind = new byte[1024];
        private int[] id = new int[1024];
        private byte[] family = new byte[1024];
        private byte[] flags = new byte[1024];
        private String[] labels;
        private int[] childStart = new int[1025];
        private int[] children = new int[4096];
        private int edges;
        private int[] valueStart = new int[1025];
        private double[] values = new double[4096];
        private int valueCount;
        private int[] varStart = new int[1025];
        private int[] vars = new int[1024];
        private int varCount;

        /** Appends a child id to the node being read. */
        public void appendChild(int childId) {
            if (edges == children.length) {
                children = Arrays.copyOf(children, grow(edges));
            }
            children[edges++] = childId;
        }

        /** Appends a number (weight or parameter) to the node being read. */
        public void appendValue(double v) {
            if (valueCount == values.length) {
                values = Arrays.copyOf(values, grow(valueCount));
            }
            values[valueCount++] = v;
        }

        /** Appends a variable index to the node being read. */
        public void appendVar(int v) {
            if (varCount == vars.length) {
                vars = Arrays.copyOf(vars, grow(varCount));
            }
            vars[varCount++] = v;
        }

        /** The number of child ids appended so far, for all nodes. */
        public int childMark() {
            return edges;
        }

        /** The number of values appended so far, for all nodes. */
        public int valueMark() {
            return valueCount;
        }

        /** The number of variable indices appended so far, for all nodes. */
        public int varMark() {
            return varCount;
        }

        /** Drops what was appended after the marks (a member that turned out to belong elsewhere). */
        public void rewind(int childMark, int valueMark, int varMark) {
            edges = childMark;
            valueCount = valueMark;
            varCount = varMark;
        }

        /**
         * Closes the node being read: everything appended since the previous node closed belongs to it.
         *
         * @param f the family of an input, {@code null} otherwise
         * @param logForm log-weights of a sum, log-probabilities of a categorical
         */
        public void close(byte k, int nodeId, String label, Family f, boolean logForm) {
            if (size == kind.length) {
                int c = grow(size);
                kind = Arrays.copyOf(kind, c);
                id = Arrays.copyOf(id, c);
                family = Arrays.copyOf(family, c);
                flags = Arrays.copyOf(flags, c);
                childStart = Arrays.copyOf(childStart, c + 1);
                valueStart = Arrays.copyOf(valueStart, c + 1);
                varStart = Arrays.copyOf(varStart, c + 1);
                if (labels != null) {
                    labels = Arrays.copyOf(labels, c);
                }
            }
            if (label != null) {
                if (labels == null) {
                    labels = new String[kind.length];
                }
                labels[size] = label;
            }
            kind[size] = k;
            id[size] = nodeId;
            family[size] = f == null ? 0 : (byte) (f.ordinal() + 1);
            flags[size] = logForm ? LOG_FORM : 0;
            size++;
            childStart[size] = edges;
            valueStart[size] = valueCount;
            varStart[size] = varCount;
        }

        /** Appends {@code n} whole. */
        public void add(Node n) {
            for (int c : n.children()) {
                appendChild(c);
            }
            if (n instanceof InputNode in) {
                for (int v : in.vars()) {
                    appendVar(v);
                }
                for (double p : in.params()) {
                    appendValue(p);
                }
                close(INPUT, in.id(), in.label(), in.family(), in.logForm());
            } else if (n instanceof SumNode s) {
                for (double w : s.weights()) {
                    appendValue(w);
                }
                close(SUM, s.id(), s.label(), null, s.logWeights());
            } else {
                close(PRODUCT, n.id(), n.label(), null, false);
            }
        }

        public NodeTable build() {
            return new NodeTable(this);
        }

        private static int grow(int n) {
            long c = (long) n + Math.max(n >> 1, 16);
            if (c > Integer.MAX_VALUE - 8) {
                if (n >= Integer.MAX_VALUE - 8) {
                    throw new IllegalStateException("more than 2^31 entries in one column");
                }
                c = Integer.MAX_VALUE - 8;
            }
            return (int) c;
        }
    }
}
