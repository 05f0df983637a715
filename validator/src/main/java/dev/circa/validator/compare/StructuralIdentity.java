package dev.circa.validator.compare;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.NodeKind;
import dev.circa.format.Variable;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.Locale;

/**
 * Whether two circuits are identical up to node order: the same nodes (kind, family, variables by
 * name and type, parameters and weights bit for bit), the same edges and the same named outputs.
 * Each node gets a 128-bit canonical hash computed bottom-up in the children-first order (no
 * recursion): a product's hash depends on the multiset of its children's, a sum's on the multiset of
 * (child, log-weight) pairs, so the order of nodes and of children does not matter. Two circuits are
 * identical when the sorted lists of all their node hashes are equal and each output's hash is.
 */
public final class StructuralIdentity {
    private static final long SEED_A = 0x243F6A8885A308D3L;
    private static final long SEED_B = 0x13198A2E03707344L;

    private final long[] lo;
    private final long[] hi;
    private StructuralIdentity(CompiledCircuit c) {
        int n = c.nodeCount();
        lo = new long[n];
        hi = new long[n];
        long[] varLo = new long[c.variableCount()];
        long[] varHi = new long[c.variableCount()];
        for (int v = 0; v < varLo.length; v++) {
            Variable x = c.variables().get(v);
            long a = SEED_A;
            long b = SEED_B;
            for (byte by : (x.type().name() + ":" + x.stateCount() + ":" + x.name()).getBytes(StandardCharsets.UTF_8)) {
                a = step(a, by);
                b = step(b, ~by);
            }
            varLo[v] = a;
            varHi[v] = b;
        }
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        double[] lw = c.logWeight();
        long[] entryLo = new long[16];
        long[] entryHi = new long[16];
        for (int i = 0; i < n; i++) {
            NodeKind k = c.kind(i);
            long a = step(SEED_A, k.ordinal() + 1);
            long b = step(SEED_B, k.ordinal() + 101);
            if (k == NodeKind.INPUT) {
                a = step(a, c.inputFamily(i).ordinal());
                b = step(b, c.inputFamily(i).ordinal() + 7);
                for (int v : c.inputVars(i)) {
                    a = step(a, varLo[v]);
                    b = step(b, varHi[v]);
                }
                for (double p : c.inputParams(i)) {
                    long bits = Double.doubleToRawLongBits(p);
                    a = step(a, bits);
                    b = step(b, ~bits);
                }
            } else {
                int m = cs[i + 1] - cs[i];
                if (entryLo.length < m) {
                    entryLo = new long[Math.max(m, entryLo.length * 2)];
                    entryHi = new long[entryLo.length];
                }
                for (int e = 0; e < m; e++) {
                    int j = ci[cs[i] + e];
                    long el = lo[j];
                    long eh = hi[j];
                    if (k == NodeKind.SUM) {
                        long bits = Double.doubleToRawLongBits(lw[cs[i] + e]);
                        el = step(step(SEED_A, el), bits);
                        eh = step(step(SEED_B, eh), ~bits);
                    }
                    entryLo[e] = el;
                    entryHi[e] = eh;
                }
                sortPairs(entryLo, entryHi, m);
                a = step(a, m);
                b = step(b, m);
                for (int e = 0; e < m; e++) {
                    a = step(a, entryLo[e]);
                    b = step(b, entryHi[e]);
                }
            }
            lo[i] = a;
            hi[i] = b;
        }
    }

    /** Whether {@code a} and {@code b} are identical up to node order (outputs matched by name). */
    public static boolean identical(CompiledCircuit a, CompiledCircuit b) {
        if (a.nodeCount() != b.nodeCount() || a.edgeCount() != b.edgeCount() || a.outputCount() != b.outputCount()
                || a.variableCount() != b.variableCount()) {
            return false;
        }
        StructuralIdentity ha = new StructuralIdentity(a);
        StructuralIdentity hb = new StructuralIdentity(b);
        for (int o = 0; o < a.outputCount(); o++) {
            int ob = b.outputIndex(a.outputName(o));
            if (ob < 0) {
                return false;
            }
            int na = a.outputNode(o);
            int nb = b.outputNode(ob);
            if (ha.lo[na] != hb.lo[nb] || ha.hi[na] != hb.hi[nb]) {
                return false;
            }
        }
        long[][] sa = ha.sorted();
        long[][] sb = hb.sorted();
        return Arrays.equals(sa[0], sb[0]) && Arrays.equals(sa[1], sb[1]);
    }

    /** The canonical hash of output {@code o} of {@code c}, as 32 hexadecimal digits. */
    public static String outputHash(CompiledCircuit c, int o) {
        StructuralIdentity h = new StructuralIdentity(c);
        int n = c.outputNode(o);
        return String.format(Locale.ROOT, "%016x%016x", h.hi[n], h.lo[n]);
    }

    private long[][] sorted() {
        long[] l = lo.clone();
        long[] h = hi.clone();
        sortPairs(l, h, l.length);
        return new long[][] {l, h};
    }

    /** Sorts the first {@code m} pairs (lo[i], hi[i]) by lo then hi (heapsort: no recursion, no allocation). */
    private static void sortPairs(long[] lo, long[] hi, int m) {
        for (int start = m / 2 - 1; start >= 0; start--) {
            siftDown(lo, hi, start, m);
        }
        for (int end = m - 1; end > 0; end--) {
            swap(lo, hi, 0, end);
            siftDown(lo, hi, 0, end);
        }
    }

    private static void siftDown(long[] lo, long[] hi, int root, int end) {
        while (true) {
            int child = 2 * root + 1;
            if (child >= end) {
                return;
            }
            if (child + 1 < end && less(lo, hi, child, child + 1)) {
                child++;
            }
            if (!less(lo, hi, root, child)) {
                return;
            }
            swap(lo, hi, root, child);
            root = child;
        }
    }

    private static boolean less(long[] lo, long[] hi, int i, int j) {
        return lo[i] != lo[j] ? lo[i] < lo[j] : hi[i] < hi[j];
    }

    private static void swap(long[] lo, long[] hi, int i, int j) {
        long t = lo[i];
        lo[i] = lo[j];
        lo[j] = t;
        t = hi[i];
        hi[i] = hi[j];
        hi[j] = t;
    }

    private static long step(long h, long x) {
        return mix(h ^ mix(x + 0x9E3779B97F4A7C15L));
    }

    private static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
