package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The engine tests' tolerance and the comparison rule of FORMAT.md: |a - b| <= tol * max(1, |b|). */
final class Tolerances {
    /** Relative tolerance on log-densities against outside references. */
    static final double LOG_DENSITY_TOLERANCE = 1e-12;

    private Tolerances() {
    }

    static void assertClose(double expected, double actual, String what) {
        assertClose(expected, actual, LOG_DENSITY_TOLERANCE, what);
    }

    static void assertClose(double expected, double actual, double tol, String what) {
        if (Double.isInfinite(expected) || Double.isNaN(expected)) {
            assertEquals(expected, actual, what);
            return;
        }
        assertTrue(Math.abs(actual - expected) <= tol * Math.max(1, Math.abs(expected)),
                () -> what + ": expected " + expected + " but was " + actual);
    }
}
