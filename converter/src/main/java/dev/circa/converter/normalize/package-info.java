/**
 * Exact, distribution-preserving renormalisation of smooth, decomposable circuits (every sum made
 * locally normalised, every output its normalised distribution); whether a circuit is smooth and
 * decomposable is asked of the validator. Used by {@code circa normalize}.
 */
package dev.circa.converter.normalize;
