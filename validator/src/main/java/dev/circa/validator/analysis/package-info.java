/**
 * The validator's passes over a circuit (references, interned scopes, determinism, variable tree,
 * log-partition, parameter facts) in flat arrays, children first and without recursion. Facts only:
 * which rule reports what, and in which words, is decided by each rule class. Used by the rules; not
 * for application code.
 */
package dev.circa.validator.analysis;
