package dev.circa.engine.internal;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;

/**
 * Finds the dense blocks of any compiled circuit from its structure alone (see {@link DenseBlocks}): sums
 * whose children are all products are grouped by their exact child list (same nodes, same order); each
 * group's list is cut greedily into maximal segments that are full cross products of node groups (the
 * pattern of a region's sums over the products of a partition's parts); a group becomes a block when the
 * linear-space evaluation saves work, i.e. when its K x n edges are at least {@value #MIN_BLOCK_EDGES} and
 * at least twice the exponentials the block needs per row (one per node of each part of two or more
 * nodes, plus one per segment when there are several). One pass over the edges plus one over each
 * group's list; no recursion.
 */
public final class DenseBlockFinder {
    /** Fewest sum edges (K x n) that make a block worth its set-up. */
    public static final int MIN_BLOCK_EDGES = 16;

    private DenseBlockFinder() {
    }

    /**
     * Analyses {@code c}.
     *
     * @param everyCandidate input: make every group a block, whatever it saves (for tests of the kernel)
     */
    public static DenseBlocks find(CircuitData c, boolean everyCandidate) {
        final int n = c.nodeCount;
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        int[] refs = new int[n];
        for (int child : ci) {
            refs[child]++;
        }
        for (int o : c.outputNode) {
            refs[o]++;
        }
        // groups of sums with equal child lists, created in the order of their first member; members
        // chained in node order through memberNext
        Map<Long, Integer> byHash = new HashMap<>();
        IntList groupFirst = new IntList();
        IntList groupNextSameHash = new IntList();
        IntList groupLast = new IntList();
        IntList groupSize = new IntList();
        int[] memberNext = new int[n];
        for (int i = 0; i < n; i++) {
            if (c.kind[i] != CircuitData.SUM || !allProducts(c, i)) {
                continue;
            }
            long h = hash(ci, cs[i], cs[i + 1]);
            Integer head = byHash.get(h);
            int g = head == null ? -1 : head;
            int prev = -1;
            while (g >= 0 && !sameList(cs, ci, groupFirst.get(g), i)) {
                prev = g;
                g = groupNextSameHash.get(g);
            }
            memberNext[i] = -1;
            if (g >= 0) {
                memberNext[groupLast.get(g)] = i;
                groupLast.set(g, i);
                groupSize.set(g, groupSize.get(g) + 1);
                continue;
            }
            int ng = groupFirst.size();
            groupFirst.add(i);
            groupNextSameHash.add(-1);
            groupLast.add(i);
            groupSize.add(1);
            if (prev < 0) {
                byHash.put(h, ng);
            } else {
                groupNextSameHash.set(prev, ng);
            }
        }
        byHash = null;

        byte[] action = new byte[n];
        int[] blockAt = new int[n];
        Arrays.fill(blockAt, -1);
        int[] occ = new int[n];
        IntList sumStart = new IntList();
        IntList sumNode = new IntList();
        IntList width = new IntList();
        IntList segStart = new IntList();
        IntList segOffset = new IntList();
        IntList segLength = new IntList();
        IntList partStart = new IntList();
        IntList groupStart = new IntList();
        IntList groupNode = new IntList();
        List<DMatrixRMaj> weights = new ArrayList<>();
        List<double[]> maxLogWeights = new ArrayList<>();
        long blockEdges = 0;
        for (int g = 0; g < groupFirst.size(); g++) {
            int first = groupFirst.get(g);
            int k = groupSize.get(g);
            int w = cs[first + 1] - cs[first];
            int segMark = segOffset.size();
            int partMark = groupStart.size();
            int nodeMark = groupNode.size();
            boolean ok = w > 0;
            for (int pos = 0; ok && pos < w; ) {
                partStart.add(groupStart.size());
                int len = segment(c, cs[first], w, pos, groupStart, groupNode);
                ok = len > 0;
                segOffset.add(pos);
                segLength.add(len);
                pos += len;
            }
            long exps = 0;
            int segs = segOffset.size() - segMark;
            if (segs > 1) {
                exps += segs;
            }
            for (int p = partMark; p < groupStart.size(); p++) {
                int size = (p + 1 < groupStart.size() ? groupStart.get(p + 1) : groupNode.size()) - groupStart.get(p);
                if (size > 1) {
                    exps += size;
                }
            }
            long edges = (long) k * w;
            double[] maxLw = ok ? rowMaxima(c, first, k, w, memberNext) : null;
            ok = maxLw != null
                    && (everyCandidate || (edges >= MIN_BLOCK_EDGES && edges >= 2 * Math.max(1, exps)));
            if (!ok) {
                segOffset.truncate(segMark);
                segLength.truncate(segMark);
                partStart.truncate(segMark);
                groupStart.truncate(partMark);
                groupNode.truncate(nodeMark);
                continue;
            }
            int b = width.size();
            segStart.add(segMark);
            width.add(w);
            sumStart.add(sumNode.size());
            DMatrixRMaj m = new DMatrixRMaj(k, w);
            int row = 0;
            for (int s = first; s >= 0; s = memberNext[s], row++) {
                sumNode.add(s);
                double max = maxLw[row];
                for (int j = 0; j < w; j++) {
                    m.data[row * w + j] = max == Double.NEGATIVE_INFINITY ? 0 : Math.exp(c.logWeight[cs[s] + j] - max);
                }
                action[s] = s == first ? DenseBlocks.BLOCK : DenseBlocks.BLOCK_SUM;
            }
            blockAt[first] = b;
            weights.add(m);
            maxLogWeights.add(maxLw);
            blockEdges += edges;
            int list0 = cs[first];
            for (int j = 0; j < w; j++) {
                occ[ci[list0 + j]]++;
            }
            for (int j = 0; j < w; j++) {
                int q = ci[list0 + j];
                if (occ[q] > 0) {
                    if (refs[q] == (long) k * occ[q]) {
                        action[q] = DenseBlocks.SKIP;
                        blockEdges += cs[q + 1] - cs[q];
                    }
                    occ[q] = 0;
                }
            }
        }
        segStart.add(segOffset.size());
        sumStart.add(sumNode.size());
        partStart.add(groupStart.size());
        groupStart.add(groupNode.size());
        double[] maxLogWeight = new double[sumNode.size()];
        int at = 0;
        for (double[] rowMax : maxLogWeights) {
            System.arraycopy(rowMax, 0, maxLogWeight, at, rowMax.length);
            at += rowMax.length;
        }
        int[] sumStarts = sumStart.toArray();
        int[] sums = sumNode.toArray();
        int[] segStarts = segStart.toArray();
        int[] partStarts = partStart.toArray();
        int[] groupStarts = groupStart.toArray();
        int[] groupNodes = groupNode.toArray();
        fuseInputProducts(c, action, refs);
        int[] nodeSlot = new int[n];
        int[] childSlot = new int[ci.length];
        LinearSlots linear = new LinearSlots(c, action, sumStarts, sums, maxLogWeight, segStarts, partStarts,
                groupStarts, groupNodes);
        int slotCount = assignSlots(c, action, blockAt, sumStarts, sums, segStarts, partStarts, groupStarts, groupNodes,
                nodeSlot, childSlot, linear);
        return new DenseBlocks(action, blockAt, sumStarts, sums, maxLogWeight, width.toArray(),
                weights.toArray(new DMatrixRMaj[0]), segStarts, segOffset.toArray(), segLength.toArray(),
                partStarts, groupStarts, groupNodes, blockEdges, nodeSlot, childSlot, slotCount, linear, c);
    }

    /**
     * Marks {@link DenseBlocks#FUSED} every product still evaluated by itself whose children are all
     * univariate inputs read by nothing else (not outputs, each once), and those inputs
     * {@link DenseBlocks#SKIP}: the product is then the sum of its inputs' log-densities, never stored.
     */
    private static void fuseInputProducts(CircuitData c, byte[] action, int[] refs) {
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        for (int i = 0; i < c.nodeCount; i++) {
            if (c.kind[i] != CircuitData.PRODUCT || action[i] != DenseBlocks.GENERIC || cs[i + 1] == cs[i]) {
                continue;
            }
            boolean ok = true;
            for (int e = cs[i]; ok && e < cs[i + 1]; e++) {
                int q = ci[e];
                int slot = c.inputSlot[q];
                ok = c.kind[q] == CircuitData.INPUT && refs[q] == 1 && action[q] == DenseBlocks.GENERIC
                        && c.varStart[slot + 1] - c.varStart[slot] == 1;
            }
            if (ok) {
                action[i] = DenseBlocks.FUSED;
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    action[ci[e]] = DenseBlocks.SKIP;
                }
            }
        }
    }

    /**
     * Linear-scan slot assignment in node order: a node gets a free slot when it is evaluated (a block's
     * sums all at the block, and a linear block's offset with them) and gives it back after its last reader
     * (outputs never; a linear block's offset after the last reader of its sums). Fills {@code nodeSlot},
     * {@code childSlot} and the slots of {@code linear}; returns the number of slots.
     */
    private static int assignSlots(CircuitData c, byte[] action, int[] blockAt, int[] sumStart, int[] sumNode,
            int[] segStart, int[] partStart, int[] groupStart, int[] groupNode, int[] nodeSlot, int[] childSlot,
            LinearSlots linear) {
        final int n = c.nodeCount;
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        final int never = Integer.MAX_VALUE;
        int[] lastUse = new int[n];
        Arrays.fill(lastUse, -1);
        for (int i = 0; i < n; i++) {
            if (action[i] == DenseBlocks.GENERIC) {
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    lastUse[ci[e]] = Math.max(lastUse[ci[e]], i);
                }
            } else if (action[i] == DenseBlocks.BLOCK) {
                int b = blockAt[i];
                for (int g = groupStart[partStart[segStart[b]]]; g < groupStart[partStart[segStart[b + 1]]]; g++) {
                    lastUse[groupNode[g]] = Math.max(lastUse[groupNode[g]], i);
                }
            }
        }
        for (int o : c.outputNode) {
            lastUse[o] = never;
        }
        // a linear block's offset is read by every reader of its sums
        int[] offsetLastUse = new int[sumStart.length - 1];
        for (int b = 0; b < offsetLastUse.length; b++) {
            for (int k = sumStart[b]; k < sumStart[b + 1]; k++) {
                offsetLastUse[b] = Math.max(offsetLastUse[b], lastUse[sumNode[k]]);
            }
        }
        Arrays.fill(nodeSlot, -1);
        int[] free = new int[n];
        int freeCount = 0;
        int slots = 0;
        for (int i = 0; i < n; i++) {
            byte a = action[i];
            if (a == DenseBlocks.FUSED) {
                nodeSlot[i] = freeCount > 0 ? free[--freeCount] : slots++;
                if (lastUse[i] == -1) {
                    free[freeCount++] = nodeSlot[i];
                    lastUse[i] = -2;
                }
            } else if (a == DenseBlocks.GENERIC) {
                nodeSlot[i] = freeCount > 0 ? free[--freeCount] : slots++;
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    childSlot[e] = nodeSlot[ci[e]];
                }
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    int child = ci[e];
                    if (lastUse[child] == i) {
                        free[freeCount++] = nodeSlot[child];
                        lastUse[child] = -2;
                    }
                }
                if (lastUse[i] == -1) {
                    free[freeCount++] = nodeSlot[i];
                    lastUse[i] = -2;
                }
            } else if (a == DenseBlocks.BLOCK) {
                int b = blockAt[i];
                for (int k = sumStart[b]; k < sumStart[b + 1]; k++) {
                    nodeSlot[sumNode[k]] = freeCount > 0 ? free[--freeCount] : slots++;
                }
                if (linear.linear[b]) {
                    linear.offsetSlot[b] = freeCount > 0 ? free[--freeCount] : slots++;
                }
                // the block's products read their children (the parts) here, for the exact path
                int list0 = cs[i];
                for (int j = list0; j < cs[i + 1]; j++) {
                    int q = ci[j];
                    for (int e = cs[q]; e < cs[q + 1]; e++) {
                        childSlot[e] = nodeSlot[ci[e]];
                        int from = linear.linearBlockOf(ci[e]);
                        linear.childOffsetSlot[e] = from < 0 ? -1 : linear.offsetSlot[from];
                    }
                }
                for (int p = partStart[segStart[b]]; p < partStart[segStart[b + 1]]; p++) {
                    int from = linear.linearBlockOf(groupNode[groupStart[p]]);
                    linear.partOffsetSlot[p] = from < 0 ? -1 : linear.offsetSlot[from];
                }
                for (int g = groupStart[partStart[segStart[b]]]; g < groupStart[partStart[segStart[b + 1]]]; g++) {
                    int part = groupNode[g];
                    if (lastUse[part] == i) {
                        free[freeCount++] = nodeSlot[part];
                        lastUse[part] = -2;
                    }
                    int from = linear.linearBlockOf(part);
                    if (from >= 0 && offsetLastUse[from] == i) {
                        free[freeCount++] = linear.offsetSlot[from];
                        offsetLastUse[from] = -2;
                    }
                }
                for (int k = sumStart[b]; k < sumStart[b + 1]; k++) {
                    int s = sumNode[k];
                    if (lastUse[s] == -1) {
                        free[freeCount++] = nodeSlot[s];
                        lastUse[s] = -2;
                    }
                }
            }
        }
        return Math.max(1, slots);
    }

    /**
     * Appends the largest verified cross-product segment of the list at {@code list0} (length {@code w})
     * that starts at position {@code pos}: one entry in {@code groupStart} per part, the part's nodes in
     * {@code groupNode}. A product that starts no larger segment is a segment of its own (every part one
     * node).
     *
     * @return the segment's length, or 0 when the product has no children
     */
    private static int segment(CircuitData c, int list0, int w, int pos, IntList groupStart, IntList groupNode) {
        final int[] cs = c.childStart;
        final int[] ci = c.childIndex;
        int p0 = ci[list0 + pos];
        int c0 = cs[p0];
        int m = cs[p0 + 1] - c0;
        if (m == 0) {
            return 0;
        }
        int[] size = new int[m];
        int[] stride = new int[m];
        long len = 1;
        for (int t = m - 1; t >= 0; t--) {
            stride[t] = (int) len;
            int cnt = 1;
            while (pos + cnt * len < w) {
                int q = ci[list0 + pos + (int) (cnt * len)];
                if (!sameExcept(cs, ci, q, c0, m, t)) {
                    break;
                }
                cnt++;
            }
            size[t] = cnt;
            len *= cnt;
        }
        // group_t[d] is child t of the product at pos + d * stride[t]
        int bad = (int) len;
        for (int u = 0; u < len && bad == len; u++) {
            int q = ci[list0 + pos + u];
            if (cs[q + 1] - cs[q] != m) {
                bad = u;
                break;
            }
            for (int t = 0; t < m; t++) {
                int d = u / stride[t] % size[t];
                int expected = ci[cs[ci[list0 + pos + d * stride[t]]] + t];
                if (ci[cs[q] + t] != expected) {
                    bad = u;
                    break;
                }
            }
        }
        if (bad < len) {
            int firstSize = bad / stride[0];
            if (firstSize == 0) {
                Arrays.fill(size, 1);
                len = 1;
            } else {
                size[0] = firstSize;
                len = (long) firstSize * stride[0];
            }
        }
        for (int t = 0; t < m; t++) {
            groupStart.add(groupNode.size());
            for (int d = 0; d < size[t]; d++) {
                groupNode.add(ci[cs[ci[list0 + pos + d * stride[t]]] + t]);
            }
        }
        return (int) len;
    }

    /** Whether product q has m children equal to those at {@code c0}, except possibly child t. */
    private static boolean sameExcept(int[] cs, int[] ci, int q, int c0, int m, int t) {
        if (cs[q + 1] - cs[q] != m) {
            return false;
        }
        int cq = cs[q];
        for (int a = 0; a < m; a++) {
            if (a != t && ci[cq + a] != ci[c0 + a]) {
                return false;
            }
        }
        return true;
    }

    /** Per member sum, its largest log-weight; null when one is +inf or NaN (no linear form). */
    private static double[] rowMaxima(CircuitData c, int first, int k, int w, int[] memberNext) {
        double[] max = new double[k];
        int row = 0;
        for (int s = first; s >= 0; s = memberNext[s], row++) {
            double mx = Double.NEGATIVE_INFINITY;
            for (int j = 0; j < w; j++) {
                double lw = c.logWeight[c.childStart[s] + j];
                if (Double.isNaN(lw) || lw == Double.POSITIVE_INFINITY) {
                    return null;
                }
                mx = Math.max(mx, lw);
            }
            max[row] = mx;
        }
        return max;
    }

    private static boolean allProducts(CircuitData c, int i) {
        int end = c.childStart[i + 1];
        for (int e = c.childStart[i]; e < end; e++) {
            if (c.kind[c.childIndex[e]] != CircuitData.PRODUCT) {
                return false;
            }
        }
        return end > c.childStart[i];
    }

    private static boolean sameList(int[] cs, int[] ci, int a, int b) {
        int len = cs[a + 1] - cs[a];
        if (cs[b + 1] - cs[b] != len) {
            return false;
        }
        return Arrays.equals(ci, cs[a], cs[a] + len, ci, cs[b], cs[b] + len);
    }

    private static long hash(int[] ci, int from, int to) {
        long h = (to - from) * 0x9E3779B97F4A7C15L;
        for (int e = from; e < to; e++) {
            h = (h ^ ci[e]) * 0xFF51AFD7ED558CCDL;
            h ^= h >>> 29;
        }
        return h;
    }
}
