package dev.circa.validator;

/**
 * Which queries the circuit answers exactly (FORMAT.md, properties).
 *
 * @param density the value at a complete assignment is one pass over valid references
 * @param marginal marginals are exact (smooth and decomposable)
 * @param conditional conditionals are exact (smooth and decomposable)
 * @param mpe the most probable explanation is exact (smooth, decomposable and deterministic)
 * @param sampling exact ancestral sampling (smooth, decomposable, non-negative weights)
 */
public record ExactQueries(boolean density, boolean marginal, boolean conditional, boolean mpe, boolean sampling) {
}
