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

        public NodeLocations build() {
            return new NodeLocations(Arrays.copyOf(line, size), Arrays.copyOf(column, size), size);
        }
    }
}
