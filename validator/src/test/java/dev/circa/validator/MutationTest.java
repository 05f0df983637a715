package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;

/**
 * Random valid circuits must pass; each mutant breaks exactly one thing and must be caught by the
 * rule (and property) that guards it. The counts are printed.
 */
class MutationTest {
    private static final int CIRCUITS = 160;

    private final Validator validator = new Validator(ValidationOptions.defaults());
    private final Map<String, int[]> counts = new TreeMap<>();

    @Test
    void mutants_eachBreakingOneProperty_caughtByItsRule() throws Exception {
        int maxNodes = 0;
        for (int seed = 0; seed < CIRCUITS; seed++) {
            CircuitDocument doc = new RandomCircuits(seed).generate(3 + seed % 16, 2 + seed % 3);
            maxNodes = Math.max(maxNodes, doc.nodes().size());
            ValidationReport base = validator.validate(doc);
            if (!base.valid() || base.count(Severity.WARNING) > 0) {
                fail("seed " + seed + ": unmutated circuit not clean: " + base.diagnostics());
            }
            assertEquals(Verdict.TRUE, base.property(Property.SMOOTH));
            assertEquals(Verdict.TRUE, base.property(Property.DECOMPOSABLE));
            assertEquals(Verdict.TRUE, base.property(Property.NORMALIZED));
            // the one-pass log Z agrees with the engine's evaluation with every variable missing
            double engineZ = new Evaluator(CompiledCircuit.compile(doc)).logPartition()[0];
            assertEquals(engineZ, base.logPartition().get("joint"), 1e-9);
            count("unmutated", true);
            Random rnd = new Random(1000L + seed);
            List<Node> nodes = doc.nodes();
            mutant("overlap", doc, overlap(nodes, rnd), "ProductScopesOverlap", Property.DECOMPOSABLE);
            mutant("dropVariable", doc, drop(nodes, rnd), "SumScopesDiffer", Property.SMOOTH);
            mutant("perturbWeight", doc, perturb(nodes, rnd), "WeightsNotNormalized", Property.NORMALIZED);
            mutant("flipSign", doc, flip(nodes, rnd), "WeightNegative", null);
            mutant("forwardReference", doc, forward(nodes, rnd), "ChildNotEarlier", null);
            mutant("duplicateId", doc, duplicate(nodes, rnd), "DuplicateNodeId", null);
            Object[] broken = breakParameter(nodes, rnd);
            @SuppressWarnings("unchecked")
            List<Node> bn = (List<Node>) broken[0];
            mutant("brokenParameter", doc, bn, (String) broken[1], null);
        }
        int total = 0;
        StringBuilder sb = new StringBuilder("mutation suite (" + CIRCUITS + " circuits, up to " + maxNodes + " nodes):\n");
        for (Map.Entry<String, int[]> e : counts.entrySet()) {
            sb.append(String.format(java.util.Locale.ROOT, "  %-17s %5d caught of %5d%n", e.getKey(), e.getValue()[0], e.getValue()[1]));
            if (!e.getKey().equals("unmutated")) {
                total += e.getValue()[1];
            }
        }
        sb.append("  mutants in all: ").append(total);
        System.out.println(sb);
        assertTrue(total >= 1000, "only " + total + " mutants");
        for (Map.Entry<String, int[]> e : counts.entrySet()) {
            assertEquals(e.getValue()[1], e.getValue()[0], e.getKey() + " not all caught");
        }
    }

    @Test
    void mutants_threeBreaksAtOnce_reportedWithoutThrowing() {
        int validated = 0;
        for (int seed = 0; seed < 60; seed++) {
            CircuitDocument doc = new RandomCircuits(5000L + seed).generate(3 + seed % 10, 3);
            Random rnd = new Random(seed);
            List<Node> nodes = doc.nodes();
            for (int k = 0; k < 3; k++) {
                List<Node> next;
                try {
                    next = switch (rnd.nextInt(7)) {
                        case 0 -> overlap(nodes, rnd);
                        case 1 -> drop(nodes, rnd);
                        case 2 -> perturb(nodes, rnd);
                        case 3 -> flip(nodes, rnd);
                        case 4 -> forward(nodes, rnd);
                        case 5 -> duplicate(nodes, rnd);
                        default -> {
                            @SuppressWarnings("unchecked")
                            List<Node> b = (List<Node>) breakParameter(nodes, rnd)[0];
                            yield b;
                        }
                    };
                } catch (RuntimeException e) {
                    // the mutator (test code) assumes the structure an earlier mutation broke: skip it
                    next = null;
                }
                if (next != null) {
                    nodes = next;
                }
            }
            CircuitDocument m = CircuitDocument.builder().variables(doc.variables()).nodes(nodes).outputs(doc.outputs()).build();
            ValidationReport r = validator.validate(m);
            ReportFormat.SARIF.render(List.of(r));
            if (nodes != doc.nodes()) {
                assertTrue(!r.valid(), "seed " + seed + ": mutated circuit reported valid");
            }
            validated++;
        }
        assertEquals(60, validated);
    }

    private void count(String kind, boolean caught) {
        int[] c = counts.computeIfAbsent(kind, k -> new int[2]);
        c[1]++;
        if (caught) {
            c[0]++;
        }
    }

    private void mutant(String kind, CircuitDocument doc, List<Node> nodes, String code, Property property) {
        if (nodes == null) {
            return;
        }
        CircuitDocument m = CircuitDocument.builder().variables(doc.variables()).nodes(nodes).outputs(doc.outputs()).build();
        ValidationReport r = validator.validate(m);
        boolean caught = !r.valid();
        boolean found = false;
        for (Diagnostic d : r.diagnostics()) {
            found |= d.code().equals(code) && d.severity() == Severity.ERROR;
        }
        caught &= found;
        if (property != null) {
            caught &= r.property(property) == Verdict.FALSE;
        }
        if (!caught) {
            System.out.println(kind + " not caught as " + code + ": " + r.diagnostics());
        }
        count(kind, caught);
    }

    private static Map<Integer, Integer> index(List<Node> nodes) {
        Map<Integer, Integer> m = new HashMap<>();
        for (int i = 0; i < nodes.size(); i++) {
            m.put(nodes.get(i).id(), i);
        }
        return m;
    }

    private static int maxId(List<Node> nodes) {
        int m = 0;
        for (Node n : nodes) {
            m = Math.max(m, n.id());
        }
        return m;
    }

    /** Scope of every node (small circuits: plain sets are fine in a test). */
    private static List<java.util.BitSet> scopes(List<Node> nodes) {
        Map<Integer, Integer> idx = index(nodes);
        List<java.util.BitSet> s = new ArrayList<>();
        for (Node n : nodes) {
            java.util.BitSet b = new java.util.BitSet();
            if (n instanceof InputNode in) {
                for (int v : in.vars()) {
                    b.set(v);
                }
            } else {
                for (int c : n.children()) {
                    b.or(s.get(idx.get(c)));
                }
            }
            s.add(b);
        }
        return s;
    }

    /** Wraps child c1 of a product P as product(c1, L), L an input on a variable of another child of P. */
    private static List<Node> overlap(List<Node> nodes, Random rnd) {
        List<java.util.BitSet> sc = scopes(nodes);
        Map<Integer, Integer> idx = index(nodes);
        List<Integer> cands = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof ProductNode p && p.children().length >= 2) {
                cands.add(i);
            }
        }
        if (cands.isEmpty()) {
            return null;
        }
        // deepest first half of the candidates: products low in the DAG
        int pi = cands.get(rnd.nextInt(Math.max(1, (cands.size() + 1) / 2)));
        ProductNode p = (ProductNode) nodes.get(pi);
        int c1 = p.children()[0];
        int c2 = p.children()[1];
        int v = sc.get(idx.get(c2)).nextSetBit(0);
        int leaf = -1;
        for (int i = 0; i < pi; i++) {
            if (nodes.get(i) instanceof InputNode in && in.vars().length == 1 && in.var() == v) {
                leaf = in.id();
                break;
            }
        }
        List<Node> out = new ArrayList<>(nodes);
        int qid = maxId(nodes) + 1;
        out.add(pi, new ProductNode(qid, null, new int[] {c1, leaf}));
        int[] kids = p.children().clone();
        kids[0] = qid;
        out.set(pi + 1, new ProductNode(p.id(), null, kids));
        return leaf < 0 ? null : out;
    }

    /** Replaces a product child of a sum by the same product without one of its children. */
    private static List<Node> drop(List<Node> nodes, Random rnd) {
        Map<Integer, Integer> idx = index(nodes);
        List<int[]> cands = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof SumNode s && s.children().length >= 2) {
                for (int j = 0; j < s.children().length; j++) {
                    if (nodes.get(idx.get(s.children()[j])) instanceof ProductNode p && p.children().length >= 2) {
                        cands.add(new int[] {i, j});
                    }
                }
            }
        }
        if (cands.isEmpty()) {
            return null;
        }
        int[] c = cands.get(rnd.nextInt(cands.size()));
        SumNode s = (SumNode) nodes.get(c[0]);
        ProductNode p = (ProductNode) nodes.get(idx.get(s.children()[c[1]]));
        int[] kids = Arrays.copyOf(p.children(), p.children().length - 1);
        List<Node> out = new ArrayList<>(nodes);
        int nid = maxId(nodes) + 1;
        out.add(c[0], new ProductNode(nid, null, kids));
        int[] sk = s.children().clone();
        sk[c[1]] = nid;
        out.set(c[0] + 1, new SumNode(s.id(), null, sk, s.weights(), s.logWeights()));
        return out;
    }

    private static int randomSum(List<Node> nodes, Random rnd) {
        List<Integer> sums = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof SumNode) {
                sums.add(i);
            }
        }
        return sums.isEmpty() ? -1 : sums.get(rnd.nextInt(sums.size()));
    }

    /** Scales one weight of a sum by 1.01 (1e-2, far beyond the default tolerance 1e-9). */
    private static List<Node> perturb(List<Node> nodes, Random rnd) {
        int i = randomSum(nodes, rnd);
        if (i < 0) {
            return null;
        }
        SumNode s = (SumNode) nodes.get(i);
        double[] w = s.weights().clone();
        int j = rnd.nextInt(w.length);
        w[j] = s.logWeights() ? w[j] + Math.log(1.01) : w[j] * 1.01;
        List<Node> out = new ArrayList<>(nodes);
        out.set(i, new SumNode(s.id(), null, s.children(), w, s.logWeights()));
        return out;
    }

    /** Flips the sign of one linear weight (log-weights are turned linear first). */
    private static List<Node> flip(List<Node> nodes, Random rnd) {
        int i = randomSum(nodes, rnd);
        if (i < 0) {
            return null;
        }
        SumNode s = (SumNode) nodes.get(i);
        double[] w = new double[s.weights().length];
        for (int j = 0; j < w.length; j++) {
            w[j] = s.weight(j);
        }
        int j = rnd.nextInt(w.length);
        w[j] = -w[j];
        List<Node> out = new ArrayList<>(nodes);
        out.set(i, new SumNode(s.id(), null, s.children(), w, false));
        return out;
    }

    /** Moves a child to just after its parent. */
    private static List<Node> forward(List<Node> nodes, Random rnd) {
        Map<Integer, Integer> idx = index(nodes);
        List<Integer> parents = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (!(nodes.get(i) instanceof InputNode)) {
                parents.add(i);
            }
        }
        int pi = parents.get(rnd.nextInt(parents.size()));
        Node p = nodes.get(pi);
        int ci = idx.get(p.children()[rnd.nextInt(p.children().length)]);
        List<Node> out = new ArrayList<>(nodes);
        Node c = out.remove(ci);
        out.add(pi, c);
        return out;
    }

    /** Gives a node the id of another node. */
    private static List<Node> duplicate(List<Node> nodes, Random rnd) {
        int a = rnd.nextInt(nodes.size());
        int b = rnd.nextInt(nodes.size() - 1);
        b = b >= a ? b + 1 : b;
        int newId = nodes.get(b).id();
        Node n = nodes.get(a);
        Node m;
        if (n instanceof InputNode in) {
            m = new InputNode(newId, null, in.family(), in.vars(), in.params(), in.logForm());
        } else if (n instanceof ProductNode p) {
            m = new ProductNode(newId, null, p.children());
        } else {
            SumNode s = (SumNode) n;
            m = new SumNode(newId, null, s.children(), s.weights(), s.logWeights());
        }
        List<Node> out = new ArrayList<>(nodes);
        out.set(a, m);
        return out;
    }

    /** Breaks one parameter of one input: {mutated nodes, the code expected}. */
    private static Object[] breakParameter(List<Node> nodes, Random rnd) {
        List<Integer> inputs = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof InputNode) {
                inputs.add(i);
            }
        }
        int i = inputs.get(rnd.nextInt(inputs.size()));
        InputNode in = (InputNode) nodes.get(i);
        double[] p = in.params().clone();
        String code = "ParameterOutOfRange";
        switch (in.family()) {
            case NORMAL, LOGNORMAL -> p[1] = -p[1];
            case EXPONENTIAL, POISSON -> p[0] = 0;
            case GAMMA, BETA -> p[rnd.nextInt(2)] = -0.5;
            case UNIFORM -> {
                double t = p[0];
                p[0] = p[1];
                p[1] = t;
            }
            case BERNOULLI -> p[0] = 1.25;
            case BINOMIAL -> p[0] = p[0] + 0.5;
            case INDICATOR -> p[0] = 7;
            case CATEGORICAL -> {
                p[0] += 0.25;
                code = "ProbabilitiesNotNormalized";
            }
            case MVNORMAL -> {
                // off-diagonal beyond sqrt(a * b): not positive definite (2 x 2 determinant < 0)
                double c = 1.5 * Math.sqrt(p[2] * p[5]);
                p[3] = c;
                p[4] = c;
                code = "CovarianceNotPositiveDefinite";
            }
            default -> throw new IllegalStateException();
        }
        List<Node> out = new ArrayList<>(nodes);
        out.set(i, new InputNode(in.id(), null, in.family(), in.vars(), p, in.logForm()));
        return new Object[] {out, code};
    }
}
