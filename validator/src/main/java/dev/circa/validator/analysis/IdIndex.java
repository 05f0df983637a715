package dev.circa.validator.analysis;

import java.util.Arrays;

/**
 * Node id to node index, an open-addressing hash table of ints (a boxed map would cost more than
 * the nodes on large circuits). Keeps the first index of a duplicated id.
 */
public final class IdIndex {
    private final int[] keys;
    private final int[] values;
    private final int mask;

    public IdIndex(int expected) {
        int cap = Integer.highestOneBit(Math.max(4, expected) * 2 - 1) << 1;
        keys = new int[cap];
        values = new int[cap];
        Arrays.fill(keys, -1);
        mask = cap - 1;
    }

    private int slot(int key) {
        int h = key * 0x9E3779B9;
        return (h ^ (h >>> 16)) & mask;
    }

    /** Adds {@code id -> index} unless present; returns the index already there, or -1. */
    public int putIfAbsent(int id, int index) {
        int s = slot(id);
        while (keys[s] != -1) {
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
        int s = slot(id);
        while (keys[s] != -1) {
            if (keys[s] == id) {
                return values[s];
            }
            s = (s + 1) & mask;
        }
        return -1;
    }
}
