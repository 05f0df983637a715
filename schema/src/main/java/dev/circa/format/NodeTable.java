package dev.circa.format;

import java.util.AbstractList;
import java.util.Arrays;
import java.util.List;
import java.util.RandomAccess;

/**
 * A circuit's nodes in flat columns, one entry per node position: kind, id, family and flags in
 * primitive columns, child ids and numbers (a sum's weights, an input's parameters) each in one
 * column shared by all nodes and sliced by start offsets, variable indices likewise. No object per
 * node and no boxed number: a 10^7-edge circuit costs its 10^7 child ids and weights and a few bytes
 * per node. Each column is a list of blocks of just under 1 MiB ({@value #BLOCK_BYTES} bytes), so
 * that it grows without copying and never needs one huge array. The size is chosen for the collector:
 * in a heap of up to 2 GiB (1 MiB regions) such a block is allocated straight into the old generation
 * and a young collection never copies it: validating a 5 * 10^6-edge circuit under -Xmx512m spent
 * 0.9 s in collection pauses with blocks of 2^15 entries, about 0.05 s with blocks of this size. A
 * column's first block starts small and grows to the full size, so a small document costs little.
 * {@link #nodes()} shows the same nodes as {@link Node} records, made on each access (for code that
 * reads a node at a time; large passes use the columns).
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

    /** Bytes of a full block of a column: just under 1 MiB, header included. */
    static final int BLOCK_BYTES = (1 << 20) - 64;
    /** Entries per full block of an int column. */
    private static final int INTS = BLOCK_BYTES / 4;
    /** Entries per full block of a double column. */
    private static final int DOUBLES = BLOCK_BYTES / 8;
    /** Entries per full block of a byte column. */
    private static final int BYTES = BLOCK_BYTES;
    /** Entries of a column's first block before it grows. */
    private static final int FIRST = 1024;
    /** Labels (rare) in blocks of 2^15 references. */
    private static final int LABEL_SHIFT = 15;
    private static final int LABEL_BLOCK = 1 << LABEL_SHIFT;
    private static final int LABEL_MASK = LABEL_BLOCK - 1;
    private static final Family[] FAMILIES = Family.values();
    private static final byte LOG_FORM = 1;

    private final int size;
    private final byte[][] kind;
    private final int[][] id;
    private final byte[][] family;
    private final byte[][] flags;
    private final String[][] labels;
    private final int[][] childStart;
    private final int[][] children;
    private final int[][] valueStart;
    private final double[][] values;
    private final int[][] varStart;
    private final int[][] vars;
    private final long retained;

    private NodeTable(Builder b) {
        size = b.size;
        kind = b.kind.blocks();
        id = b.id.blocks();
        family = b.family.blocks();
        flags = b.flags.blocks();
        labels = b.labels;
        childStart = b.childStart.blocks();
        children = b.children.blocks();
        valueStart = b.valueStart.blocks();
        values = b.values.blocks();
        varStart = b.varStart.blocks();
        vars = b.vars.blocks();
        long r = entries(kind) + entries(family) + entries(flags);
        r += 4L * (entries(id) + entries(childStart) + entries(children) + entries(valueStart) + entries(varStart)
                + entries(vars));
        r += 8L * entries(values);
        retained = r + (labels == null ? 0 : 4L * LABEL_BLOCK * labels.length);
    }

    /** A copy of {@code t} with other numbers: every other column is shared (they are never written). */
    private NodeTable(NodeTable t, double[][] values) {
        size = t.size;
        kind = t.kind;
        id = t.id;
        family = t.family;
        flags = t.flags;
        labels = t.labels;
        childStart = t.childStart;
        children = t.children;
        valueStart = t.valueStart;
        this.values = values;
        varStart = t.varStart;
        vars = t.vars;
        retained = t.retained;
    }

    /** A node's number rewritten: {@code j} is its position among the node's numbers. */
    @FunctionalInterface
    public interface NumberRewrite {
        double apply(int node, int j, double number);
    }

    /**
     * The same nodes with every number (a sum's weights, an input's parameters) replaced by what
     * {@code rewrite} gives for it, node by node in order; ids, children, variables and labels are
     * shared with this table, so the copy costs only the new numbers.
     */
    public NodeTable withNumbers(NumberRewrite rewrite) {
        double[][] out = new double[values.length][];
        for (int b = 0; b < values.length; b++) {
            out[b] = new double[values[b].length];
        }
        for (int i = 0; i < size; i++) {
            int a = valueStart(i);
            int end = valueEnd(i);
            for (int k = a; k < end; k++) {
                out[k / DOUBLES][k % DOUBLES] = rewrite.apply(i, k - a, values[k / DOUBLES][k % DOUBLES]);
            }
        }
        return new NodeTable(this, out);
    }

    private static long entries(Object[] blocks) {
        long n = 0;
        for (Object b : blocks) {
            n += java.lang.reflect.Array.getLength(b);
        }
        return n;
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
        return kind[i / BYTES][i % BYTES];
    }

    public int id(int i) {
        return id[i / INTS][i % INTS];
    }

    /** The label of node {@code i}, or {@code null}. */
    public String label(int i) {
        return labels == null || labels[i >>> LABEL_SHIFT] == null ? null : labels[i >>> LABEL_SHIFT][i & LABEL_MASK];
    }

    /** The family of input {@code i}, {@code null} for products and sums. */
    public Family family(int i) {
        byte f = family[i / BYTES][i % BYTES];
        return f == 0 ? null : FAMILIES[f - 1];
    }

    /** Whether sum {@code i} has log-weights, or categorical {@code i} log-probabilities. */
    public boolean logForm(int i) {
        return (flags[i / BYTES][i % BYTES] & LOG_FORM) != 0;
    }

    /** The first position of node {@code i}'s child ids in {@link #childId(int)}. */
    public int childStart(int i) {
        return childStart[i / INTS][i % INTS];
    }

    /** One past the last position of node {@code i}'s child ids. */
    public int childEnd(int i) {
        return childStart(i + 1);
    }

    /** The child id at position {@code e} (see {@link #childStart(int)}). */
    public int childId(int e) {
        return children[e / INTS][e % INTS];
    }

    /** The first position of node {@code i}'s numbers (weights or parameters) in {@link #value(int)}. */
    public int valueStart(int i) {
        return valueStart[i / INTS][i % INTS];
    }

    /** One past the last position of node {@code i}'s numbers. */
    public int valueEnd(int i) {
        return valueStart(i + 1);
    }

    /** The number at position {@code k}: a weight (or log-weight) of a sum, a parameter of an input. */
    public double value(int k) {
        return values[k / DOUBLES][k % DOUBLES];
    }

    /** The first position of input {@code i}'s variable indices in {@link #var(int)}. */
    public int varStart(int i) {
        return varStart[i / INTS][i % INTS];
    }

    /** One past the last position of input {@code i}'s variable indices. */
    public int varEnd(int i) {
        return varStart(i + 1);
    }

    /** The variable index at position {@code k}. */
    public int var(int k) {
        return vars[k / INTS][k % INTS];
    }

    /** Total number of child references (duplicates counted). */
    public long edgeCount() {
        return childStart(size);
    }

    /** Total number of numbers held (weights and parameters of all nodes). */
    public long valueCount() {
        return valueStart(size);
    }

    /**
     * The bytes of the primitive blocks this table holds (headers not counted): what a document's
     * nodes cost in memory, to compare with what they contain.
     */
    public long retainedBytes() {
        return retained;
    }

    /** Node {@code i} as a record (its arrays are copies). */
    public Node node(int i) {
        int[] ch = new int[childEnd(i) - childStart(i)];
        for (int e = 0; e < ch.length; e++) {
            ch[e] = childId(childStart(i) + e);
        }
        double[] v = new double[valueEnd(i) - valueStart(i)];
        for (int k = 0; k < v.length; k++) {
            v[k] = value(valueStart(i) + k);
        }
        byte k = kind(i);
        if (k == PRODUCT) {
            return new ProductNode(id(i), label(i), ch);
        }
        if (k == SUM) {
            return new SumNode(id(i), label(i), ch, v, logForm(i));
        }
        int[] vs = new int[varEnd(i) - varStart(i)];
        for (int p = 0; p < vs.length; p++) {
            vs[p] = var(varStart(i) + p);
        }
        return new InputNode(id(i), label(i), family(i), vs, v, logForm(i));
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

    /** A growable column of ints in blocks of {@link #INTS} (the first grows to that size). */
    private static final class Ints {
        private int[][] blocks = {new int[FIRST]};
        private int size;
        /** The block entries go to, the position of its first entry, and one past its last. */
        private int[] current = blocks[0];
        private int start;
        private int end = FIRST;

        void add(int v) {
            // one test per entry, and its rare side is taken early (the first block grows from FIRST):
            // a compiled reader is not thrown away when a large document first crosses a block
            if (size == end) {
                room();
            }
            current[size - start] = v;
            size++;
        }

        /** Makes the block entry {@code size} goes to (growing the first one, or starting a new one) current. */
        private void room() {
            int b = size / INTS;
            int j = size - b * INTS;
            if (b == blocks.length) {
                blocks = Arrays.copyOf(blocks, b * 2);
            }
            int[] block = blocks[b];
            if (block == null) {
                block = new int[INTS];
                blocks[b] = block;
            } else if (j == block.length) {
                block = Arrays.copyOf(block, Math.min(INTS, 2 * j));
                blocks[b] = block;
            }
            current = block;
            start = b * INTS;
            end = start + block.length;
        }

        int[][] blocks() {
            return Arrays.copyOf(blocks, (int) (((long) size + INTS - 1) / INTS));
        }

        /**
         * Appends entries {@code from} to the end of {@code src} plus {@code shift}, dropping each of {@code src}'s
         * blocks once copied (the source is not used afterwards).
         */
        void addAll(Ints src, int from, int shift) {
            if (from == 0 && shift == 0 && BlockAdoption.applies(size, src.size, INTS)) {
                blocks = BlockAdoption.append(blocks, size, src.blocks, src.size, INTS);
                size += src.size;
                int b = size / INTS;
                // the block the next entry goes to, or the last full one when the next entry starts a block
                boolean boundary = b >= blocks.length || blocks[b] == null;
                current = boundary ? blocks[b - 1] : blocks[b];
                start = (boundary ? b - 1 : b) * INTS;
                end = start + current.length;
                src.blocks = new int[][] {new int[FIRST]};
                src.current = src.blocks[0];
                src.start = 0;
                src.end = FIRST;
                src.size = 0;
                return;
            }
            int k = from;
            while (k < src.size) {
                int sb = k / INTS;
                int sj = k - sb * INTS;
                int[] s = src.blocks[sb];
                if (size == end) {
                    room();
                }
                int[] d = current;
                int dj = size - start;
                int n = Math.min(Math.min(src.size - k, s.length - sj), end - size);
                if (shift == 0) {
                    System.arraycopy(s, sj, d, dj, n);
                } else {
                    for (int i = 0; i < n; i++) {
                        d[dj + i] = s[sj + i] + shift;
                    }
                }
                size += n;
                k += n;
                if (k == src.size || k % INTS == 0) {
                    src.blocks[sb] = null;
                }
            }
        }
    }

    /** A growable column of doubles in blocks of {@link #DOUBLES} (the first grows to that size). */
    private static final class Doubles {
        private double[][] blocks = {new double[FIRST]};
        private int size;
        /** The block entries go to, the position of its first entry, and one past its last. */
        private double[] current = blocks[0];
        private int start;
        private int end = FIRST;

        void add(double v) {
            // one test per entry, and its rare side is taken early (the first block grows from FIRST):
            // a compiled reader is not thrown away when a large document first crosses a block
            if (size == end) {
                room();
            }
            current[size - start] = v;
            size++;
        }

        /** Makes the block entry {@code size} goes to (growing the first one, or starting a new one) current. */
        private void room() {
            int b = size / DOUBLES;
            int j = size - b * DOUBLES;
            if (b == blocks.length) {
                blocks = Arrays.copyOf(blocks, b * 2);
            }
            double[] block = blocks[b];
            if (block == null) {
                block = new double[DOUBLES];
                blocks[b] = block;
            } else if (j == block.length) {
                block = Arrays.copyOf(block, Math.min(DOUBLES, 2 * j));
                blocks[b] = block;
            }
            current = block;
            start = b * DOUBLES;
            end = start + block.length;
        }

        /** Replaces entry {@code k} (below the size). */
        void set(int k, double v) {
            blocks[k / DOUBLES][k % DOUBLES] = v;
        }

        double[][] blocks() {
            return Arrays.copyOf(blocks, (int) (((long) size + DOUBLES - 1) / DOUBLES));
        }

        /**
         * Appends entries {@code from} to the end of {@code src}, dropping each of {@code src}'s
         * blocks once copied (the source is not used afterwards).
         */
        void addAll(Doubles src, int from) {
            if (from == 0 && BlockAdoption.applies(size, src.size, DOUBLES)) {
                blocks = BlockAdoption.append(blocks, size, src.blocks, src.size, DOUBLES);
                size += src.size;
                int b = size / DOUBLES;
                boolean boundary = b >= blocks.length || blocks[b] == null;
                current = boundary ? blocks[b - 1] : blocks[b];
                start = (boundary ? b - 1 : b) * DOUBLES;
                end = start + current.length;
                src.blocks = new double[][] {new double[FIRST]};
                src.current = src.blocks[0];
                src.start = 0;
                src.end = FIRST;
                src.size = 0;
                return;
            }
            int k = from;
            while (k < src.size) {
                int sb = k / DOUBLES;
                int sj = k - sb * DOUBLES;
                double[] s = src.blocks[sb];
                if (size == end) {
                    room();
                }
                double[] d = current;
                int dj = size - start;
                int n = Math.min(Math.min(src.size - k, s.length - sj), end - size);
                System.arraycopy(s, sj, d, dj, n);
                size += n;
                k += n;
                if (k == src.size || k % DOUBLES == 0) {
                    src.blocks[sb] = null;
                }
            }
        }
    }

    /** A growable column of bytes in blocks of {@link #BYTES} (the first grows to that size). */
    private static final class Bytes {
        private byte[][] blocks = {new byte[FIRST]};
        private int size;
        /** The block entries go to, the position of its first entry, and one past its last. */
        private byte[] current = blocks[0];
        private int start;
        private int end = FIRST;

        void add(byte v) {
            // one test per entry, and its rare side is taken early (the first block grows from FIRST):
            // a compiled reader is not thrown away when a large document first crosses a block
            if (size == end) {
                room();
            }
            current[size - start] = v;
            size++;
        }

        /** Makes the block entry {@code size} goes to (growing the first one, or starting a new one) current. */
        private void room() {
            int b = size / BYTES;
            int j = size - b * BYTES;
            if (b == blocks.length) {
                blocks = Arrays.copyOf(blocks, b * 2);
            }
            byte[] block = blocks[b];
            if (block == null) {
                block = new byte[BYTES];
                blocks[b] = block;
            } else if (j == block.length) {
                block = Arrays.copyOf(block, Math.min(BYTES, 2 * j));
                blocks[b] = block;
            }
            current = block;
            start = b * BYTES;
            end = start + block.length;
        }

        byte[][] blocks() {
            return Arrays.copyOf(blocks, (int) (((long) size + BYTES - 1) / BYTES));
        }

        /**
         * Appends entries {@code from} to the end of {@code src}, dropping each of {@code src}'s
         * blocks once copied (the source is not used afterwards).
         */
        void addAll(Bytes src, int from) {
            int k = from;
            while (k < src.size) {
                int sb = k / BYTES;
                int sj = k - sb * BYTES;
                byte[] s = src.blocks[sb];
                if (size == end) {
                    room();
                }
                byte[] d = current;
                int dj = size - start;
                int n = Math.min(Math.min(src.size - k, s.length - sj), end - size);
                System.arraycopy(s, sj, d, dj, n);
                size += n;
                k += n;
                if (k == src.size || k % BYTES == 0) {
                    src.blocks[sb] = null;
                }
            }
        }
    }

    /**
     * Builds a table node by node. A node's child ids and numbers may be appended while it is read
     * ({@link #appendChild}, {@link #appendValue}), then the node is closed with its kind; a reader that
     * abandons the document simply drops the builder. Columns grow a block at a time (only the small
     * first block is copied as it grows), so building costs at most the final size plus one block per
     * column. Not thread-safe.
     */
    public static final class Builder {
        private int size;
        private final Bytes kind = new Bytes();
        private final Ints id = new Ints();
        private final Bytes family = new Bytes();
        private final Bytes flags = new Bytes();
        private String[][] labels;
        private final Ints childStart = new Ints();
        private final Ints children = new Ints();
        private final Ints valueStart = new Ints();
        private final Doubles values = new Doubles();
        private final Ints varStart = new Ints();
        private final Ints vars = new Ints();

        public Builder() {
            childStart.add(0);
            valueStart.add(0);
            varStart.add(0);
        }

        /** Appends a child id to the node being read. */
        public void appendChild(int childId) {
            check(children.size);
            children.add(childId);
        }

        /** Appends a number (weight or parameter) to the node being read. */
        public void appendValue(double v) {
            check(values.size);
            values.add(v);
        }

        /** The number of numbers appended so far: the position the next {@link #appendValue} takes. */
        public int valueCount() {
            return values.size;
        }

        /** Replaces the number at {@code position}, appended earlier (a placeholder for a value decoded later). */
        public void setValue(int position, double v) {
            values.set(position, v);
        }

        /** Appends a variable index to the node being read. */
        public void appendVar(int v) {
            check(vars.size);
            vars.add(v);
        }

        private static void check(int n) {
            if (n == Integer.MAX_VALUE - 8) {
                throw new IllegalStateException("more than 2^31 entries in one column");
            }
        }

        /**
         * Closes the node being read: everything appended since the previous node closed belongs to it.
         *
         * @param f the family of an input, {@code null} otherwise
         * @param logForm log-weights of a sum, log-probabilities of a categorical
         */
        public void close(byte k, int nodeId, String label, Family f, boolean logForm) {
            check(size);
            if (label != null) {
                setLabel(size, label);
            }
            kind.add(k);
            id.add(nodeId);
            family.add(f == null ? 0 : (byte) (f.ordinal() + 1));
            flags.add(logForm ? LOG_FORM : 0);
            size++;
            childStart.add(children.size);
            valueStart.add(values.size);
            varStart.add(vars.size);
        }

        private void setLabel(int i, String label) {
            if (labels == null) {
                labels = new String[4][];
            }
            int b = i >>> LABEL_SHIFT;
            if (b >= labels.length) {
                labels = Arrays.copyOf(labels, Math.max(b + 1, labels.length * 2));
            }
            if (labels[b] == null) {
                labels[b] = new String[LABEL_BLOCK];
            }
            labels[b][i & LABEL_MASK] = label;
        }

        /**
         * Appends every node of {@code tail}, a table of the nodes that follow this one's in the document
         * (read apart, e.g. on another thread). {@code tail} is emptied: its blocks are dropped as they are
         * copied, so the two never take twice the memory, and it must not be used afterwards.
         */
        public void appendAll(Builder tail) {
            if ((long) size + tail.size >= Integer.MAX_VALUE - 8 || (long) children.size + tail.children.size >= Integer.MAX_VALUE - 8
                    || (long) values.size + tail.values.size >= Integer.MAX_VALUE - 8
                    || (long) vars.size + tail.vars.size >= Integer.MAX_VALUE - 8) {
                throw new IllegalStateException("more than 2^31 entries in one column");
            }
            int base = size;
            if (tail.labels != null) {
                for (int b = 0; b < tail.labels.length; b++) {
                    String[] block = tail.labels[b];
                    for (int j = 0; block != null && j < LABEL_BLOCK; j++) {
                        if (block[j] != null) {
                            setLabel(base + (b << LABEL_SHIFT) + j, block[j]);
                        }
                    }
                }
                tail.labels = null;
            }
            kind.addAll(tail.kind, 0);
            id.addAll(tail.id, 0, 0);
            family.addAll(tail.family, 0);
            flags.addAll(tail.flags, 0);
            // the tail's starts begin at 0 for its first node: this table's ends already say where that is
            childStart.addAll(tail.childStart, 1, children.size);
            children.addAll(tail.children, 0, 0);
            valueStart.addAll(tail.valueStart, 1, values.size);
            values.addAll(tail.values, 0);
            varStart.addAll(tail.varStart, 1, vars.size);
            vars.addAll(tail.vars, 0, 0);
            size += tail.size;
            tail.size = 0;
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
            if (labels != null) {
                labels = Arrays.copyOf(labels, (size + LABEL_MASK) >>> LABEL_SHIFT);
            }
            return new NodeTable(this);
        }
    }
}
