/**
 * The validator's passes over a circuit (references, interned scopes, determinism, variable tree,
 * log-partition) in flat arrays, children first and without recursion. Used by the rules; not for
 * application code.
 */
package dev.circa.validator.analysis;
