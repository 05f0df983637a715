/**
 * The {@code circa} command line: one picocli subcommand per class, each a thin layer over the
 * public APIs of the other modules. Not for application code: embed the library APIs instead.
 */
package dev.circa.cli;
