package dev.circa.validator.analysis;

import dev.circa.engine.internal.IntList;
import dev.circa.validator.VariableTree;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Decides structured decomposability (FORMAT.md: one variable tree such that every product's scope
 * is a tree node's variable set and its children's scopes are unions of disjoint groups of that
 * node's children) for products of any arity, and builds the finest such tree.
 *
 * <p>The finest candidate has exactly the product scopes (plus the variables and the set of all
 * variables) as nodes; it exists only when the product scopes are laminar. Any other tree has
 * coarser children under some product scope, so if a product's split cuts a child of the finest
 * tree, no tree fits. The passes cost the total size of the distinct product scopes and splits.
 */
public final class TreeFinder {
    /**
     * The outcome.
     *
     * @param tree the variable tree, or {@code null} when there is none
     * @param product the index of a product that no tree fits, or -1
     * @param reason why that product fits no tree
     */
    public record Result(VariableTree tree, int product, String reason) {
    }

    private TreeFinder() {
    }

    /** Finds the variable tree of a decomposable circuit, or a product no tree fits. */
    public static Result find(Graph g, Scopes s) {
        ScopeTable t = s.table();
        Map<Integer, Integer> exampleOf = new HashMap<>();
        for (Scopes.Decomposition d : s.decompositions()) {
            if (d.overlap()) {
                return new Result(null, d.example(), "has children whose scopes overlap, so no split of a tree node gives them");
            }
            exampleOf.putIfAbsent(d.scope(), d.example());
        }
        List<Integer> sets = treeSets(t, exampleOf);
        int nv = g.document().variables().size();
        int m = sets.size();
        // tree node numbering: 0 = root (all variables) unless a set equals it; sets 1..m; leaves after.
        int[] owner = new int[nv];
        int[] parent = new int[m + 1];
        int[] nodeOfScope = new int[t.size()];
        Arrays.fill(nodeOfScope, -1);
        Result crossing = nest(g, t, sets, exampleOf, owner, parent, nodeOfScope);
        if (crossing != null) {
            return crossing;
        }
        IntList[] kids = kids(m, nv, owner, parent);
        Result split = checkSplits(g, s, sets, exampleOf, nodeOfScope, kids, m + 1);
        if (split != null) {
            return split;
        }
        if (nv == 0) {
            return new Result(null, -1, "the circuit has no variables");
        }
        return new Result(build(t, sets, kids, nv), -1, null);
    }

    /** Tree nodes: the product scopes of two or more variables, largest first. */
    private static List<Integer> treeSets(ScopeTable t, Map<Integer, Integer> exampleOf) {
        List<Integer> sets = new ArrayList<>();
        for (Integer sc : exampleOf.keySet()) {
            if (t.vars(sc).length >= 2) {
                sets.add(sc);
            }
        }
        sets.sort((x, y) -> {
            int c = Integer.compare(t.vars(y).length, t.vars(x).length);
            return c != 0 ? c : Integer.compare(t.vars(x)[0], t.vars(y)[0]);
        });
        return sets;
    }

    /**
     * Places each set under the smallest set before it that holds it (its {@code parent}; 0, the root,
     * when none does), with {@code owner} the innermost set of each variable so far; the product of a set
     * that crosses an earlier one, or {@code null}.
     */
    private static Result nest(Graph g, ScopeTable t, List<Integer> sets, Map<Integer, Integer> exampleOf, int[] owner,
            int[] parent, int[] nodeOfScope) {
        for (int k = 0; k < sets.size(); k++) {
            int sc = sets.get(k);
            int[] v = t.vars(sc);
            int node = k + 1;
            nodeOfScope[sc] = node;
            int p = owner[v[0]];
            for (int x : v) {
                if (owner[x] != p) {
                    return crossing(g, t, sets, exampleOf, sc, p, owner[x]);
                }
            }
            parent[node] = p;
            for (int x : v) {
                owner[x] = node;
            }
        }
        return null;
    }

    private static Result crossing(Graph g, ScopeTable t, List<Integer> sets, Map<Integer, Integer> exampleOf, int sc, int p,
            int q) {
        int crossing = p == 0 ? q : q == 0 ? p
                : t.vars(sets.get(p - 1)).length <= t.vars(sets.get(q - 1)).length ? p : q;
        return new Result(null, exampleOf.get(sc), String.format(java.util.Locale.ROOT,
                "has the scope %s, which crosses the scope %s of product %d: neither holds the other, so they "
                        + "cannot both be nodes of one variable tree",
                Arrays.toString(t.vars(sc)), Arrays.toString(t.vars(sets.get(crossing - 1))),
                g.id(exampleOf.get(sets.get(crossing - 1)))));
    }

    /** Children lists of the root and the sets: sets by parent, variables (leaf m + 1 + x) by final owner. */
    private static IntList[] kids(int m, int nv, int[] owner, int[] parent) {
        int leafBase = m + 1;
        IntList[] kids = new IntList[m + 1];
        for (int i = 0; i <= m; i++) {
            kids[i] = new IntList();
        }
        for (int k = 1; k <= m; k++) {
            kids[parent[k]].add(k);
        }
        for (int x = 0; x < nv; x++) {
            kids[owner[x]].add(leafBase + x);
        }
        return kids;
    }

    /** The first split that cuts a child of its tree node (no tree has both), or {@code null}. */
    private static Result checkSplits(Graph g, Scopes s, List<Integer> sets, Map<Integer, Integer> exampleOf,
            int[] nodeOfScope, IntList[] kids, int leafBase) {
        ScopeTable t = s.table();
        int[] label = new int[g.document().variables().size()];
        Arrays.fill(label, -1);
        for (Scopes.Decomposition d : s.decompositions()) {
            if (t.vars(d.scope()).length < 2) {
                continue;
            }
            int kv = cutChild(t, d, sets, kids[nodeOfScope[d.scope()]], leafBase, label);
            if (kv >= 0) {
                return new Result(null, d.example(), String.format(java.util.Locale.ROOT,
                        "splits the variables %s, which product %d keeps together as its "
                                + "scope, so no variable tree has both",
                        Arrays.toString(t.vars(sets.get(kv - 1))), g.id(exampleOf.get(sets.get(kv - 1)))));
            }
        }
        return null;
    }

    /** The first set among {@code ks} whose variables {@code d}'s parts do not keep in one part, or -1. */
    private static int cutChild(ScopeTable t, Scopes.Decomposition d, List<Integer> sets, IntList ks, int leafBase, int[] label) {
        for (int p = 0; p < d.parts().length; p++) {
            for (int x : t.vars(d.parts()[p])) {
                label[x] = p;
            }
        }
        for (int c = 0; c < ks.size(); c++) {
            int kid = ks.get(c);
            if (kid >= leafBase) {
                continue;
            }
            int[] kv = t.vars(sets.get(kid - 1));
            int l = label[kv[0]];
            for (int x : kv) {
                if (label[x] != l) {
                    return kid;
                }
            }
        }
        return -1;
    }

    /** The tree, children ordered by their smallest variable; a root with a single child is that child. */
    private static VariableTree build(ScopeTable t, List<Integer> sets, IntList[] kids, int nv) {
        int m = sets.size();
        int leafBase = m + 1;
        int total = leafBase + nv;
        int[][] children = new int[total][];
        int[] leafVar = new int[total];
        Arrays.fill(leafVar, -1);
        for (int x = 0; x < nv; x++) {
            children[leafBase + x] = new int[0];
            leafVar[leafBase + x] = x;
        }
        for (int k = 0; k <= m; k++) {
            children[k] = byFirstVariable(t, sets, kids[k], leafBase);
        }
        int root = 0;
        while (root < total && leafVar[root] < 0 && children[root].length == 1) {
            root = children[root][0];
        }
        return new VariableTree(children, leafVar, root);
    }

    /**
     * The tree nodes {@code ks} sorted by their smallest variable (distinct: siblings hold disjoint
     * variables), each packed with it into one long so that a primitive sort orders them.
     */
    private static int[] byFirstVariable(ScopeTable t, List<Integer> sets, IntList ks, int leafBase) {
        long[] keyed = new long[ks.size()];
        for (int c = 0; c < keyed.length; c++) {
            int kid = ks.get(c);
            int first = kid >= leafBase ? kid - leafBase : t.vars(sets.get(kid - 1))[0];
            keyed[c] = ((long) first << 32) | kid;
        }
        Arrays.sort(keyed);
        int[] out = new int[keyed.length];
        for (int c = 0; c < keyed.length; c++) {
            out[c] = (int) keyed[c];
        }
        return out;
    }
}
