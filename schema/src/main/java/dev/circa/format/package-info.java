/**
 * The circa exchange format in code: variables, circuit nodes, outputs, checks and provenance, as
 * FORMAT.md defines them. Application code reads a document with {@link dev.circa.format.io.CircuitReader}
 * and gets a {@link dev.circa.format.CircuitDocument}.
 */
package dev.circa.format;
