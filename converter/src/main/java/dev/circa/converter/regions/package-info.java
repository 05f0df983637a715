/**
 * Region graphs into circuits: checking a graph, generating random and grid graphs, compiling with
 * parameters from a seed or a NumPy archive, exporting parameters back, and verifying a compiled
 * circuit against a direct region-by-region evaluation. {@link dev.circa.converter.regions.RegionConverter}
 * does the whole conversion in one call (guards, parameters, compile, verify, validate) for
 * {@code circa convert}, {@code circa demo} and the compile benchmark; {@code circa regions} uses the generators.
 */
package dev.circa.converter.regions;
