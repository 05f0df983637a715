/**
 * Exact, distribution-preserving renormalisation of smooth, decomposable circuits (every sum made
 * locally normalised, every output its normalised distribution), and the interned scopes it checks
 * those properties with. Used by {@code circa normalize} and {@code circa render}.
 */
package dev.circa.converter.normalize;
