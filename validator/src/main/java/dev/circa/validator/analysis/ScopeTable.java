package dev.circa.validator.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Hash-consed scopes: each distinct sorted set of variable indices is stored once and named by a
 * small int, so equal scopes have equal ids and a sum's smoothness is an id comparison.
 */
public final class ScopeTable {
    private final List<int[]> scopes = new ArrayList<>();
    private final Map<Key, Integer> ids = new HashMap<>();

    /** The id of the sorted, duplicate-free {@code vars} (kept, not copied). */
    public int intern(int[] vars) {
        Key k = new Key(vars);
        Integer id = ids.get(k);
        if (id != null) {
            return id;
        }
        int nid = scopes.size();
        scopes.add(vars);
        ids.put(k, nid);
        return nid;
    }

    /** The variables of scope {@code id}, sorted; callers must not modify. */
    public int[] vars(int id) {
        return scopes.get(id);
    }

    public int size() {
        return scopes.size();
    }

    /** Whether scope {@code id} contains {@code v}. */
    public boolean contains(int id, int v) {
        return Arrays.binarySearch(scopes.get(id), v) >= 0;
    }

    /** An int array compared by content. */
    static final class Key {
        final int[] a;
        final int hash;

        Key(int[] a) {
            this.a = a;
            this.hash = Arrays.hashCode(a);
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Key k && k.hash == hash && Arrays.equals(k.a, a);
        }

        @Override
        public int hashCode() {
            return hash;
        }
    }
}
