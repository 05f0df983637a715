package dev.circa.validator.analysis;

import java.util.Arrays;

/** A growable list of ints. */
public final class IntList {
    private int[] a = new int[16];
    private int size;

    public void add(int v) {
        if (size == a.length) {
            a = Arrays.copyOf(a, size * 2);
        }
        a[size++] = v;
    }

    public int get(int i) {
        return a[i];
    }

    /** Removes and returns the last element. */
    public int pop() {
        return a[--size];
    }

    public int size() {
        return size;
    }

    public boolean isEmpty() {
        return size == 0;
    }

    public void clear() {
        size = 0;
    }

    public int[] toArray() {
        return Arrays.copyOf(a, size);
    }
}
