package dev.circa.engine.internal;

import java.util.Arrays;

/**
 * Which dense blocks hold their sums in linear form ({@link LinearOutput}) and where: a block does when none
 * of its sums is an output or read by a node other than a product that only its parent block evaluates,
 * every part that holds one of its sums holds its sums only, it has a sum with a non-zero weight, and every
 * such sum's largest weight is at least {@link LinearOutput#MIN_SUM_SCALE} of the block's largest. Made by
 * {@link DenseBlockFinder} from the final node actions, then given its slots by the finder's slot assignment;
 * the arrays are those of {@link DenseBlocks}. One pass over the edges and one over the parts; no recursion.
 */
final class LinearSlots {
    /** Per node, the block whose sum it is, or -1. */
    final int[] blockOf;
    /** Per block, whether its sums are held in linear form. */
    final boolean[] linear;
    final double[] sumScale;
    final double[] logTop;
    final int[] offsetSlot;
    final int[] partOffsetSlot;
    final int[] childOffsetSlot;

    LinearSlots(CircuitData c, byte[] action, int[] sumStart, int[] sumNode, double[] maxLogWeight, int[] segStart,
            int[] partStart, int[] groupStart, int[] groupNode) {
        final int blocks = sumStart.length - 1;
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        this.blockOf = new int[c.nodeCount];
        Arrays.fill(blockOf, -1);
        this.linear = new boolean[blocks];
        this.sumScale = new double[sumNode.length];
        this.logTop = new double[blocks];
        for (int b = 0; b < blocks; b++) {
            double top = Double.NEGATIVE_INFINITY;
            for (int k = sumStart[b]; k < sumStart[b + 1]; k++) {
                blockOf[sumNode[k]] = b;
                top = Math.max(top, maxLogWeight[k]);
            }
            logTop[b] = top;
            boolean ok = top > Double.NEGATIVE_INFINITY;
            for (int k = sumStart[b]; ok && k < sumStart[b + 1]; k++) {
                double lw = maxLogWeight[k];
                sumScale[k] = lw == Double.NEGATIVE_INFINITY ? 0 : Math.exp(lw - top);
                ok = lw == Double.NEGATIVE_INFINITY || sumScale[k] >= LinearOutput.MIN_SUM_SCALE;
            }
            linear[b] = ok;
        }
        for (int o : c.outputNode) {
            exclude(o);
        }
        for (int i = 0; i < c.nodeCount; i++) {
            if (action[i] != DenseBlocks.SKIP) {
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    exclude(ci[e]);
                }
            }
        }
        this.partOffsetSlot = new int[Math.max(0, groupStart.length - 1)];
        for (int p = 0; p + 1 < groupStart.length; p++) {
            int b0 = blockOf[groupNode[groupStart[p]]];
            boolean same = b0 >= 0;
            for (int g = groupStart[p]; same && g < groupStart[p + 1]; g++) {
                same = blockOf[groupNode[g]] == b0;
            }
            if (!same) {
                for (int g = groupStart[p]; g < groupStart[p + 1]; g++) {
                    exclude(groupNode[g]);
                }
            }
        }
        this.offsetSlot = new int[blocks];
        Arrays.fill(offsetSlot, -1);
        Arrays.fill(partOffsetSlot, -1);
        this.childOffsetSlot = new int[ci.length];
        Arrays.fill(childOffsetSlot, -1);
    }

    /** Node q's block, if any, keeps log-values: q is read as a log-value. */
    private void exclude(int q) {
        if (blockOf[q] >= 0) {
            linear[blockOf[q]] = false;
        }
    }

    /** The linear block whose sum node q is, or -1. */
    int linearBlockOf(int q) {
        int b = blockOf[q];
        return b >= 0 && linear[b] ? b : -1;
    }
}
