/**
 * Whether two circuits over the same variables describe the same distribution: log-densities compared
 * at points sampled from each (complete and with variables missing), and a structural identity check
 * up to node order. Used by {@code circa compare} and by tests of conversions.
 */
package dev.circa.validator.compare;
