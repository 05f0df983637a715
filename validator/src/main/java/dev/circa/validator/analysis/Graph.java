package dev.circa.validator.analysis;

import dev.circa.engine.internal.IdIndex;
import dev.circa.engine.internal.IntList;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.Node;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * A circuit document's nodes in CSR arrays of node indices, with every reference problem found
 * while resolving ids. {@code child[e]} is -1 where the reference is broken. The graph is
 * {@link #usable()} for the structural passes when no reference problem breaks the children-first order.
 */
public final class Graph {
    public static final byte INPUT = 0;
    public static final byte PRODUCT = 1;
    public static final byte SUM = 2;

    private final CircuitDocument doc;
    private final int n;
    private final byte[] kind;
    private final int[] childStart;
    private final int[] child;
    /** Id to node index, or {@code null} when every node's id is its index. */
    private final IdIndex index;
    private final int[] outputNode;

    /** Second and later occurrences of an id. */
    public final IntList duplicateIds = new IntList();
    /** Pairs (node index, child position) of children that are defined later or are the node itself. */
    public final IntList laterChildren = new IntList();
    /** Pairs (node index, child position) of children whose id no node has. */
    public final IntList missingChildren = new IntList();
    /** Products and sums without children. */
    public final IntList childless = new IntList();
    /** Sums whose number of weights differs from their number of children. */
    public final IntList weightCounts = new IntList();
    /** Pairs (node index, position in vars) of variable indices out of range. */
    public final IntList badVars = new IntList();
    /** Inputs whose family does not accept the type of one of their variables. */
    public final IntList familyTypes = new IntList();
    /** mvnormal inputs with fewer than two variables or a repeated one. */
    public final IntList repeatedVars = new IntList();
    /** Outputs whose node id no node has. */
    public final IntList missingOutputs = new IntList();
    /** Outputs whose name an earlier output has. */
    public final IntList duplicateOutputNames = new IntList();

    private Graph(CircuitDocument doc) {
        this.doc = doc;
        NodeTable t = doc.nodeTable();
        n = t.size();
        kind = new byte[n];
        childStart = new int[n + 1];
        long edges = doc.edgeCount();
        if (edges > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("more than 2^31 child references");
        }
        child = new int[(int) edges];
        // ids 0..n-1 in order (what most writers produce) are their own node indices: no table needed
        index = identityIds(t) ? null : index(t);
        int nv = doc.variables().size();
        int e = 0;
        for (int i = 0; i < n; i++) {
            childStart[i] = e;
            e = resolve(t, i, e, nv);
        }
        childStart[n] = e;
        List<Output> outs = doc.outputs();
        outputNode = new int[outs.size()];
        Map<String, Integer> names = new HashMap<>();
        for (int o = 0; o < outs.size(); o++) {
            outputNode[o] = indexOfId(outs.get(o).node());
            if (outputNode[o] < 0) {
                missingOutputs.add(o);
            }
            if (names.putIfAbsent(outs.get(o).name(), o) != null) {
                duplicateOutputNames.add(o);
            }
        }
    }

    /** Whether node {@code i}'s id is {@code i} for every node. */
    private static boolean identityIds(NodeTable t) {
        int n = t.size();
        for (int i = 0; i < n; i++) {
            if (t.id(i) != i) {
                return false;
            }
        }
        return true;
    }

    /** The id to index table of ids that are not all their own index; records the repeated ones. */
    private IdIndex index(NodeTable t) {
        int[] ids = new int[n];
        for (int i = 0; i < n; i++) {
            ids[i] = t.id(i);
        }
        IdIndex index = new IdIndex(ids);
        for (int i = 0; i < n; i++) {
            if (index.putIfAbsent(ids[i], i) >= 0) {
                duplicateIds.add(i);
            }
        }
        return index;
    }

    /** Resolves node {@code i}, whose child references start at {@code e}; returns where the next node's start. */
    private int resolve(NodeTable t, int i, int e, int nv) {
        byte k = t.kind(i);
        if (k == NodeTable.INPUT) {
            kind[i] = INPUT;
            checkInput(i, t, nv);
            return e;
        }
        kind[i] = k == NodeTable.SUM ? SUM : PRODUCT;
        int a = t.childStart(i);
        int b = t.childEnd(i);
        if (a == b) {
            childless.add(i);
        }
        for (int j = a; j < b; j++) {
            int c = indexOfId(t.childId(j));
            if (c < 0) {
                missingChildren.add(i);
                missingChildren.add(j - a);
            } else if (c >= i) {
                laterChildren.add(i);
                laterChildren.add(j - a);
                c = -1;
            }
            child[e++] = c;
        }
        if (k == NodeTable.SUM && t.valueEnd(i) - t.valueStart(i) != b - a) {
            weightCounts.add(i);
        }
        return e;
    }

    private void checkInput(int i, NodeTable t, int nv) {
        List<Variable> vars = doc.variables();
        Family family = t.family(i);
        int a = t.varStart(i);
        int b = t.varEnd(i);
        boolean typeBad = false;
        for (int p = a; p < b; p++) {
            int v = t.var(p);
            if (v < 0 || v >= nv) {
                badVars.add(i);
                badVars.add(p - a);
            } else if (!family.accepts(vars.get(v).type())) {
                typeBad = true;
            }
        }
        if (typeBad) {
            familyTypes.add(i);
        }
        if (family == Family.MVNORMAL) {
            boolean repeated = b - a < 2;
            for (int x = a; x < b && !repeated; x++) {
                for (int y = x + 1; y < b; y++) {
                    if (t.var(x) == t.var(y)) {
                        repeated = true;
                        break;
                    }
                }
            }
            if (repeated) {
                repeatedVars.add(i);
            }
        }
    }

    /** Resolves the references of {@code doc}. */
    public static Graph of(CircuitDocument doc) {
        return new Graph(doc);
    }

    /** Whether every child reference resolves to an earlier node, ids are unique and variable indices are in range. */
    public boolean usable() {
        return duplicateIds.isEmpty() && laterChildren.isEmpty() && missingChildren.isEmpty()
                && childless.isEmpty() && weightCounts.isEmpty() && badVars.isEmpty() && missingOutputs.isEmpty();
    }

    public CircuitDocument document() {
        return doc;
    }

    public int size() {
        return n;
    }

    public byte kind(int i) {
        return kind[i];
    }

    public int childStart(int i) {
        return childStart[i];
    }

    public int childEnd(int i) {
        return childStart[i + 1];
    }

    /** The node index of child reference {@code e}, or -1 when broken. */
    public int child(int e) {
        return child[e];
    }

    public int edges() {
        return child.length;
    }

    /** The node index of {@code id}, or -1. */
    public int indexOfId(int id) {
        if (index == null) {
            return id >= 0 && id < n ? id : -1;
        }
        return index.get(id);
    }

    public int outputCount() {
        return outputNode.length;
    }

    /** The node index of output {@code o}, or -1. */
    public int outputNode(int o) {
        return outputNode[o];
    }

    /** Node {@code i} as a record (made on each call: for reports and single nodes, not for passes). */
    public Node node(int i) {
        return doc.nodeTable().node(i);
    }

    public int id(int i) {
        return doc.nodeTable().id(i);
    }
}
