package dev.circa.engine;

/**
 * A circuit document that cannot be compiled: a broken reference (a dangling or forward child id, a
 * duplicate id, a variable index out of range, an output naming a missing node), a family that does not
 * fit its variable, a weight or parameter count that does not match, or a parameter no distribution has.
 * The message names the node by its id and its position in {@code nodes}.
 */
public final class CompileException extends Exception {
    private static final long serialVersionUID = 1L;

    private final int nodeIndex;

    /**
     * @param nodeIndex position of the offending node in the document's {@code nodes}, or -1 when the
     *     problem is not in a node (an output)
     * @param message what was seen and what was expected
     */
    public CompileException(int nodeIndex, String message) {
        super(message);
        this.nodeIndex = nodeIndex;
    }

    /** Position of the offending node in the document's {@code nodes}, or -1 when it is not a node. */
    public int nodeIndex() {
        return nodeIndex;
    }
}
