/**
 * Converters from other model descriptions into circa circuits. The command line and application
 * code use the subpackages: {@code regions} for region graphs, {@code npz} for NumPy parameter files.
 */
package dev.circa.converter;
