package dev.circa.format;

import java.util.Map;

/**
 * One embedded reference value.
 *
 * @param output the output's name, or {@code null} for the first output
 * @param values values keyed by variable name: a {@link Double} or a {@link String} state label;
 *     missing keys are marginalised
 * @param logDensity the expected log-density; {@link Double#NEGATIVE_INFINITY} when the document has {@code null}
 */
public record CheckCase(String output, Map<String, Object> values, double logDensity) {
    public CheckCase {
        values = Map.copyOf(values);
    }
}
