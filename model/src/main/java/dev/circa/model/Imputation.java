package dev.circa.model;

import java.util.Map;

/**
 * The most probable explanation of a row's missing values (MPE by max-product and backtracking).
 *
 * @param values every variable by name, in the model's order: the observed values as given, the missing
 *     ones filled (labels for categorical and binary variables that have them, else state indices; Long
 *     for counts, Double for reals); {@code null} for a variable outside the output's scope
 * @param logValue the max-product value of the output at the completed row (its log-density when exact)
 * @param exact whether this is the exact MPE: the circuit was proven smooth, decomposable and
 *     deterministic; otherwise a lower bound that need not be the most probable
 */
public record Imputation(Map<String, Object> values, double logValue, boolean exact) {
    /**
     * Copies the values, which keep their order.
     *
     * @param values every variable by name
     * @param logValue the max-product value of the output
     * @param exact whether this is the exact MPE
     */
    public Imputation {
        values = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(values));
    }
}
