package dev.circa.engine.internal;

/**
 * The flat arrays of a compiled circuit. Nodes are numbered 0..n-1 in document order, which is
 * children first. Node i has kind {@code kind[i]} ({@link #INPUT}, {@link #PRODUCT}, {@link #SUM}) and its
 * children are {@code childIndex[childStart[i] .. childStart[i+1]-1]} (node indices, CSR), each edge with
 * {@code logWeight[e]} (0 on product edges). An input node has a slot {@code s = inputSlot[i]}
 * (-1 otherwise): family code {@code family[s]}, variables {@code varIndex[varStart[s] .. varStart[s+1]-1]},
 * parameters {@code params[paramStart[s] .. paramStart[s+1]-1]} and, for a multivariate normal,
 * its Cholesky factor and log-determinant half at {@code factor[factorStart[s]]} (-1 otherwise).
 * Arrays are never modified after compilation.
 */
public final class CircuitData {
    public static final byte INPUT = 0;
    public static final byte PRODUCT = 1;
    public static final byte SUM = 2;

    public final int nodeCount;
    public final int variableCount;
    public final byte[] kind;
    public final int[] nodeId;
    public final int[] childStart;
    public final int[] childIndex;
    public final double[] logWeight;
    public final int[] inputSlot;
    public final byte[] family;
    public final int[] inputNode;
    public final int[] varStart;
    public final int[] varIndex;
    public final int[] paramStart;
    public final double[] params;
    public final int[] factorStart;
    public final double[] factor;
    /** Largest number of variables of one input. */
    public final int maxInputDimension;
    public final int[] outputNode;
    public final String[] outputName;
    /** id -> index lookup, or null when every node's id equals its index. */
    public final IdIndex ids;

    CircuitData(int nodeCount, int variableCount, byte[] kind, int[] nodeId, int[] childStart, int[] childIndex,
            double[] logWeight, int[] inputSlot, byte[] family, int[] inputNode, int[] varStart, int[] varIndex,
            int[] paramStart, double[] params, int[] factorStart, double[] factor, int maxInputDimension,
            int[] outputNode, String[] outputName, IdIndex ids) {
        this.nodeCount = nodeCount;
        this.variableCount = variableCount;
        this.kind = kind;
        this.nodeId = nodeId;
        this.childStart = childStart;
        this.childIndex = childIndex;
        this.logWeight = logWeight;
        this.inputSlot = inputSlot;
        this.family = family;
        this.inputNode = inputNode;
        this.varStart = varStart;
        this.varIndex = varIndex;
        this.paramStart = paramStart;
        this.params = params;
        this.factorStart = factorStart;
        this.factor = factor;
        this.maxInputDimension = maxInputDimension;
        this.outputNode = outputNode;
        this.outputName = outputName;
        this.ids = ids;
    }

    /** The index of the node with {@code id}, or -1. */
    public int indexOf(int id) {
        if (ids == null) {
            return id >= 0 && id < nodeCount ? id : -1;
        }
        return ids.get(id);
    }
}
