package dev.circa.validator.compare;

/**
 * The comparison of one pair of corresponding outputs.
 *
 * @param outputA the output's name in circuit A
 * @param outputB the output's name in circuit B
 * @param points points compared
 * @param failures points where the two disagree beyond tolerance
 * @param maxAbsError the largest |logA - logB| (infinite when only one is -inf somewhere)
 * @param logPartitionA log Z of the output in A (every variable missing)
 * @param logPartitionB log Z of the output in B
 */
public record OutputComparison(String outputA, String outputB, long points, long failures, double maxAbsError,
                               double logPartitionA, double logPartitionB) {
}
