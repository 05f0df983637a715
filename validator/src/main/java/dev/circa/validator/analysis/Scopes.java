package dev.circa.validator.analysis;

import dev.circa.engine.internal.IntList;
import dev.circa.format.NodeTable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Every node's scope as an interned id, found children first in one pass, with the sums whose
 * children's scopes differ and the products whose children's scopes overlap. Products and sums
 * over the same children's scopes share one union, so the pass costs about one hash lookup per edge.
 */
public final class Scopes {
    private final Graph g;
    private final ScopeTable table = new ScopeTable();
    private final int[] scope;
    private final int[] depth;
    /** Sums whose children's scopes are not all equal. */
    public final IntList nonSmooth = new IntList();
    /** Products two of whose children's scopes share a variable. */
    public final IntList overlapping = new IntList();
    private final Map<ScopeTable.Key, Decomposition> decompositions = new HashMap<>();
    private final List<Decomposition> decompositionList = new ArrayList<>();
    private final Map<ScopeTable.Key, Integer> sumUnions = new HashMap<>();
    /** The scope id of each single variable, or -1 until first met. */
    private final int[] single;
    /** The children's scopes of the sum being looked at (reused from sum to sum). */
    private int[] buf = new int[16];
    private Decomposition lastPair;
    private int lastS0;
    private int lastS1;

    /**
     * How one or more products split their scope.
     *
     * @param scope the product's scope id
     * @param parts the children's scope ids, sorted (repeats kept)
     * @param example the index of the first product with this split
     * @param overlap whether two parts share a variable
     */
    public record Decomposition(int scope, int[] parts, int example, boolean overlap) {
    }

    private Scopes(Graph g) {
        this.g = g;
        int n = g.size();
        scope = new int[n];
        depth = new int[n];
        single = new int[g.document().variables().size()];
        Arrays.fill(single, -1);
        NodeTable t = g.document().nodeTable();
        // node by node in small steps (one per kind), so that each is compiled on its own early
        for (int i = 0; i < n; i++) {
            byte k = g.kind(i);
            if (k == Graph.INPUT) {
                scope[i] = inputScope(t, i);
            } else if (k == Graph.SUM) {
                scope[i] = sumScope(i);
            } else {
                scope[i] = productScope(i);
            }
        }
    }

    /** The scope of input {@code i}: its variables, sorted and without repeats. */
    private int inputScope(NodeTable t, int i) {
        int va = t.varStart(i);
        int vb = t.varEnd(i);
        if (vb - va == 1) {
            int x = t.var(va);
            if (single[x] < 0) {
                single[x] = table.intern(new int[] {x});
            }
            return single[x];
        }
        int[] s = new int[vb - va];
        for (int p = va; p < vb; p++) {
            s[p - va] = t.var(p);
        }
        Arrays.sort(s);
        return table.intern(dedupe(s));
    }

    /** The scope of sum {@code i} (its depth on the way), recording it when its children's scopes differ. */
    private int sumScope(int i) {
        int a = g.childStart(i);
        int b = g.childEnd(i);
        int first = scope[g.child(a)];
        boolean same = true;
        int d = 0;
        for (int e = a; e < b; e++) {
            int c = g.child(e);
            d = Math.max(d, depth[c] + 1);
            same &= scope[c] == first;
        }
        depth[i] = d;
        if (same) {
            return first;
        }
        nonSmooth.add(i);
        if (buf.length < b - a) {
            buf = new int[b - a];
        }
        for (int e = a; e < b; e++) {
            buf[e - a] = scope[g.child(e)];
        }
        int[] key = Arrays.copyOf(buf, b - a);
        Arrays.sort(key);
        ScopeTable.Key kk = new ScopeTable.Key(key);
        Integer u = sumUnions.get(kk);
        if (u == null) {
            u = table.intern(union(key, false));
            sumUnions.put(kk, u);
        }
        return u;
    }

    /** The scope of product {@code i} (its depth on the way), recording it when its children's scopes overlap. */
    private int productScope(int i) {
        int a = g.childStart(i);
        int b = g.childEnd(i);
        int d = 0;
        for (int e = a; e < b; e++) {
            d = Math.max(d, depth[g.child(e)] + 1);
        }
        depth[i] = d;
        if (b - a == 1) {
            int only = scope[g.child(a)];
            decomposition(i, new int[] {only});
            return only;
        }
        Decomposition dc;
        int s0 = scope[g.child(a)];
        int s1 = b - a == 2 ? scope[g.child(a + 1)] : -1;
        if (b - a == 2 && lastPair != null && s0 == lastS0 && s1 == lastS1) {
            // a partition's cross product: runs of products over the same pair of scopes
            dc = lastPair;
        } else {
            int[] key = new int[b - a];
            for (int e = a; e < b; e++) {
                key[e - a] = scope[g.child(e)];
            }
            Arrays.sort(key);
            dc = decomposition(i, key);
            if (b - a == 2) {
                lastPair = dc;
                lastS0 = s0;
                lastS1 = s1;
            }
        }
        if (dc.overlap) {
            overlapping.add(i);
        }
        return dc.scope;
    }

    private Decomposition decomposition(int node, int[] sortedParts) {
        ScopeTable.Key kk = new ScopeTable.Key(sortedParts);
        Decomposition dc = decompositions.get(kk);
        if (dc == null) {
            int[] u = union(sortedParts, true);
            boolean overlap = u == null;
            if (overlap) {
                u = union(sortedParts, false);
            }
            dc = new Decomposition(table.intern(u), sortedParts, node, overlap);
            decompositions.put(kk, dc);
            decompositionList.add(dc);
        }
        return dc;
    }

    /** The sorted union of the scopes {@code parts}; with {@code disjoint}, {@code null} if two share a variable. */
    private int[] union(int[] parts, boolean disjoint) {
        int total = 0;
        for (int p : parts) {
            total += table.vars(p).length;
        }
        int[] all = new int[total];
        int o = 0;
        for (int p : parts) {
            int[] v = table.vars(p);
            System.arraycopy(v, 0, all, o, v.length);
            o += v.length;
        }
        Arrays.sort(all);
        for (int i = 1; i < all.length; i++) {
            if (all[i] == all[i - 1]) {
                if (disjoint) {
                    return null;
                }
                return dedupe(all);
            }
        }
        return all;
    }

    private static int[] dedupe(int[] sorted) {
        int m = 0;
        for (int i = 0; i < sorted.length; i++) {
            if (i == 0 || sorted[i] != sorted[i - 1]) {
                sorted[m++] = sorted[i];
            }
        }
        return m == sorted.length ? sorted : Arrays.copyOf(sorted, m);
    }

    /** Computes the scopes of a {@link Graph#usable() usable} graph. */
    public static Scopes of(Graph g) {
        return new Scopes(g);
    }

    public ScopeTable table() {
        return table;
    }

    /** The scope id of node {@code i}. */
    public int scope(int i) {
        return scope[i];
    }

    /** The variables of node {@code i}'s scope, sorted; callers must not modify. */
    public int[] vars(int i) {
        return table.vars(scope[i]);
    }

    /** Edges on the longest path from node {@code i} down to an input. */
    public int depth(int i) {
        return depth[i];
    }

    /** Every distinct way products split their scopes, in order of first appearance. */
    public List<Decomposition> decompositions() {
        return decompositionList;
    }

    /**
     * For a sum in {@link #nonSmooth}: {variable, child index with it, child index without it}.
     */
    public int[] smoothWitness(int sum) {
        int a = g.childStart(sum);
        int b = g.childEnd(sum);
        int[] u = vars(sum);
        for (int v : u) {
            int with = -1;
            int without = -1;
            for (int e = a; e < b; e++) {
                int c = g.child(e);
                if (table.contains(scope[c], v)) {
                    with = with < 0 ? c : with;
                } else {
                    without = without < 0 ? c : without;
                }
            }
            if (with >= 0 && without >= 0) {
                return new int[] {v, with, without};
            }
        }
        throw new IllegalStateException("sum " + g.id(sum) + " is smooth");
    }

    /**
     * For a product in {@link #overlapping}: {variable, first child index, second child index} of two
     * children (distinct references) whose scopes both hold the variable.
     */
    public int[] overlapWitness(int product) {
        int a = g.childStart(product);
        int b = g.childEnd(product);
        Map<Integer, Integer> seen = new HashMap<>();
        for (int e = a; e < b; e++) {
            int c = g.child(e);
            for (int v : vars(c)) {
                Integer prev = seen.putIfAbsent(v, c);
                if (prev != null) {
                    return new int[] {v, prev, c};
                }
            }
        }
        throw new IllegalStateException("product " + g.id(product) + " is decomposable");
    }
}
