package dev.circa.validator.analysis;

import dev.circa.engine.internal.IdIndex;
import dev.circa.engine.internal.IntList;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
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
        List<Node> nodes = doc.nodes();
        n = nodes.size();
        kind = new byte[n];
        childStart = new int[n + 1];
        long edges = doc.edgeCount();
        if (edges > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("more than 2^31 child references");
        }
        child = new int[(int) edges];
        int[] ids = new int[n];
        for (int i = 0; i < n; i++) {
            ids[i] = nodes.get(i).id();
        }
        index = new IdIndex(ids);
        for (int i = 0; i < n; i++) {
            if (index.putIfAbsent(ids[i], i) >= 0) {
                duplicateIds.add(i);
            }
        }
        int nv = doc.variables().size();
        int e = 0;
        for (int i = 0; i < n; i++) {
            Node node = nodes.get(i);
            childStart[i] = e;
            if (node instanceof InputNode in) {
                kind[i] = INPUT;
                checkInput(i, in, nv);
                continue;
            }
            kind[i] = node instanceof SumNode ? SUM : PRODUCT;
            int[] ch = node.children();
            if (ch.length == 0) {
                childless.add(i);
            }
            for (int j = 0; j < ch.length; j++) {
                int c = index.get(ch[j]);
                if (c < 0) {
                    missingChildren.add(i);
                    missingChildren.add(j);
                } else if (c >= i) {
                    laterChildren.add(i);
                    laterChildren.add(j);
                    c = -1;
                }
                child[e++] = c;
            }
            if (node instanceof SumNode s && s.weights().length != ch.length) {
                weightCounts.add(i);
            }
        }
        childStart[n] = e;
        List<Output> outs = doc.outputs();
        outputNode = new int[outs.size()];
        Map<String, Integer> names = new HashMap<>();
        for (int o = 0; o < outs.size(); o++) {
            outputNode[o] = index.get(outs.get(o).node());
            if (outputNode[o] < 0) {
                missingOutputs.add(o);
            }
            if (names.putIfAbsent(outs.get(o).name(), o) != null) {
                duplicateOutputNames.add(o);
            }
        }
    }

    private void checkInput(int i, InputNode in, int nv) {
        List<Variable> vars = doc.variables();
        int[] v = in.vars();
        boolean typeBad = false;
        for (int p = 0; p < v.length; p++) {
            if (v[p] < 0 || v[p] >= nv) {
                badVars.add(i);
                badVars.add(p);
            } else if (!in.family().accepts(vars.get(v[p]).type())) {
                typeBad = true;
            }
        }
        if (typeBad) {
            familyTypes.add(i);
        }
        if (in.family() == Family.MVNORMAL) {
            boolean repeated = v.length < 2;
            for (int a = 0; a < v.length && !repeated; a++) {
                for (int b = a + 1; b < v.length; b++) {
                    if (v[a] == v[b]) {
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
        return index.get(id);
    }

    public int outputCount() {
        return outputNode.length;
    }

    /** The node index of output {@code o}, or -1. */
    public int outputNode(int o) {
        return outputNode[o];
    }

    public Node node(int i) {
        return doc.nodes().get(i);
    }

    public int id(int i) {
        return doc.nodes().get(i).id();
    }
}
