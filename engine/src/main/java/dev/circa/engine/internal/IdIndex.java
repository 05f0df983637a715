package dev.circa.engine.internal;

/** An open-addressing map from node id to node index, two int arrays and no boxing. */
public final class IdIndex {
    private static final int EMPTY = -1;
    private final int[] keys;
    private final int[] values;
    private final int mask;

    /** A map with room for {@code expected} entries. */
    public IdIndex(int expected) {
        int cap = Integer.highestOneBit(Math.max(4, expected) * 2 - 1) << 1;
        keys = new int[cap];
        values = new int[cap];
        java.util.Arrays.fill(keys, EMPTY);
        mask = cap - 1;
    }

    /** Adds {@code id -> index}; returns the index already there, or -1 when the id is new. */
    public int putIfAbsent(int id, int index) {
        int h = slot(id);
        while (keys[h] != EMPTY) {
            if (keys[h] == id) {
                return values[h];
            }
            h = (h + 1) & mask;
        }
        keys[h] = id;
        values[h] = index;
        return -1;
    }

    /** The index of {@code id}, or -1. */
    public int get(int id) {
        if (id < 0) {
            return -1;
        }
        int h = slot(id);
        while (keys[h] != EMPTY) {
            if (keys[h] == id) {
                return values[h];
            }
            h = (h + 1) & mask;
        }
        return -1;
    }

    private int slot(int id) {
        return (id * 0x9E3779B9 >>> 7 ^ id) & mask;
    }
}
