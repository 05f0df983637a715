package dev.circa.engine.internal;

import java.util.Arrays;

/**
 * Node id to node index. Ids written by most tools are dense (0..n-1 or close), so a direct table
 * indexed by id is used when the largest id is below 4n; otherwise an open-addressing hash table of
 * ints (a boxed map would cost more than the nodes on large circuits). Keeps the first index of a
 * duplicated id.
 */
public final class IdIndex {
    private static final int EMPTY = Integer.MIN_VALUE;

    private final int[] direct;
    private final int[] keys;
    private final int[] values;
    private final int mask;

    /** An index sized for the ids in {@code ids} (entries are added with {@link #putIfAbsent}). */
    public IdIndex(int[] ids) {
        int max = -1;
        int min = 0;
        for (int id : ids) {
            max = Math.max(max, id);
            min = Math.min(min, id);
        }
        if (min >= 0 && max < 4L * ids.length + 1024) {
            direct = new int[max + 1];
            Arrays.fill(direct, -1);
            keys = null;
            values = null;
            mask = 0;
        } else {
            direct = null;
            int cap = Integer.highestOneBit(Math.max(4, ids.length) * 2 - 1) << 1;
            keys = new int[cap];
            values = new int[cap];
            Arrays.fill(keys, EMPTY);
            mask = cap - 1;
        }
    }

    private int slot(int key) {
        int h = key * 0x9E3779B9;
        return (h ^ (h >>> 16)) & mask;
    }

    /** Adds {@code id -> index} unless present; returns the index already there, or -1. */
    public int putIfAbsent(int id, int index) {
        if (direct != null) {
            if (id < 0 || id >= direct.length) {
                throw new IllegalArgumentException("id " + id + " was not among the ids the index was sized for");
            }
            int old = direct[id];
            if (old < 0) {
                direct[id] = index;
            }
            return old;
        }
        int s = slot(id);
        while (keys[s] != EMPTY) {
            if (keys[s] == id) {
                return values[s];
            }
            s = (s + 1) & mask;
        }
        keys[s] = id;
        values[s] = index;
        return -1;
    }

    /** The index of {@code id}, or -1. */
    public int get(int id) {
        if (direct != null) {
            return id >= 0 && id < direct.length ? direct[id] : -1;
        }
        int s = slot(id);
        while (keys[s] != EMPTY) {
            if (keys[s] == id) {
                return values[s];
            }
            s = (s + 1) & mask;
        }
        return -1;
    }
}
