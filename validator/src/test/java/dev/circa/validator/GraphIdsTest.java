package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.internal.IntList;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.validator.analysis.Graph;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntUnaryOperator;
import org.junit.jupiter.api.Test;

/**
 * A graph whose node ids are 0..n-1 in order resolves references without an id table; the same
 * circuit with its ids renumbered goes through the table (a direct one for ids below 4n, a hash
 * table for spread ids). The reference for both is the other path: the resolved graph, every
 * reference problem and the diagnostics' codes and places must be the same whatever the ids.
 */
class GraphIdsTest {
    /** Dense renumbering (the id table's direct array) and a spread one (its hash table). */
    private static final IntUnaryOperator DENSE = i -> 3 * i + 11;
    private static final IntUnaryOperator SPREAD = i -> i * 1_000_003 + 5;

    @Test
    void brokenReferences_sameGraphAndDiagnostics_whateverTheIds() {
        CircuitDocument own = broken(IntUnaryOperator.identity());
        for (IntUnaryOperator f : List.of(DENSE, SPREAD)) {
            CircuitDocument other = broken(f);
            Graph a = Graph.of(own);
            Graph b = Graph.of(other);
            assertSameGraph(a, b, f);
            // node 4's child 1 is defined later, node 6 is its own child, node 5 refers to no node, ...
            assertEquals(List.of(4, 1, 6, 0), list(a.laterChildren));
            assertEquals(List.of(5, 1, 7, 1), list(a.missingChildren));
            assertEquals(List.of(8), list(a.childless));
            assertEquals(List.of(9), list(a.weightCounts));
            assertEquals(List.of(1), list(a.missingOutputs));
            assertEquals(List.of(2), list(a.duplicateOutputNames));
            assertFalse(a.usable());
            assertEquals(places(own), places(other));
        }
    }

    @Test
    void repeatedOrShuffledIds_takeTheTable() {
        // ids 0..n-1 but not each its own index: node 3 repeats id 2, so node 2's id is not free for it
        CircuitDocument repeated = doc(List.of(normal(0, 0), normal(1, 1), normal(2, 2), normal(2, 3),
                new ProductNode(4, null, new int[] {0, 2})), List.of(new Output("joint", 4)));
        Graph r = Graph.of(repeated);
        assertEquals(List.of(3), list(r.duplicateIds));
        assertEquals(2, r.child(1));
        // ids a permutation of 0..n-1: id 1 is node 0
        CircuitDocument shuffled = doc(List.of(normal(1, 0), normal(0, 1), new ProductNode(2, null, new int[] {1, 0})),
                List.of(new Output("joint", 2)));
        Graph s = Graph.of(shuffled);
        assertEquals(0, s.child(0));
        assertEquals(1, s.child(1));
        assertEquals(0, s.indexOfId(1));
        assertTrue(s.usable());
    }

    @Test
    void randomCircuits_sameGraphAndReport_whateverTheIds() {
        for (long seed = 1; seed <= 20; seed++) {
            // the generator leaves gaps between ids: renumbered 0..n-1 they are their own indices
            CircuitDocument gaps = new RandomCircuits(seed).generate(6 + (int) (seed % 5), 4);
            int[] idOf = new int[gaps.nodes().size()];
            for (int i = 0; i < idOf.length; i++) {
                idOf[i] = gaps.nodes().get(i).id();
            }
            CircuitDocument own = renumber(gaps, idOf);
            Graph a = Graph.of(own);
            Graph b = Graph.of(gaps);
            assertSameGraph(a, b, i -> idOf[i]);
            assertTrue(a.usable());
            Validator v = new Validator(ValidationOptions.defaults());
            ValidationReport ra = v.validate(own);
            ValidationReport rb = v.validate(gaps);
            assertEquals(rb.valid(), ra.valid());
            assertEquals(rb.properties(), ra.properties());
            assertEquals(places(gaps), places(own));
        }
    }

    private static void assertSameGraph(Graph a, Graph b, IntUnaryOperator idOf) {
        assertEquals(a.size(), b.size());
        assertEquals(a.edges(), b.edges());
        for (int i = 0; i < a.size(); i++) {
            assertEquals(a.kind(i), b.kind(i));
            assertEquals(a.childStart(i), b.childStart(i));
            assertEquals(i, b.indexOfId(idOf.applyAsInt(i)));
            assertEquals(i, a.indexOfId(a.id(i)));
        }
        int[] ca = new int[a.edges()];
        int[] cb = new int[b.edges()];
        for (int e = 0; e < ca.length; e++) {
            ca[e] = a.child(e);
            cb[e] = b.child(e);
        }
        assertArrayEquals(cb, ca);
        assertEquals(list(b.duplicateIds), list(a.duplicateIds));
        assertEquals(list(b.laterChildren), list(a.laterChildren));
        assertEquals(list(b.missingChildren), list(a.missingChildren));
        assertEquals(list(b.childless), list(a.childless));
        assertEquals(list(b.weightCounts), list(a.weightCounts));
        assertEquals(list(b.missingOutputs), list(a.missingOutputs));
        assertEquals(b.usable(), a.usable());
        for (int o = 0; o < a.outputCount(); o++) {
            assertEquals(b.outputNode(o), a.outputNode(o));
        }
        assertEquals(-1, a.indexOfId(-3));
        assertEquals(-1, a.indexOfId(a.size()));
    }

    /**
     * Nodes with every kind of reference problem, ids {@code f(index)}; references to ids no node
     * has stay outside the image of {@code f}.
     */
    private static CircuitDocument broken(IntUnaryOperator f) {
        List<Node> nodes = new ArrayList<>();
        nodes.add(normal(f.applyAsInt(0), 0));
        nodes.add(normal(f.applyAsInt(1), 1));
        nodes.add(normal(f.applyAsInt(2), 2));
        nodes.add(new ProductNode(f.applyAsInt(3), null, new int[] {f.applyAsInt(0), f.applyAsInt(1)}));
        nodes.add(new ProductNode(f.applyAsInt(4), null, new int[] {f.applyAsInt(2), f.applyAsInt(7)}));
        nodes.add(new SumNode(f.applyAsInt(5), null, new int[] {f.applyAsInt(3), -7}, new double[] {0.5, 0.5}, false));
        nodes.add(new ProductNode(f.applyAsInt(6), null, new int[] {f.applyAsInt(6), f.applyAsInt(2)}));
        nodes.add(new SumNode(f.applyAsInt(7), null, new int[] {f.applyAsInt(3), -3}, new double[] {0.5, 0.5}, false));
        nodes.add(new ProductNode(f.applyAsInt(8), null, new int[0]));
        nodes.add(new SumNode(f.applyAsInt(9), null, new int[] {f.applyAsInt(3), f.applyAsInt(3)}, new double[] {1}, false));
        nodes.add(new ProductNode(f.applyAsInt(10), null, new int[] {f.applyAsInt(3), f.applyAsInt(2)}));
        return doc(nodes, List.of(new Output("joint", f.applyAsInt(10)), new Output("gone", -1),
                new Output("joint", f.applyAsInt(5))));
    }

    private static InputNode normal(int id, int var) {
        return new InputNode(id, null, Family.NORMAL, new int[] {var}, new double[] {0, 1}, false);
    }

    private static CircuitDocument doc(List<Node> nodes, List<Output> outputs) {
        List<Variable> vars = List.of(Variable.of("inlet_pressure", VariableType.REAL),
                Variable.of("outlet_pressure", VariableType.REAL), Variable.of("motor_current", VariableType.REAL));
        return CircuitDocument.builder().variables(vars).nodes(nodes).outputs(outputs).build();
    }

    /** {@code d} with node {@code i}'s id {@code i} (ids given by {@code idOf}, unique). */
    private static CircuitDocument renumber(CircuitDocument d, int[] idOf) {
        java.util.Map<Integer, Integer> index = new java.util.HashMap<>();
        for (int i = 0; i < idOf.length; i++) {
            index.put(idOf[i], i);
        }
        List<Node> nodes = new ArrayList<>();
        for (int i = 0; i < idOf.length; i++) {
            Node n = d.nodes().get(i);
            if (n instanceof InputNode in) {
                nodes.add(new InputNode(i, in.label(), in.family(), in.vars(), in.params(), in.logForm()));
            } else if (n instanceof ProductNode p) {
                nodes.add(new ProductNode(i, p.label(), map(p.children(), index)));
            } else {
                SumNode s = (SumNode) n;
                nodes.add(new SumNode(i, s.label(), map(s.children(), index), s.weights(), s.logWeights()));
            }
        }
        List<Output> outs = new ArrayList<>();
        for (Output o : d.outputs()) {
            outs.add(new Output(o.name(), index.get(o.node())));
        }
        return CircuitDocument.builder().variables(d.variables()).nodes(nodes).outputs(outs).build();
    }

    private static int[] map(int[] ids, java.util.Map<Integer, Integer> index) {
        int[] out = new int[ids.length];
        for (int k = 0; k < ids.length; k++) {
            out[k] = index.get(ids[k]);
        }
        return out;
    }

    /** Code, severity and place of every diagnostic (messages name ids, so they differ by design). */
    private static List<String> places(CircuitDocument d) {
        List<String> out = new ArrayList<>();
        for (Diagnostic x : new Validator(ValidationOptions.defaults()).validate(d).diagnostics()) {
            out.add(x.code() + " " + x.severity() + " " + x.pointer());
        }
        return out;
    }

    private static List<Integer> list(IntList l) {
        List<Integer> out = new ArrayList<>();
        for (int k = 0; k < l.size(); k++) {
            out.add(l.get(k));
        }
        return out;
    }
}
