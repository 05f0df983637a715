package dev.circa.converter.regions;

import java.util.Arrays;

/**
 * The node layout of a compiled region graph (FORMAT.md section 3), shared by the compiler, the
 * parameter export and the tensor evaluation so that all three agree on positions and child order.
 *
 * <p>Regions are visited children first ({@link RegionStructure#order()}). A leaf region emits, for
 * each bundle i, one input per variable (in the order of its {@code vars}) and, when it has more
 * than one variable, the bundle's product. An inner region emits, per partition in document order,
 * the cross product of its parts' nodes (first part varying slowest), then its K sums (C at the
 * root) over all of those products. A root without partitions emits its bundles and then C sums
 * over them. Node positions count from 0 in emission order. Not for application code.
 */
final class Layout {
    /** Receives the nodes in order. */
    interface Visitor {
        void input(int position, int region, int bundle, int varPos) throws java.io.IOException;

        void product(int position, int region, int[] children) throws java.io.IOException;

        /** {@code children} is the same array for every sum of a region; it must not be modified. */
        void sum(int position, int region, int sum, int[] children) throws java.io.IOException;
    }

    private final RegionStructure s;
    private final CompileOptions o;
    private final int[] size;
    private final int[] childCount;

    Layout(RegionStructure s, CompileOptions o) {
        this.s = s;
        this.o = o;
        int nr = s.regionCount();
        size = new int[nr];
        childCount = new int[nr];
        for (int r : s.order()) {
            if (r == s.root()) {
                size[r] = o.outputs();
            } else {
                size[r] = s.isLeaf(r) ? o.inputs() : o.sums();
            }
            if (s.isLeaf(r)) {
                childCount[r] = r == s.root() ? o.inputs() : 0;
                continue;
            }
            long total = 0;
            for (int p : s.partitionsOf(r)) {
                long prod = 1;
                for (int q : s.parts(p)) {
                    prod *= size[q];
                    if (prod > Integer.MAX_VALUE) {
                        break;
                    }
                }
                total += prod;
                if (total > Integer.MAX_VALUE - 8) {
                    throw new IllegalArgumentException("region " + s.id(r) + " would have more than "
                            + (Integer.MAX_VALUE - 8) + " products; use fewer sums or inputs");
                }
            }
            childCount[r] = (int) total;
        }
    }

    /**
     * The number of nodes the layout of {@code s} under {@code o} emits, counted without building
     * anything and saturating at {@link Long#MAX_VALUE}, so that a region graph whose circuit would
     * not fit in memory can be refused before any allocation.
     */
    static long nodeCount(RegionStructure s, CompileOptions o) {
        long[] size = new long[s.regionCount()];
        long total = 0;
        for (int r : s.order()) {
            size[r] = r == s.root() ? o.outputs() : s.isLeaf(r) ? o.inputs() : o.sums();
            if (s.isLeaf(r)) {
                int n = s.vars(r).length;
                total = add(total, multiply(o.inputs(), n + (n > 1 ? 1 : 0)));
                if (r == s.root()) {
                    total = add(total, o.outputs());
                }
                continue;
            }
            for (int p : s.partitionsOf(r)) {
                long products = 1;
                for (int q : s.parts(p)) {
                    products = multiply(products, size[q]);
                }
                total = add(total, products);
            }
            total = add(total, size[r]);
        }
        return total;
    }

    /**
     * The number of child references of the products the layout emits (each product lists one node of
     * every part), counted like {@link #nodeCount}; the sums of a region share one child list.
     */
    static long productEdgeCount(RegionStructure s, CompileOptions o) {
        long[] size = new long[s.regionCount()];
        long total = 0;
        for (int r : s.order()) {
            size[r] = r == s.root() ? o.outputs() : s.isLeaf(r) ? o.inputs() : o.sums();
            if (s.isLeaf(r)) {
                int n = s.vars(r).length;
                total = add(total, n > 1 ? multiply(o.inputs(), n) : 0);
                continue;
            }
            for (int p : s.partitionsOf(r)) {
                long products = 1;
                for (int q : s.parts(p)) {
                    products = multiply(products, size[q]);
                }
                total = add(total, multiply(products, s.parts(p).length));
            }
        }
        return total;
    }

    private static long add(long a, long b) {
        long c = a + b;
        return c < 0 ? Long.MAX_VALUE : c;
    }

    private static long multiply(long a, long b) {
        return b != 0 && a > Long.MAX_VALUE / b ? Long.MAX_VALUE : a * b;
    }

    /** Whether region {@code r} has sums (an inner region, or the root). */
    boolean hasSums(int r) {
        return !s.isLeaf(r) || r == s.root();
    }

    /** Number of sums of region {@code r} (K, C at the root), or 0 for a leaf below the root. */
    int sums(int r) {
        return hasSums(r) ? size[r] : 0;
    }

    /** Number of children of each sum of region {@code r}. */
    int children(int r) {
        return childCount[r];
    }

    /** Number of nodes a region offers its parents (bundles of a leaf, sums of an inner region). */
    int size(int r) {
        return size[r];
    }

    /** Emits every node in order; returns the positions of the root's sums (the outputs). */
    int[] walk(Visitor v) throws java.io.IOException {
        int nr = s.regionCount();
        int[][] nodes = new int[nr][];
        int[] parents = new int[nr];
        for (int p = 0; p < s.partitionCount(); p++) {
            for (int q : s.parts(p)) {
                parents[q]++;
            }
        }
        int pos = 0;
        int[] bundleChildren = new int[8];
        for (int r : s.order()) {
            int[] out;
            if (s.isLeaf(r)) {
                int[] vars = s.vars(r);
                int n = vars.length;
                int[] bundles = new int[o.inputs()];
                if (bundleChildren.length < n) {
                    bundleChildren = new int[n];
                }
                for (int i = 0; i < o.inputs(); i++) {
                    for (int j = 0; j < n; j++) {
                        v.input(pos, r, i, j);
                        bundleChildren[j] = pos++;
                    }
                    if (n == 1) {
                        bundles[i] = bundleChildren[0];
                    } else {
                        v.product(pos, r, Arrays.copyOf(bundleChildren, n));
                        bundles[i] = pos++;
                    }
                }
                out = bundles;
                if (r == s.root()) {
                    out = new int[o.outputs()];
                    for (int k = 0; k < o.outputs(); k++) {
                        v.sum(pos, r, k, bundles);
                        out[k] = pos++;
                    }
                }
            } else {
                int[] children = new int[childCount[r]];
                int c = 0;
                for (int p : s.partitionsOf(r)) {
                    int[] parts = s.parts(p);
                    int m = parts.length;
                    int[] digit = new int[m];
                    boolean more = true;
                    while (more) {
                        int[] pc = new int[m];
                        for (int t = 0; t < m; t++) {
                            pc[t] = nodes[parts[t]][digit[t]];
                        }
                        v.product(pos, r, pc);
                        children[c++] = pos++;
                        more = false;
                        for (int t = m - 1; t >= 0; t--) {
                            if (++digit[t] < size[parts[t]]) {
                                more = true;
                                break;
                            }
                            digit[t] = 0;
                        }
                    }
                }
                for (int p : s.partitionsOf(r)) {
                    for (int q : s.parts(p)) {
                        if (--parents[q] == 0) {
                            nodes[q] = null;
                        }
                    }
                }
                out = new int[size[r]];
                for (int k = 0; k < size[r]; k++) {
                    v.sum(pos, r, k, children);
                    out[k] = pos++;
                }
            }
            nodes[r] = out;
        }
        return nodes[s.root()];
    }
}
