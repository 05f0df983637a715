package dev.circa.converter.render;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.NodeKind;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The scope of every node of a compiled circuit (an input's variables; a product's or sum's, the
 * union of its children's), computed in the children-first order without recursion. Equal scopes
 * share one id and one sorted array, so a circuit with millions of nodes over few distinct scopes
 * stays small. Immutable once built.
 */
final class InternedScopes {
    private final int[] scopeOfNode;
    private final List<int[]> scopes;

    private InternedScopes(int[] scopeOfNode, List<int[]> scopes) {
        this.scopeOfNode = scopeOfNode;
        this.scopes = scopes;
    }

    /** Computes the scopes of every node of {@code c}. */
    static InternedScopes of(CompiledCircuit c) {
        int n = c.nodeCount();
        int[] scopeOf = new int[n];
        List<int[]> scopes = new ArrayList<>();
        Map<Key, Integer> ids = new HashMap<>();
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        int[] tmp = new int[16];
        for (int i = 0; i < n; i++) {
            int[] vars;
            if (c.kind(i) == NodeKind.INPUT) {
                vars = c.inputVars(i).clone();
                Arrays.sort(vars);
                vars = dedupe(vars, vars.length);
            } else {
                int first = scopeOf[ci[cs[i]]];
                boolean same = true;
                int total = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    int s = scopeOf[ci[k]];
                    same &= s == first;
                    total += scopes.get(s).length;
                }
                if (same) {
                    scopeOf[i] = first;
                    continue;
                }
                if (tmp.length < total) {
                    tmp = new int[Math.max(total, tmp.length * 2)];
                }
                int m = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    int[] s = scopes.get(scopeOf[ci[k]]);
                    System.arraycopy(s, 0, tmp, m, s.length);
                    m += s.length;
                }
                Arrays.sort(tmp, 0, m);
                vars = dedupe(tmp, m);
            }
            Key key = new Key(vars);
            Integer id = ids.get(key);
            if (id == null) {
                id = scopes.size();
                scopes.add(vars);
                ids.put(key, id);
            }
            scopeOf[i] = id;
        }
        return new InternedScopes(scopeOf, List.copyOf(scopes));
    }

    private static int[] dedupe(int[] sorted, int m) {
        int k = 0;
        for (int i = 0; i < m; i++) {
            if (k == 0 || sorted[i] != sorted[k - 1]) {
                sorted[k++] = sorted[i];
            }
        }
        return Arrays.copyOf(sorted, k);
    }

    /** The scope id of node {@code node}: equal ids, equal scopes. */
    public int scopeOf(int node) {
        return scopeOfNode[node];
    }

    /** The variables of scope {@code id}, sorted; callers must not modify the array. */
    public int[] variables(int id) {
        return scopes.get(id);
    }

    /** The number of distinct scopes. */
    public int scopeCount() {
        return scopes.size();
    }

    private record Key(int[] vars) {
        @Override
        public boolean equals(Object o) {
            return o instanceof Key k && Arrays.equals(vars, k.vars);
        }

        @Override
        public int hashCode() {
            return Arrays.hashCode(vars);
        }
    }
}
