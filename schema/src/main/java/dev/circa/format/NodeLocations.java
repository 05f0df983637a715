package dev.circa.format;

import java.util.Arrays;

/**
 * Line and column where each node starts, in two flat arrays indexed by node position
 * (one object per node would cost more than the node itself on large circuits).
 */
public final class NodeLocations {
    /** No locations known (documents built in code). */
    public static final NodeLocations NONE = new NodeLocations(new int[0], new int[0], 0, null);

    private final int[] line;
    private final int[] column;
    private final int size;
    /** The locations of the nodes after the first {@code size}, read apart (or {@code null}). */
    private final Segment tail;

    private NodeLocations(int[] line, int[] column, int size, Segment tail) {
        this.line = line;
        this.column = column;
        this.size = size;
        this.tail = tail;
    }

    /** Line of node {@code index}, or 0 when unknown. */
    public int line(int index) {
        if (index < size) {
            return line[index];
        }
        return tail != null && index - size < tail.size ? tail.line(index - size) : 0;
    }

    /** Column of node {@code index}, or 0 when unknown. */
    public int column(int index) {
        if (index < size) {
            return column[index];
        }
        return tail != null && index - size < tail.size ? tail.column(index - size) : 0;
    }

    /**
     * Locations recorded by a reader of the nodes that follow, as that reader counted them (its first
     * node on its line 2), with where its line 2 starts in the file: translated when looked up, so
     * appending them costs nothing per node.
     */
    private record Segment(int[] lines, int[] columns, int size, int lineShift, int columnShift) {
        int line(int i) {
            return lines[i] + lineShift;
        }

        int column(int i) {
            return lines[i] == 2 ? columns[i] + columnShift : columns[i];
        }
    }

    /** Collects locations in node order. Not thread-safe. */
    public static final class Recorder {
        private int[] line = new int[1024];
        private int[] column = new int[1024];
        private int size;
        private Segment tail;

        /** Records the start of the next node. */
        public void add(int l, int c) {
            if (tail != null) {
                takeTail();
            }
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
         * {@code tail} must not be used afterwards.
         */
        public void appendAll(Recorder tail, int line, int column) {
            if (this.tail != null) {
                takeTail();
            }
            if (tail.tail != null) {
                tail.takeTail();
            }
            this.tail = new Segment(tail.line, tail.column, tail.size, line - 2, column - 1);
        }

        /** Copies the appended locations into this recorder's own arrays (when more follow them). */
        private void takeTail() {
            Segment t = tail;
            tail = null;
            int n = size + t.size;
            if (n > line.length) {
                line = Arrays.copyOf(line, Math.max(n, size * 2));
                column = Arrays.copyOf(column, line.length);
            }
            for (int i = 0; i < t.size; i++) {
                line[size + i] = t.line(i);
                column[size + i] = t.column(i);
            }
            size = n;
        }

        public NodeLocations build() {
            Segment t = tail == null ? null : new Segment(Arrays.copyOf(tail.lines, tail.size),
                    Arrays.copyOf(tail.columns, tail.size), tail.size, tail.lineShift, tail.columnShift);
            return new NodeLocations(Arrays.copyOf(line, size), Arrays.copyOf(column, size), size, t);
        }
    }
}
