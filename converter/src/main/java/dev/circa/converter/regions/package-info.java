/**
 * Region graphs into circuits: checking a graph, generating random and grid graphs, compiling with
 * parameters from a seed or a NumPy archive, exporting parameters back, and verifying a compiled
 * circuit against a direct region-by-region evaluation. Used by {@code circa convert} and {@code circa regions}.
 */
package dev.circa.converter.regions;
