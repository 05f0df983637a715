package dev.circa.validator.regression;

/**
 * The cases of one output.
 *
 * @param output the output's name
 * @param cases cases checked
 * @param failures cases beyond tolerance
 * @param maxAbsError the largest |computed - expected| (infinite when one of the two is -inf and the other not)
 * @param maxRelError the largest |computed - expected| / |expected| over references other than 0 and -inf
 */
public record OutputSummary(String output, long cases, long failures, double maxAbsError, double maxRelError) {
}
