/**
 * CSV files of circa: data to evaluate or impute, and reference sets (FORMAT.md section 5). Used by
 * the command line and by regression checks; rows stream, so files of millions of rows read in bounded memory.
 */
package dev.circa.format.csv;
