package dev.circa.format;

/**
 * A named output of a circuit.
 *
 * @param name unique name
 * @param node id of the node whose value is the output
 */
public record Output(String name, int node) {
}
