package dev.circa.format;

import java.util.List;

/**
 * The embedded {@code checks} of a circuit.
 *
 * @param atol absolute tolerance (default 1e-9)
 * @param rtol relative tolerance (default 1e-9)
 * @param cases the reference cases
 */
public record Checks(double atol, double rtol, List<CheckCase> cases) {
    /** Default tolerance of FORMAT.md section 2. */
    public static final double DEFAULT_TOLERANCE = 1e-9;

    public Checks {
        cases = List.copyOf(cases);
    }
}
