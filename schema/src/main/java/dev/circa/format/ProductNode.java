package dev.circa.format;

/**
 * A product node.
 *
 * @param id unique id
 * @param label optional label or {@code null}
 * @param children child ids (at least one); callers must not modify
 */
public record ProductNode(int id, String label, int[] children) implements Node {
}
