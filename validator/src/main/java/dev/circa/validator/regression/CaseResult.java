package dev.circa.validator.regression;

/**
 * One evaluated reference case.
 *
 * @param source the file the case comes from (a reference CSV, or the circuit for embedded checks)
 * @param row the 1-based data row of a CSV (header and comments not counted), or the 1-based case
 *     number of the embedded checks
 * @param line the line of the file where the case starts, or 0 when unknown
 * @param pointer the JSON pointer of an embedded case ({@code /checks/cases/i}), or {@code null} for a CSV row
 * @param output the output's name
 * @param expected the reference log-density
 * @param computed the circuit's log-density
 * @param passed whether the case passes its tolerance
 * @param excess |computed - expected| over the allowed error (see {@link Tolerance#excess})
 */
public record CaseResult(String source, long row, long line, String pointer, String output, double expected,
                         double computed, boolean passed, double excess) {

    /** |computed - expected|; 0 when both are -inf, infinite when only one is, NaN when either is NaN. */
    public double absError() {
        if (computed == expected) {
            return 0;
        }
        return Math.abs(computed - expected);
    }

    /** |computed - expected| / |expected|; NaN when the reference is 0 or -inf. */
    public double relError() {
        if (expected == 0 || Double.isInfinite(expected)) {
            return Double.NaN;
        }
        return absError() / Math.abs(expected);
    }
}
