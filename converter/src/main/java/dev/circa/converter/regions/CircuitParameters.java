package dev.circa.converter.regions;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Counts;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SourceLocation;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import java.io.IOException;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** Reads back the parameters of a circuit compiled from a region graph, for export. Stateless. */
final class CircuitParameters {
    private CircuitParameters() {
    }

    /**
     * The parameters of a circuit compiled from {@code s}, for export. K, I, C and the families are
     * read off the circuit; every node must be where compiling the graph with them puts it.
     *
     * @throws FormatException located at the first node that does not match the layout
     */
    static RegionParameters read(RegionStructure s, CircuitDocument c) throws FormatException {
        List<Node> nodes = c.nodes();
        String file = c.source();
        CompileOptions o = inferOptions(s, c);
        int bundles = o.inputs();
        int outputs = o.outputs();
        Map<Integer, Integer> positionOfId = positionsOfIds(nodes);
        boolean identity = positionOfId == null;
        int nr = s.regionCount();
        double[][][] w = new double[nr][][];
        boolean[] logw = new boolean[nr];
        double[][][] in = new double[nr][][];
        Layout layout = new Layout(s, o);
        for (int r = 0; r < nr; r++) {
            if (s.isLeaf(r)) {
                in[r] = new double[bundles * s.vars(r).length][];
            }
            if (layout.hasSums(r)) {
                w[r] = new double[layout.sums(r)][];
            }
        }
        final boolean ident = identity;
        int[] count = {0};
        Layout.Visitor v = new Layout.Visitor() {
            private int position(int childId, int at) throws FormatException {
                if (ident) {
                    return childId;
                }
                Integer p = positionOfId.get(childId);
                if (p == null) {
                    throw notCompiled(c, at, "children that exist");
                }
                return p;
            }

            private Node at(int position) throws FormatException {
                if (position >= nodes.size()) {
                    throw new FormatException(file, 0, 0, "/nodes", "the circuit has " + nodes.size()
                            + " nodes; compiling the region graph with K=" + o.sums() + ", I=" + o.inputs() + ", C="
                            + o.outputs() + " gives more");
                }
                count[0]++;
                return nodes.get(position);
            }

            private void children(int position, int[] got, int[] want, String what) throws FormatException {
                if (got.length != want.length) {
                    throw notCompiled(c, position, what);
                }
                for (int j = 0; j < want.length; j++) {
                    if (position(got[j], position) != want[j]) {
                        throw notCompiled(c, position, what);
                    }
                }
            }

            @Override
            public void input(int position, int region, int bundle, int varPos) throws FormatException {
                Node n = at(position);
                int var = s.vars(region)[varPos];
                if (!(n instanceof InputNode inNode) || inNode.var() != var) {
                    throw notCompiled(c, position, "an input of variable " + var + " (region " + s.id(region)
                            + ", bundle " + bundle + ")");
                }
                double[] p = inNode.params();
                if (inNode.logForm()) {
                    p = p.clone();
                    for (int j = 0; j < p.length; j++) {
                        p[j] = Math.exp(p[j]);
                    }
                }
                in[region][bundle * s.vars(region).length + varPos] = p;
            }

            @Override
            public void product(int position, int region, int[] kids) throws FormatException {
                Node n = at(position);
                if (!(n instanceof ProductNode p)) {
                    throw notCompiled(c, position, "a product of region " + s.id(region));
                }
                children(position, p.children(), kids, "a product of region " + s.id(region)
                        + " with the children the layout gives");
            }

            @Override
            public void sum(int position, int region, int k2, int[] kids) throws FormatException {
                Node n = at(position);
                if (!(n instanceof SumNode sn)) {
                    throw notCompiled(c, position, "sum " + k2 + " of region " + s.id(region));
                }
                children(position, sn.children(), kids, "sum " + k2 + " of region " + s.id(region)
                        + " with the children the layout gives");
                if (k2 == 0) {
                    logw[region] = sn.logWeights();
                }
                double[] ws = sn.weights();
                if (sn.logWeights() != logw[region]) {
                    ws = new double[kids.length];
                    for (int j = 0; j < ws.length; j++) {
                        ws[j] = logw[region] ? sn.logWeight(j) : sn.weight(j);
                    }
                }
                w[region][k2] = ws;
            }
        };
        int[] roots;
        try {
            roots = layout.walk(v);
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, e.getMessage());
        }
        if (count[0] != nodes.size()) {
            throw notCompiled(c, count[0], "no further node (compiling the region graph gives " + count[0] + " nodes)");
        }
        for (int t = 0; t < outputs; t++) {
            int node = c.outputs().get(t).node();
            int p = identity ? node : positionOfId.getOrDefault(node, -1);
            if (p != roots[t]) {
                throw new FormatException(file, 0, 0, "/outputs/" + t, "output " + c.outputs().get(t).name()
                        + " is not sum " + t + " of the root region; expected a circuit compiled from this region graph");
            }
        }
        return new RegionParameters(s, o, w, logw, in);
    }

    /** K, I, C and the families that compiling {@code s} into {@code c} must have used. */
    private static CompileOptions inferOptions(RegionStructure s, CircuitDocument c) throws FormatException {
        List<Node> nodes = c.nodes();
        String file = c.source();
        int inputs = 0;
        int sums = 0;
        Map<VariableType, Family> fam = new EnumMap<>(VariableType.class);
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            if (n instanceof InputNode in) {
                inputs++;
                if (in.vars().length != 1 || in.vars()[0] < 0 || in.vars()[0] >= s.variables().size()) {
                    throw notCompiled(c, i, "an input over one variable of the region graph");
                }
                VariableType t = s.variables().get(in.var()).type();
                Family prev = fam.putIfAbsent(t, in.family());
                if (prev != null && prev != in.family()) {
                    throw notCompiled(c, i, "a " + prev.jsonName() + " input, as for the other " + t.jsonName()
                            + " variables");
                }
            } else if (n instanceof SumNode) {
                sums++;
            }
        }
        int outputs = c.outputs().size();
        long leafVars = 0;
        int innerBelowRoot = 0;
        for (int r = 0; r < s.regionCount(); r++) {
            if (s.isLeaf(r)) {
                leafVars += s.vars(r).length;
            } else if (r != s.root()) {
                innerBelowRoot++;
            }
        }
        if (outputs < 1 || inputs == 0 || inputs % leafVars != 0) {
            throw new FormatException(file, 0, 0, null, "the circuit has " + Counts.of(inputs, "input") + " and "
                    + Counts.of(outputs, "output") + ", which compiling the region graph ("
                    + Counts.of(leafVars, "variable") + " in leaf regions) cannot give; expected a circuit compiled from this region graph");
        }
        int bundles = (int) (inputs / leafVars);
        int k = 1;
        if (innerBelowRoot > 0) {
            if ((sums - outputs) <= 0 || (sums - outputs) % innerBelowRoot != 0) {
                throw new FormatException(file, 0, 0, null, "the circuit has " + sums + " sums and " + outputs
                        + " outputs, which compiling the region graph (" + innerBelowRoot
                        + " inner regions below the root) cannot give; expected a circuit compiled from this region graph");
            }
            k = (sums - outputs) / innerBelowRoot;
        }
        try {
            return new CompileOptions(k, bundles, outputs, fam);
        } catch (IllegalArgumentException e) {
            throw new FormatException(file, 0, 0, null, e.getMessage());
        }
    }

    /** Each node id's position, or {@code null} when every node's id is its position. */
    private static Map<Integer, Integer> positionsOfIds(List<Node> nodes) {
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i).id() != i) {
                Map<Integer, Integer> positionOfId = new HashMap<>();
                for (int j = 0; j < nodes.size(); j++) {
                    positionOfId.put(nodes.get(j).id(), j);
                }
                return positionOfId;
            }
        }
        return null;
    }

    private static FormatException notCompiled(CircuitDocument c, int position, String expected) {
        SourceLocation l = c.nodeLocation(position);
        return new FormatException(c.source(), l.line(), l.column(), l.pointer(), "node " + position
                + " is not what compiling the region graph gives there; expected " + expected);
    }
}
