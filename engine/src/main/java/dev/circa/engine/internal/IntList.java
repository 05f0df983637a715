package dev.circa.engine.internal;

import java.util.Arrays;

/** A growable list of ints without boxing, for building flat arrays and explicit stacks. */
public final class IntList {
    private int[] items = new int[16];
    private int size;

    /** Appends {@code v}. */
    public void add(int v) {
        if (size == items.length) {
            items = Arrays.copyOf(items, items.length * 2);
        }
        items[size++] = v;
    }

    /** The element at {@code i}. */
    public int get(int i) {
        return items[i];
    }

    /** Replaces the element at {@code i}. */
    public void set(int i, int v) {
        items[i] = v;
    }

    /** Removes and returns the last element. */
    public int pop() {
        return items[--size];
    }

    /** The number of elements. */
    public int size() {
        return size;
    }

    /** Whether the list holds no element. */
    public boolean isEmpty() {
        return size == 0;
    }

    /** Keeps the first {@code newSize} elements. */
    public void truncate(int newSize) {
        size = newSize;
    }

    /** Removes every element. */
    public void clear() {
        size = 0;
    }

    /** The elements, in a new array of their number. */
    public int[] toArray() {
        return Arrays.copyOf(items, size);
    }
}
