package dev.circa.validator.compare;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;

class CircuitComparisonTest {
    private static final List<Variable> VARS = List.of(
            new Variable("inlet_pressure", VariableType.REAL, null, "bar", null),
            new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null),
            new Variable("alarm", VariableType.BINARY, null, null, null));

    /** A smooth, decomposable pump-station circuit with shared inputs and sums; {@code dup} duplicates a shared input. */
    static CircuitDocument pump(double rootWeight0, boolean dup) {
        List<Node> n = new ArrayList<>();
        n.add(new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {3.1, 0.2}, false));
        n.add(new InputNode(1, null, Family.NORMAL, new int[] {0}, new double[] {2.2, 0.5}, false));
        n.add(new InputNode(2, null, Family.CATEGORICAL, new int[] {1}, new double[] {0.05, 0.15, 0.8}, false));
        n.add(new InputNode(3, null, Family.CATEGORICAL, new int[] {1}, new double[] {0.6, 0.3, 0.1}, false));
        n.add(new InputNode(4, null, Family.BERNOULLI, new int[] {2}, new double[] {0.02}, false));
        n.add(new InputNode(5, null, Family.BERNOULLI, new int[] {2}, new double[] {0.7}, false));
        n.add(new ProductNode(6, null, new int[] {0, 2}));
        n.add(new ProductNode(7, null, new int[] {1, 3}));
        n.add(new ProductNode(8, null, new int[] {1, 2}));
        n.add(new SumNode(9, null, new int[] {6, 7, 8}, new double[] {0.7, 0.2, 0.1}, false));
        n.add(new SumNode(10, null, new int[] {7, 8}, new double[] {0.5, 0.5}, false));
        n.add(new SumNode(11, null, new int[] {4, 5}, new double[] {0.9, 0.1}, false));
        int alarmChild = 5;
        if (dup) {
            n.add(new InputNode(20, null, Family.BERNOULLI, new int[] {2}, new double[] {0.7}, false));
            alarmChild = 20;
        }
        n.add(new ProductNode(12, null, new int[] {9, 11}));
        n.add(new ProductNode(13, null, new int[] {10, alarmChild}));
        n.add(new SumNode(14, "regimes", new int[] {12, 13}, new double[] {rootWeight0, 1 - rootWeight0}, false));
        return CircuitDocument.builder().variables(VARS).nodes(n).outputs(List.of(new Output("joint", 14))).build();
    }

    /** The same circuit with nodes in a random children-first order, new ids and children shuffled. */
    static CircuitDocument shuffled(CircuitDocument doc, long seed) {
        Random rnd = new Random(seed);
        List<Node> nodes = doc.nodes();
        Map<Integer, Integer> indexOf = new HashMap<>();
        for (int i = 0; i < nodes.size(); i++) {
            indexOf.put(nodes.get(i).id(), i);
        }
        int[] pending = new int[nodes.size()];
        List<List<Integer>> parents = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            parents.add(new ArrayList<>());
        }
        for (int i = 0; i < nodes.size(); i++) {
            for (int c : nodes.get(i).children()) {
                pending[i]++;
                parents.get(indexOf.get(c)).add(i);
            }
        }
        List<Integer> ready = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (pending[i] == 0) {
                ready.add(i);
            }
        }
        List<Integer> order = new ArrayList<>();
        while (!ready.isEmpty()) {
            int i = ready.remove(rnd.nextInt(ready.size()));
            order.add(i);
            for (int p : parents.get(i)) {
                if (--pending[p] == 0) {
                    ready.add(p);
                }
            }
        }
        Map<Integer, Integer> newId = new HashMap<>();
        for (int k = 0; k < order.size(); k++) {
            newId.put(nodes.get(order.get(k)).id(), 1000 + 3 * k);
        }
        List<Node> out = new ArrayList<>();
        for (int i : order) {
            Node x = nodes.get(i);
            int id = newId.get(x.id());
            if (x instanceof InputNode in) {
                out.add(new InputNode(id, in.label(), in.family(), in.vars(), in.params(), in.logForm()));
                continue;
            }
            int m = x.children().length;
            int[] perm = new int[m];
            for (int j = 0; j < m; j++) {
                perm[j] = j;
            }
            for (int j = m - 1; j > 0; j--) {
                int r = rnd.nextInt(j + 1);
                int t = perm[j];
                perm[j] = perm[r];
                perm[r] = t;
            }
            int[] ch = new int[m];
            for (int j = 0; j < m; j++) {
                ch[j] = newId.get(x.children()[perm[j]]);
            }
            if (x instanceof SumNode s) {
                double[] w = new double[m];
                for (int j = 0; j < m; j++) {
                    w[j] = s.weights()[perm[j]];
                }
                out.add(new SumNode(id, s.label(), ch, w, s.logWeights()));
            } else {
                out.add(new ProductNode(id, x.label(), ch));
            }
        }
        List<Output> outs = doc.outputs().stream().map(o -> new Output(o.name(), newId.get(o.node()))).toList();
        return CircuitDocument.builder().variables(doc.variables()).nodes(out).outputs(outs).build();
    }

    private static CompiledCircuit compile(CircuitDocument d) throws Exception {
        return CompiledCircuit.compile(d);
    }

    @Test
    void compare_shuffledNodeOrder_structurallyIdenticalAndAgree() throws Exception {
        // common practice: the order of nodes and of children does not change a circuit's function
        CompiledCircuit a = compile(pump(0.8, false));
        CompiledCircuit b = compile(shuffled(pump(0.8, false), 7));
        assertTrue(StructuralIdentity.identical(a, b));
        assertEquals(StructuralIdentity.outputHash(a, 0), StructuralIdentity.outputHash(b, 0));
        ComparisonReport r = CircuitComparison.compare(a, b, new CompareOptions(200, 3, 1e-9, 1e-9));
        assertTrue(r.structurallyIdentical());
        assertTrue(r.passed(), r::toText);
        assertEquals(4 * 200, r.points());
        assertTrue(r.toText().contains("structurally identical"));
        assertTrue(r.maxAbsError() < 1e-12, r::toText);
    }

    @Test
    void compare_perturbedWeight_disagreesAndNotIdentical() throws Exception {
        CompiledCircuit a = compile(pump(0.8, false));
        CompiledCircuit b = compile(pump(0.8 + 1e-4, false));
        assertFalse(StructuralIdentity.identical(a, b));
        ComparisonReport r = CircuitComparison.compare(a, b, CompareOptions.DEFAULT);
        assertFalse(r.structurallyIdentical());
        assertFalse(r.passed());
        assertTrue(r.failures() > 0);
        assertEquals(ComparisonReport.WORST, r.worst().size());
        assertFalse(r.worst().get(0).agree());
        // the two root weights move by 1e-4 of at most 0.2: the log-densities differ by at most log(1 + 1e-4 / 0.2)
        assertTrue(r.maxAbsError() > 1e-9 && r.maxAbsError() <= Math.log1p(1e-4 / 0.2) + 1e-12, r::toText);
        assertTrue(CircuitComparison.compare(a, b, new CompareOptions(1000, 0, 1e-3, 0)).passed());
    }

    @Test
    void compare_variablesInAnotherOrder_matchedByName() throws Exception {
        CircuitDocument doc = pump(0.8, false);
        int[] newIndex = {2, 0, 1};
        List<Variable> vars = List.of(VARS.get(1), VARS.get(2), VARS.get(0));
        List<Node> nodes = new ArrayList<>();
        for (Node x : doc.nodes()) {
            if (x instanceof InputNode in) {
                nodes.add(new InputNode(in.id(), in.label(), in.family(), new int[] {newIndex[in.var()]}, in.params(), in.logForm()));
            } else {
                nodes.add(x);
            }
        }
        CircuitDocument permuted = CircuitDocument.builder().variables(vars).nodes(nodes).outputs(doc.outputs()).build();
        ComparisonReport r = CircuitComparison.compare(compile(doc), compile(permuted), new CompareOptions(300, 1, 1e-9, 1e-9));
        assertTrue(r.passed(), r::toText);
        assertTrue(r.structurallyIdentical());
    }

    @Test
    void compare_duplicatedSharedInput_agreesButNotIdentical() throws Exception {
        CompiledCircuit a = compile(pump(0.8, false));
        CompiledCircuit b = compile(pump(0.8, true));
        ComparisonReport r = CircuitComparison.compare(a, b, new CompareOptions(300, 2, 1e-9, 1e-9));
        assertTrue(r.passed(), r::toText);
        assertFalse(r.structurallyIdentical());
    }

    @Test
    void compare_differentVariables_incompatibleWithClearMessage() throws Exception {
        CircuitDocument doc = pump(0.8, false);
        List<Variable> wrongType = List.of(VARS.get(0), VARS.get(1), new Variable("alarm", VariableType.CATEGORICAL,
                List.of("off", "on"), null, null));
        List<Variable> renamed = List.of(VARS.get(0), VARS.get(1), Variable.of("siren", VariableType.BINARY));
        CompiledCircuit a = compile(doc);
        IncompatibleCircuitsException e1 = assertThrows(IncompatibleCircuitsException.class, () -> CircuitComparison.compare(a,
                compile(CircuitDocument.builder().variables(wrongType).nodes(catAlarm(doc)).outputs(doc.outputs()).build()),
                CompareOptions.DEFAULT));
        assertTrue(e1.getMessage().contains("\"alarm\" is binary in the first circuit but categorical in the second"), e1.getMessage());
        IncompatibleCircuitsException e2 = assertThrows(IncompatibleCircuitsException.class, () -> CircuitComparison.compare(a,
                compile(CircuitDocument.builder().variables(renamed).nodes(doc.nodes()).outputs(doc.outputs()).build()),
                CompareOptions.DEFAULT));
        assertTrue(e2.getMessage().contains("\"alarm\" of the first circuit is not a variable of the second"), e2.getMessage());
    }

    private static List<Node> catAlarm(CircuitDocument doc) {
        List<Node> nodes = new ArrayList<>();
        for (Node x : doc.nodes()) {
            if (x instanceof InputNode in && in.family() == Family.BERNOULLI) {
                double p = in.params()[0];
                nodes.add(new InputNode(in.id(), null, Family.CATEGORICAL, in.vars(), new double[] {1 - p, p}, false));
            } else {
                nodes.add(x);
            }
        }
        return nodes;
    }

    @Test
    void identical_oneParameterOneUlpApart_notIdenticalButAgree() throws Exception {
        CircuitDocument doc = pump(0.8, false);
        List<Node> nodes = new ArrayList<>(doc.nodes());
        nodes.set(0, new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {Math.nextUp(3.1), 0.2}, false));
        CircuitDocument moved = CircuitDocument.builder().variables(doc.variables()).nodes(nodes).outputs(doc.outputs()).build();
        CompiledCircuit a = compile(doc);
        CompiledCircuit b = compile(moved);
        assertFalse(StructuralIdentity.identical(a, b));
        assertTrue(CircuitComparison.compare(a, b, new CompareOptions(200, 9, 1e-9, 1e-9)).passed());
    }

    private static CircuitDocument withOutputs(CircuitDocument doc, List<Output> outputs) {
        return CircuitDocument.builder().variables(doc.variables()).nodes(doc.nodes()).outputs(outputs).build();
    }

    @Test
    void compare_severalOutputs_matchedByNameElseIncompatible() throws Exception {
        CircuitDocument doc = pump(0.8, false);
        CompiledCircuit a = compile(withOutputs(doc, List.of(new Output("joint", 14), new Output("healthy", 12))));
        CompiledCircuit b = compile(withOutputs(doc, List.of(new Output("healthy", 12), new Output("joint", 14))));
        ComparisonReport r = CircuitComparison.compare(a, b, new CompareOptions(100, 5, 1e-9, 1e-9));
        assertTrue(r.passed(), r::toText);
        assertEquals(2, r.outputs().size());
        assertEquals("healthy", r.outputs().get(1).outputB());
        assertEquals(800, r.points());
        CompiledCircuit c = compile(withOutputs(doc, List.of(new Output("joint", 14), new Output("worn", 13))));
        IncompatibleCircuitsException e = assertThrows(IncompatibleCircuitsException.class,
                () -> CircuitComparison.compare(a, c, CompareOptions.DEFAULT));
        assertTrue(e.getMessage().contains("the outputs differ: [healthy, joint] in the first circuit, [joint, worn] in the second"),
                e.getMessage());
    }

    @Test
    void compare_sameSeed_sameReport() throws Exception {
        CompiledCircuit a = compile(pump(0.8, false));
        CompiledCircuit b = compile(pump(0.81, false));
        ComparisonReport r1 = CircuitComparison.compare(a, b, new CompareOptions(500, 11, 1e-9, 1e-9));
        ComparisonReport r2 = CircuitComparison.compare(a, b, new CompareOptions(500, 11, 1e-9, 1e-9));
        assertEquals(r1.toJson(), r2.toJson());
        assertArrayEquals(r1.worst().get(0).values(), r2.worst().get(0).values());
        assertTrue(r1.toJson().startsWith("{\"structurallyIdentical\": false, \"passed\": false, \"points\": 2000"), r1.toJson());
    }
}
