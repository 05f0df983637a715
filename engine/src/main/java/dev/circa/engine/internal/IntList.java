package dev.circa.engine.internal;

import java.util.Arrays;

/** A growable list of ints without boxing, for building flat arrays. */
final class IntList {
    private int[] items = new int[16];
    private int size;

    void add(int v) {
        if (size == items.length) {
            items = Arrays.copyOf(items, items.length * 2);
        }
        items[size++] = v;
    }

    int get(int i) {
        return items[i];
    }

    void set(int i, int v) {
        items[i] = v;
    }

    int size() {
        return size;
    }

    void truncate(int newSize) {
        size = newSize;
    }

    int[] toArray() {
        return Arrays.copyOf(items, size);
    }
}
