package dev.circa.format;

/**
 * A sum node.
 *
 * @param id unique id
 * @param label optional label or {@code null}
 * @param children child ids (at least one); callers must not modify
 * @param weights one weight per child, or one log-weight when {@code logWeights}; callers must not modify
 * @param logWeights whether the document gave {@code logWeights} rather than {@code weights}
 */
public record SumNode(int id, String label, int[] children, double[] weights, boolean logWeights)
        implements Node {

    /** The log of weight {@code j}, whichever form the document used. */
    public double logWeight(int j) {
        return logWeights ? weights[j] : Math.log(weights[j]);
    }

    /** Weight {@code j} in linear form, whichever form the document used. */
    public double weight(int j) {
        return logWeights ? Math.exp(weights[j]) : weights[j];
    }
}
