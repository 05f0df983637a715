package dev.circa.validator.compare;

/**
 * One compared point.
 *
 * @param output the output's name (in circuit A)
 * @param sampledFrom {@code "A"} or {@code "B"}: the circuit the point was sampled from
 * @param point 0-based index of the point among those of its output
 * @param values the point in A's variable order, NaN where missing
 * @param logA log-density under A
 * @param logB log-density under B
 * @param agree whether the two agree within tolerance
 * @param excess |logA - logB| over the allowed error; infinite when only one is -inf
 */
public record Disagreement(String output, String sampledFrom, long point, double[] values, double logA, double logB,
                           boolean agree, double excess) {
    /** |logA - logB|; 0 when both are -inf. */
    public double absError() {
        return logA == logB ? 0 : Math.abs(logA - logB);
    }
}
