package dev.circa.format;

/** A node of a circuit document: an input, a product or a sum. */
public sealed interface Node permits InputNode, ProductNode, SumNode {
    /** The node's id, unique in its document (>= 0). */
    int id();

    /** Optional label, or {@code null}. */
    String label();

    /** Child ids in document order; empty for inputs. Callers must not modify the array. */
    int[] children();
}
