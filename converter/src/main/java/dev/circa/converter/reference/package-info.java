/**
 * Log-densities of the input families written independently of the engine, used by the converters'
 * verifications (the mixture evaluator and the region-by-region tensor evaluation) so that a
 * conversion is checked against code that does not share the engine's kernels. Not for application code.
 */
package dev.circa.converter.reference;
