package dev.circa.engine;

/**
 * A draw of {@link Sampler} that no reader accepts as a value of its variable: it overflowed the double
 * range (an infinite real) or the count range (a count above 2^53). Names the input node that drew it.
 */
public final class DrawOverflowException extends ArithmeticException {
    private static final long serialVersionUID = 1L;

    private final int nodeId;
    private final int variable;

    /**
     * @param nodeId the id of the input node (as written in the circuit file)
     * @param family the input's family name
     * @param variable the index of the variable drawn (column of a data row)
     * @param value the draw
     */
    public DrawOverflowException(int nodeId, String family, int variable, double value) {
        super("input node " + nodeId + " (" + family + ") drew " + (value == Math.rint(value) && Math.abs(value) < 1e300
                ? String.format("%.0f", value) : String.valueOf(value))
                + ", which is not a value of its variable (expected a finite number, and a count at most 2^53):"
                + " its parameters overflow the range of values when sampled");
        this.nodeId = nodeId;
        this.variable = variable;
    }

    /** The index of the variable drawn (column of a data row). */
    public int variable() {
        return variable;
    }

    /** The id of the input node whose draw overflowed. */
    public int nodeId() {
        return nodeId;
    }
}
