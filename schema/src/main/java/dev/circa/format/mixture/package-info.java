/**
 * The mixture document (FORMAT.md section 4) in code: hand-written or exported mixtures of products,
 * inputs, shared definitions and Gaussian mixtures, read from JSON or YAML by {@link
 * dev.circa.format.mixture.MixtureReader}. Used by the converter, which turns them into circuits.
 */
package dev.circa.format.mixture;
