package dev.circa.converter.mixture;

/** Batch log-density of a circuit's first output, as the verifier needs it. Not for application code. */
interface CircuitLogDensity {
    /**
     * @param data input: row-major rows x variables, NaN for missing
     * @param out output: one log-density per row
     */
    void logDensity(double[] data, int rows, double[] out);
}
