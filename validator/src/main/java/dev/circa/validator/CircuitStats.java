package dev.circa.validator;

/**
 * Sizes of a circuit.
 *
 * @param variables number of variables
 * @param nodes number of nodes
 * @param edges child references, duplicates counted
 * @param depth edges on the longest path from an output to an input (0 when unknown)
 */
public record CircuitStats(int variables, int nodes, long edges, int depth) {
}
