package dev.circa.engine.internal;

import dev.circa.engine.family.Families;
import org.ejml.data.DMatrixRMaj;

/**
 * The dense blocks of a circuit, found by {@link DenseBlockFinder}: groups of sums with one common child
 * list of products, each list cut into segments that are full cross products of node groups. Block b has
 * sums {@code sumNode[sumStart[b] .. sumStart[b+1]-1]} (K of them, with {@code maxLogWeight} per sum), a
 * child list of {@code width[b]} = n products, and a weight matrix {@code weights[b]} (K x n, row-major):
 * entry (k, j) is {@code exp(logWeight(k, j) - maxLogWeight(k))}, so every entry is in [0, 1] and a
 * row's largest is 1 (a row of zeros when every weight of that sum is 0). The block's segments are
 * {@code segStart[b] .. segStart[b+1]-1}; segment s covers list positions {@code segOffset[s] ..
 * segOffset[s] + segLength[s] - 1} and has parts {@code partStart[s] .. partStart[s+1]-1}; part p is the
 * node group {@code groupNode[groupStart[p] .. groupStart[p+1]-1]}. The product at position
 * {@code segOffset[s] + u} has as children one node of each part, in part order, the first part varying
 * slowest (u read in mixed radix over the part sizes).
 *
 * <p>Per node, {@code action[i]} says how the dense kernel treats it: {@link #GENERIC} (evaluated as
 * usual), {@link #SKIP} (a product used only by its block's sums, never materialised), {@link #BLOCK}
 * (the first sum of block {@code blockAt[i]}: the whole block is evaluated there, after all its parts,
 * which precede its products), {@link #BLOCK_SUM} (a later sum of a block, already done) or {@link #FUSED}
 * (a product of univariate inputs that nothing else reads: it is evaluated as the sum of their
 * log-densities, in child order, and the inputs, marked {@link #SKIP}, are never stored).
 *
 * <p>Per input slot, {@code inputLogSd} holds log(sd) of a normal input (NaN for other families), so the
 * kernel does not take that logarithm per row, and {@code inputMissing} the input's value over a missing
 * variable (its log total mass).
 *
 * <p>Value slots: the dense kernel keeps a node's values only while a later node still reads them. Node i
 * has slot {@code nodeSlot[i]} (-1 for skipped products), its values at {@code value[slot * rows + r]};
 * {@code childSlot[e]} is the slot of edge e's child at the time its parent reads it (a skipped product's
 * children are read when its block is evaluated); {@code groupSlot} and {@code sumSlot} mirror
 * {@code groupNode} and {@code sumNode}. Slots are reused once their node's last reader is done, so a
 * region-graph circuit needs a small fraction of one slot per node ({@code slotCount} in all), and chunks
 * of many rows fit the evaluator's memory budget.
 *
 * <p>Linear outputs ({@link LinearOutput}): a block whose sums are read only by other blocks, each as a part
 * made of that block's sums alone (the usual case in a region graph: a part is a child region's K sums), holds
 * its sums in linear form, mantissas in the sums' slots and the row's log offset in {@code offsetSlot[b]}
 * (-1 for a block that holds log-values); {@code partOffsetSlot[p]} is the offset slot of the block a
 * part is read from (-1 for a part of log-values) and {@code childOffsetSlot[e]} that of edge e's child
 * (-1 for a child of log-values), for the exact path. {@code sumScale[k]} = e^(maxLogWeight(k) - logTop(b))
 * (0 for a sum of zero weights), {@code logTop[b]} the block's largest {@code maxLogWeight}. Never modified
 * after the analysis.
 */
public final class DenseBlocks {
    public static final byte GENERIC = 0;
    public static final byte SKIP = 1;
    public static final byte BLOCK = 2;
    public static final byte BLOCK_SUM = 3;
    public static final byte FUSED = 4;

    public final byte[] action;
    public final int[] blockAt;
    public final int[] sumStart;
    public final int[] sumNode;
    public final double[] maxLogWeight;
    public final int[] width;
    public final DMatrixRMaj[] weights;
    public final double[] inputLogSd;
    /**
     * The children of the fused products, flat, with their input slot, variable, and for a normal its mean,
     * sd and log sd (NaN for other families). Fused products with the same number of children c form a
     * group of q products, in node order; the group's entries are child-major, a q x c table stored by
     * columns: fused product i's child e is entry {@code fusedBase[i] + (e - childStart[i]) * fusedStride[i]}
     * (the stride is the group's q). So one row adds the j-th children of a whole group in one loop the JIT
     * turns into vector instructions, each product's sum still in child order.
     */
    public final int[] fusedBase;
    /** Per node, the distance between a fused product's consecutive children (0 for other nodes). */
    public final int[] fusedStride;
    /** Per node, the index of a fused product among all fused products, in group order (-1 for other nodes). */
    public final int[] fusedOut;
    /**
     * Group g of fused products: entries from {@code fusedGroupStart[g]}, {@code fusedGroupSize[g]}
     * products of {@code fusedGroupWidth[g]} children each, the first with index {@code fusedGroupOut[g]}.
     */
    public final int[] fusedGroupStart;
    public final int[] fusedGroupSize;
    public final int[] fusedGroupWidth;
    public final int[] fusedGroupOut;
    /** Number of fused products. */
    public final int fusedCount;
    public final int[] fusedSlot;
    public final int[] fusedVar;
    public final double[] fusedMean;
    public final double[] fusedSd;
    public final double[] fusedLogSd;
    /** The nodes the kernel visits, in node order: those whose action is GENERIC, FUSED or BLOCK. */
    public final int[] steps;
    public final double[] inputMissing;
    /** Per input slot, its largest log-density (its max-product value over a missing variable). */
    public final double[] inputMaxMissing;
    public final int[] segStart;
    public final int[] segOffset;
    public final int[] segLength;
    public final int[] partStart;
    public final int[] groupStart;
    public final int[] groupNode;
    /** Largest child list, sum count, part size, part count and segment count of one block. */
    public final int maxWidth;
    public final int maxSums;
    public final int maxPartSize;
    public final int maxParts;
    public final int maxSegments;
    public final int[] nodeSlot;
    public final int[] childSlot;
    public final int[] groupSlot;
    public final int[] sumSlot;
    public final int slotCount;
    public final int[] offsetSlot;
    public final int[] partOffsetSlot;
    public final int[] childOffsetSlot;
    public final double[] sumScale;
    public final double[] logTop;
    /** Edges evaluated inside blocks: sum edges plus the edges of products that are not materialised. */
    public final long blockEdges;

    DenseBlocks(byte[] action, int[] blockAt, int[] sumStart, int[] sumNode, double[] maxLogWeight, int[] width,
            DMatrixRMaj[] weights, int[] segStart, int[] segOffset, int[] segLength, int[] partStart,
            int[] groupStart, int[] groupNode, long blockEdges, int[] nodeSlot, int[] childSlot, int slotCount,
            LinearSlots linear, CircuitData c) {
        this.action = action;
        this.blockAt = blockAt;
        this.sumStart = sumStart;
        this.sumNode = sumNode;
        this.maxLogWeight = maxLogWeight;
        this.width = width;
        this.weights = weights;
        this.segStart = segStart;
        this.segOffset = segOffset;
        this.segLength = segLength;
        this.partStart = partStart;
        this.groupStart = groupStart;
        this.groupNode = groupNode;
        this.blockEdges = blockEdges;
        this.nodeSlot = nodeSlot;
        this.childSlot = childSlot;
        this.slotCount = slotCount;
        this.offsetSlot = linear.offsetSlot;
        this.partOffsetSlot = linear.partOffsetSlot;
        this.childOffsetSlot = linear.childOffsetSlot;
        this.sumScale = linear.sumScale;
        this.logTop = linear.logTop;
        this.fusedBase = new int[action.length];
        this.fusedStride = new int[action.length];
        this.fusedOut = new int[action.length];
        // products by number of children: first the count, then (once the groups are laid out) the group
        java.util.TreeMap<Integer, Integer> productsByWidth = new java.util.TreeMap<>();
        for (int i = 0; i < action.length; i++) {
            if (action[i] == FUSED) {
                productsByWidth.merge(c.childStart[i + 1] - c.childStart[i], 1, Integer::sum);
            }
        }
        int groups = productsByWidth.size();
        this.fusedGroupStart = new int[groups];
        this.fusedGroupSize = new int[groups];
        this.fusedGroupWidth = new int[groups];
        this.fusedGroupOut = new int[groups];
        int fusedEdges = 0;
        int products = 0;
        int next = 0;
        for (var entry : productsByWidth.entrySet()) {
            fusedGroupStart[next] = fusedEdges;
            fusedGroupSize[next] = entry.getValue();
            fusedGroupWidth[next] = entry.getKey();
            fusedGroupOut[next] = products;
            fusedEdges += entry.getKey() * entry.getValue();
            products += entry.getValue();
            entry.setValue(next++);
        }
        this.fusedCount = products;
        int[] filled = new int[groups];
        for (int i = 0; i < action.length; i++) {
            fusedBase[i] = -1;
            fusedOut[i] = -1;
            if (action[i] == FUSED) {
                int group = productsByWidth.get(c.childStart[i + 1] - c.childStart[i]);
                int q = filled[group]++;
                fusedBase[i] = fusedGroupStart[group] + q;
                fusedStride[i] = fusedGroupSize[group];
                fusedOut[i] = fusedGroupOut[group] + q;
            }
        }
        this.fusedSlot = new int[fusedEdges];
        this.fusedVar = new int[fusedEdges];
        this.fusedMean = new double[fusedEdges];
        this.fusedSd = new double[fusedEdges];
        this.fusedLogSd = new double[fusedEdges];
        for (int i = 0; i < action.length; i++) {
            if (action[i] != FUSED) {
                continue;
            }
            for (int e = c.childStart[i]; e < c.childStart[i + 1]; e++) {
                int f = fusedBase[i] + (e - c.childStart[i]) * fusedStride[i];
                int slot = c.inputSlot[c.childIndex[e]];
                int off = c.paramStart[slot];
                boolean normal = c.family[slot] == Families.NORMAL;
                fusedSlot[f] = slot;
                fusedVar[f] = c.varIndex[c.varStart[slot]];
                fusedMean[f] = normal ? c.params[off] : Double.NaN;
                fusedSd[f] = normal ? c.params[off + 1] : Double.NaN;
                fusedLogSd[f] = normal ? Math.log(c.params[off + 1]) : Double.NaN;
            }
        }
        int stepCount = 0;
        for (byte a : action) {
            if (a == GENERIC || a == FUSED || a == BLOCK) {
                stepCount++;
            }
        }
        this.steps = new int[stepCount];
        stepCount = 0;
        for (int i = 0; i < action.length; i++) {
            if (action[i] == GENERIC || action[i] == FUSED || action[i] == BLOCK) {
                steps[stepCount++] = i;
            }
        }
        int inputs = c.inputNode.length;
        this.inputLogSd = new double[inputs];
        this.inputMissing = new double[inputs];
        this.inputMaxMissing = new double[inputs];
        for (int slot = 0; slot < inputs; slot++) {
            int code = c.family[slot];
            int off = c.paramStart[slot];
            int len = c.paramStart[slot + 1] - off;
            inputLogSd[slot] = code == Families.NORMAL ? Math.log(c.params[off + 1]) : Double.NaN;
            inputMissing[slot] = code == Families.MVNORMAL ? Double.NaN : Families.logTotalMass(code, c.params, off, len);
            inputMaxMissing[slot] = code == Families.MVNORMAL ? Double.NaN : Families.maxLogDensity(code, c.params, off, len);
        }
        this.groupSlot = new int[groupNode.length];
        for (int g = 0; g < groupNode.length; g++) {
            groupSlot[g] = nodeSlot[groupNode[g]];
        }
        this.sumSlot = new int[sumNode.length];
        for (int k = 0; k < sumNode.length; k++) {
            sumSlot[k] = nodeSlot[sumNode[k]];
        }
        int w = 0;
        int k = 0;
        int ps = 0;
        int pc = 0;
        int sc = 0;
        for (int b = 0; b < width.length; b++) {
            w = Math.max(w, width[b]);
            k = Math.max(k, sumStart[b + 1] - sumStart[b]);
            sc = Math.max(sc, segStart[b + 1] - segStart[b]);
            pc = Math.max(pc, partStart[segStart[b + 1]] - partStart[segStart[b]]);
        }
        for (int p = 0; p + 1 < groupStart.length; p++) {
            ps = Math.max(ps, groupStart[p + 1] - groupStart[p]);
        }
        this.maxWidth = w;
        this.maxSums = k;
        this.maxPartSize = ps;
        this.maxParts = pc;
        this.maxSegments = sc;
    }

    /** Number of blocks. */
    public int blockCount() {
        return width.length;
    }

    /** Number of sums inside blocks. */
    public int sumCount() {
        return sumNode.length;
    }
}
