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
        int nv = g.document().variables().size();
        ScopeTable t = s.table();
        Map<Integer, Integer> exampleOf = new HashMap<>();
        for (Scopes.Decomposition d : s.decompositions()) {
            if (d.overlap()) {
                return new Result(null, d.example(), "has children whose scopes overlap, so no split of a tree node gives them");
            }
            exampleOf.putIfAbsent(d.scope(), d.example());
        }
        // Tree nodes: product scopes of two or more variables, largest first.
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
        int m = sets.size();
        // tree node numbering: 0 = root (all variables) unless a set equals it; sets 1..m; leaves after.
        int[] owner = new int[nv];
        int[] parent = new int[m + 1];
        int[] nodeOfScope = new int[t.size()];
        Arrays.fill(nodeOfScope, -1);
        for (int k = 0; k < m; k++) {
            int sc = sets.get(k);
            int[] v = t.vars(sc);
            int node = k + 1;
            nodeOfScope[sc] = node;
            int p = owner[v[0]];
            for (int x : v) {
                if (owner[x] != p) {
                    int q = owner[x];
                    int crossing = p == 0 ? q : q == 0 ? p
                            : t.vars(sets.get(p - 1)).length <= t.vars(sets.get(q - 1)).length ? p : q;
                    return new Result(null, exampleOf.get(sc), String.format(java.util.Locale.ROOT,
                            "has the scope %s, which crosses the scope %s of product %d: neither holds the other, so they "
                                    + "cannot both be nodes of one variable tree",
                            Arrays.toString(v), Arrays.toString(t.vars(sets.get(crossing - 1))),
                            g.id(exampleOf.get(sets.get(crossing - 1)))));
                }
            }
            parent[node] = p;
            for (int x : v) {
                owner[x] = node;
            }
        }
        // Children lists of inner nodes: sets by parent, variables by final owner.
        int leafBase = m + 1;
        int total = leafBase + nv;
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
        // Every split must keep each child of its tree node inside one part.
        int[] label = new int[nv];
        Arrays.fill(label, -1);
        for (Scopes.Decomposition d : s.decompositions()) {
            int[] sv = t.vars(d.scope());
            if (sv.length < 2) {
                continue;
            }
            int node = nodeOfScope[d.scope()];
            for (int p = 0; p < d.parts().length; p++) {
                for (int x : t.vars(d.parts()[p])) {
                    label[x] = p;
                }
            }
            IntList ks = kids[node];
            for (int c = 0; c < ks.size(); c++) {
                int kid = ks.get(c);
                if (kid >= leafBase) {
                    continue;
                }
                int[] kv = t.vars(sets.get(kid - 1));
                int l = label[kv[0]];
                for (int x : kv) {
                    if (label[x] != l) {
                        return new Result(null, d.example(), String.format(java.util.Locale.ROOT,
                                "splits the variables %s, which product %d keeps together as its "
                                        + "scope, so no variable tree has both",
                                Arrays.toString(kv), g.id(exampleOf.get(sets.get(kid - 1)))));
                    }
                }
            }
        }
        // Build the tree: drop a root with a single child (it is that child).
        int[][] children = new int[total][];
        int[] leafVar = new int[total];
        Arrays.fill(leafVar, -1);
        int[] minVar = new int[total];
        for (int x = 0; x < nv; x++) {
            children[leafBase + x] = new int[0];
            leafVar[leafBase + x] = x;
            minVar[leafBase + x] = x;
        }
        for (int k = 0; k <= m; k++) {
            int[] c = kids[k].toArray();
            children[k] = c;
            minVar[k] = k == 0 ? 0 : t.vars(sets.get(k - 1))[0];
        }
        for (int k = 0; k <= m; k++) {
            Integer[] boxed = Arrays.stream(children[k]).boxed().toArray(Integer[]::new);
            Arrays.sort(boxed, (x, y) -> Integer.compare(minVar[x], minVar[y]));
            for (int i = 0; i < boxed.length; i++) {
                children[k][i] = boxed[i];
            }
        }
        int root = 0;
        while (root < total && leafVar[root] < 0 && children[root].length == 1) {
            root = children[root][0];
        }
        if (nv == 0) {
            return new Result(null, -1, "the circuit has no variables");
        }
        for (int k = 0; k < total; k++) {
            if (children[k] == null) {
                children[k] = new int[0];
            }
        }
        return new Result(new VariableTree(children, leafVar, root), -1, null);
    }
}
