package dev.circa.validator.regression;

/** Receives every case a {@link RegressionCheck} evaluates, in order (for plots of all cases, not only the worst). */
@FunctionalInterface
public interface CaseSink {
    /**
     * One case.
     *
     * @param output the output's index
     * @param expected the reference log-density
     * @param computed the circuit's log-density
     * @param passed whether it passes the tolerance
     */
    void accept(int output, double expected, double computed, boolean passed);
}
