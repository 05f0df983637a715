package dev.circa.validator.regression;

import dev.circa.format.Checks;

/**
 * The pass rule of a reference case: |computed - expected| {@literal <=} atol + rtol * |expected|; an
 * expectation of -inf passes only when the computed value is -inf.
 *
 * @param atol absolute tolerance, >= 0
 * @param rtol relative tolerance, >= 0
 */
public record Tolerance(double atol, double rtol) {
    /** The default of FORMAT.md: atol = rtol = 1e-9. */
    public static final Tolerance DEFAULT = new Tolerance(Checks.DEFAULT_TOLERANCE, Checks.DEFAULT_TOLERANCE);

    public Tolerance {
        if (!(atol >= 0) || !(rtol >= 0) || Double.isInfinite(atol) || Double.isInfinite(rtol)) {
            throw new IllegalArgumentException("tolerances must be finite and >= 0");
        }
    }

    /**
     * The tolerance in force: each option given on the command line, else the document's
     * {@code checks} value, else 1e-9.
     *
     * @param checks the document's checks, or {@code null}
     * @param atol the option's value, or {@code null} when not given
     * @param rtol the option's value, or {@code null} when not given
     */
    public static Tolerance resolve(Checks checks, Double atol, Double rtol) {
        double a = atol != null ? atol : checks != null ? checks.atol() : Checks.DEFAULT_TOLERANCE;
        double r = rtol != null ? rtol : checks != null ? checks.rtol() : Checks.DEFAULT_TOLERANCE;
        return new Tolerance(a, r);
    }

    /** Whether {@code computed} passes against {@code expected}. */
    public boolean passes(double computed, double expected) {
        if (expected == Double.NEGATIVE_INFINITY || computed == Double.NEGATIVE_INFINITY) {
            return computed == expected;
        }
        if (Double.isNaN(computed) || Double.isNaN(expected)) {
            return false;
        }
        return Math.abs(computed - expected) <= atol + rtol * Math.abs(expected);
    }

    /**
     * How far beyond its allowance a case is: |computed - expected| / (atol + rtol * |expected|);
     * infinite when the two disagree on -inf or either is NaN, 0 when both are -inf. Used to rank the worst cases.
     */
    public double excess(double computed, double expected) {
        if (computed == expected) {
            return 0;
        }
        if (Double.isInfinite(computed) || Double.isInfinite(expected) || Double.isNaN(computed) || Double.isNaN(expected)) {
            return Double.POSITIVE_INFINITY;
        }
        double allowance = atol + rtol * Math.abs(expected);
        double d = Math.abs(computed - expected);
        return allowance > 0 ? d / allowance : Double.POSITIVE_INFINITY;
    }
}
