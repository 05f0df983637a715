package dev.circa.format;

import java.util.Arrays;

/**
 * Line and column where each node starts, in two flat arrays indexed by node position
 * (one object per node would cost more than the node itself on large circuits).
 */
public final class NodeLocations {
    /** No locations known (documents built in code). */
    public static final NodeLocations NONE = new NodeLocations(new int[0], new int[0], 0);

    private final int[] line;
    private final int[] column;
    private final int size;

    private NodeLocations(int[] line, int[] column, int size) {
        this.line = line;
        this.column = column;
        this.size = size;
    }

    /** Line of node {@code index}, or 0 when unknown. */
    public int line(int index) {
        return index < size ? line[index] : 0;
    }

    /** Column of node {@code index}, or 0 when unknown. */
    public int column(int index) {
        return index < size ? column[index] : 0;
    }

    /** Collects locations in node order. Not thread-safe. */
    public static final class Recorder {
        private int[] line = new int[1024];
        private int[] column = new int[1024];
        private int size;

        /** Records the start of the next node. */
        public void add(int l, int c) {
            if (size == line.length) {
                line = Arrays.copyOf(line, size * 2);
                column = Arrays.copyOf(column, size * 2);
            }
            line[size] = l;
            column[size] = c;
            size++;
        }

        /**
         * Appends the locations {@code tail} recorded for the nodes that follow, read from an input whose
         * second line starts at {@code line}, {@code column} of the file (after a first line of its own).
         */
        public void appendAll(Recorder tail, int line, int column) {
            int n = size + tail.size;
            if (n > this.line.length) {
                this.line = Arrays.copyOf(this.line, Math.max(n, size * 2));
                this.column = Arrays.copyOf(this.column, this.line.length);
            }
            for (int i = 0; i < tail.size; i++) {
                int l = tail.line[i];
                this.line[size + i] = l + line - 2;
                this.column[size + i] = l == 2 ? tail.column[i] + column - 1 : tail.column[i];
            }
            size = n;
        }

        public NodeLocations build() {
            return new NodeLocations(Arrays.copyOf(line, size), Arrays.copyOf(column, size), size);
        }
    }
}
