package dev.circa.converter.regions;

import dev.circa.converter.reference.ReferenceDensities;
import dev.circa.format.Family;
import java.util.ArrayDeque;
import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;

/**
 * What every direct evaluator of one model shares, computed once ({@link RegionTensorEvaluator#sharing()}): the
 * parameters and their graph, each variable's family, the scaled weights ({@link ScaledWeights}), the normal
 * leaf inputs read in order, and the slot that holds each region's block. Immutable once built.
 */
final class DirectModel {
    final RegionParameters p;
    final RegionStructure s;
    final Layout layout;
    final int[] order;
    /** The family of each variable. */
    final Family[] family;
    final ScaledWeights weights;
    /**
     * Per leaf region, where its inputs start in the three arrays below (input j of bundle i at
     * {@code leafBase[r] + i * vars + j}): the mean, sd and log sd of each normal input with a
     * {@link ReferenceDensities#plain} mean, NaN for other inputs. Read in order,
     * block after block, instead of the parameters' small arrays (on the 9 * 10^6-edge circuit with K = I = 4 the
     * walk over those 4.3 million arrays and a log per input and block took about as long as the densities).
     */
    final int[] leafBase;
    final double[] normalMean;
    final double[] normalSd;
    final double[] normalLogSd;
    /** Per region: the slot that holds its block of values while a later region reads it. */
    final int[] slot;
    /** Per slot: the number of nodes of the regions it serves. */
    final int[] slotSize;
    /** The most children of a region's sums, and the most sums of a region (at least 1 each). */
    final int maxChildren;
    final int maxSums;

    /** The shared state of the evaluators of the model that {@code params} define. */
    DirectModel(RegionParameters params) {
        this.p = params;
        this.s = params.structure();
        this.layout = params.layout();
        this.order = s.order();
        this.family = new Family[s.variables().size()];
        for (int v = 0; v < family.length; v++) {
            family[v] = params.family(v);
        }
        this.weights = new ScaledWeights(params);
        int nr = s.regionCount();
        int children = 1;
        int sums = 1;
        for (int r = 0; r < nr; r++) {
            children = Math.max(children, layout.children(r));
            sums = Math.max(sums, layout.sums(r));
        }
        this.maxChildren = children;
        this.maxSums = sums;
        this.leafBase = new int[nr];
        int leafInputs = 0;
        int bundles = params.options().inputs();
        for (int r = 0; r < nr; r++) {
            leafBase[r] = leafInputs;
            leafInputs = s.isLeaf(r) ? Math.addExact(leafInputs, Math.multiplyExact(bundles, s.vars(r).length)) : leafInputs;
        }
        this.normalMean = new double[leafInputs];
        this.normalSd = new double[leafInputs];
        this.normalLogSd = new double[leafInputs];
        for (int r = 0; r < nr; r++) {
            if (!s.isLeaf(r)) {
                continue;
            }
            int[] vars = s.vars(r);
            for (int i = 0; i < bundles; i++) {
                for (int j = 0; j < vars.length; j++) {
                    int q = leafBase[r] + i * vars.length + j;
                    double[] prm = params.inputParams(r, i, j);
                    boolean normal = family[vars[j]] == Family.NORMAL && ReferenceDensities.plain(prm[0], true);
                    normalMean[q] = normal ? prm[0] : Double.NaN;
                    normalSd[q] = normal ? prm[1] : Double.NaN;
                    normalLogSd[q] = normal ? Math.log(prm[1]) : Double.NaN;
                }
            }
        }
        this.slot = new int[nr];
        this.slotSize = assignSlots(s, layout, slot);
    }

    /** Number of outputs (C). */
    int outputCount() {
        return p.options().outputs();
    }

    /**
     * Gives each region a slot, reused once every region that reads it is done (regions in
     * {@link RegionStructure#order()}), so that the blocks held at once are few whatever the number of
     * regions; returns each slot's size in nodes.
     */
    private static int[] assignSlots(RegionStructure s, Layout layout, int[] slot) {
        int nr = s.regionCount();
        int[] order = s.order();
        int[] position = new int[nr];
        for (int i = 0; i < nr; i++) {
            position[order[i]] = i;
        }
        int[] lastUse = new int[nr];
        Arrays.fill(lastUse, -1);
        for (int part = 0; part < s.partitionCount(); part++) {
            int reader = position[s.partitionRegion(part)];
            for (int q : s.parts(part)) {
                lastUse[q] = Math.max(lastUse[q], reader);
            }
        }
        // regions whose last reader is at position i, as linked lists
        int[] first = new int[nr];
        int[] next = new int[nr];
        Arrays.fill(first, -1);
        for (int r = 0; r < nr; r++) {
            if (lastUse[r] >= 0) {
                next[r] = first[lastUse[r]];
                first[lastUse[r]] = r;
            }
        }
        Map<Integer, ArrayDeque<Integer>> free = new HashMap<>();
        int[] sizes = new int[Math.max(1, nr)];
        int slots = 0;
        for (int i = 0; i < nr; i++) {
            int r = order[i];
            ArrayDeque<Integer> same = free.get(layout.size(r));
            if (same != null && !same.isEmpty()) {
                slot[r] = same.pop();
            } else {
                sizes[slots] = layout.size(r);
                slot[r] = slots++;
            }
            for (int q = first[i]; q >= 0; q = next[q]) {
                free.computeIfAbsent(layout.size(q), k -> new ArrayDeque<>()).push(slot[q]);
            }
        }
        return Arrays.copyOf(sizes, slots);
    }
}
