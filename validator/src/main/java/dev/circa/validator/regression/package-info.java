/**
 * Regression checks of a circuit against reference log-densities: the embedded {@code checks} of a
 * circuit document and reference CSV files (FORMAT.md section 5), streamed in chunks. Used by
 * {@code circa check} and by tests of exported models.
 */
package dev.circa.validator.regression;
