/**
 * Converts mixture documents (FORMAT.md section 4) into circuits and proves each conversion equal to
 * its source with an independent evaluator and sampler of the document. Used by {@code circa convert}.
 */
package dev.circa.converter.mixture;
