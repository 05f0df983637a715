package dev.circa.converter.normalize;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.compare.CircuitComparison;
import dev.circa.validator.compare.CompareOptions;
import dev.circa.validator.compare.ComparisonReport;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

public class RenormalizerTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    private static final List<Variable> VARS = List.of(
            new Variable("alarm", VariableType.BINARY, null, null, null),
            new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null),
            new Variable("pump", VariableType.BINARY, List.of("off", "on"), null, null));
    private static final int[] STATES = {2, 3, 2};

    /**
     * A discrete smooth, decomposable circuit with shared nodes. With {@code innerScaled} its inner sums
     * and categoricals are unnormalised; the output sum's weights are multiplied by {@code outputFactor}.
     * Also used by the renderer's tests.
     */
    public static CircuitDocument discrete(boolean innerScaled, double outputFactor) {
        return discrete(innerScaled, innerScaled, outputFactor);
    }

    /** As {@link #discrete(boolean, double)}, with unnormalised inner sums and categoricals chosen apart. */
    private static CircuitDocument discrete(boolean sumsScaled, boolean categoricalsScaled, double outputFactor) {
        double f = sumsScaled ? 1 : 0;
        List<Node> n = new ArrayList<>();
        n.add(new InputNode(0, null, Family.BERNOULLI, new int[] {0}, new double[] {0.2}, false));
        n.add(new InputNode(1, null, Family.BERNOULLI, new int[] {0}, new double[] {0.9}, false));
        n.add(new InputNode(2, null, Family.CATEGORICAL, new int[] {1},
                categoricalsScaled ? new double[] {0.2, 0.5, 0.9} : new double[] {0.25, 0.25, 0.5}, false));
        n.add(new InputNode(3, null, Family.CATEGORICAL, new int[] {1},
                categoricalsScaled ? new double[] {0, Math.log(2), 0} : new double[] {Math.log(0.25), Math.log(0.5), Math.log(0.25)}, true));
        n.add(new InputNode(4, null, Family.INDICATOR, new int[] {2}, new double[] {1}, false));
        n.add(new InputNode(5, null, Family.INDICATOR, new int[] {2}, new double[] {0}, false));
        n.add(new ProductNode(6, null, new int[] {0, 2}));
        n.add(new ProductNode(7, null, new int[] {1, 3}));
        n.add(new ProductNode(8, null, new int[] {0, 3}));
        n.add(new SumNode(9, null, new int[] {6, 7, 8}, f > 0 ? new double[] {2, 0.5, 1.5} : new double[] {0.5, 0.125, 0.375}, false));
        n.add(new SumNode(10, null, new int[] {4, 5}, f > 0 ? new double[] {0.3, 4} : new double[] {0.3, 0.7}, false));
        n.add(new SumNode(11, null, new int[] {7, 8},
                f > 0 ? new double[] {Math.log(3), Math.log(0.25)} : new double[] {Math.log(0.6), Math.log(0.4)}, true));
        n.add(new ProductNode(12, null, new int[] {9, 10}));
        n.add(new ProductNode(13, null, new int[] {11, 4}));
        n.add(new SumNode(14, "root", new int[] {12, 13}, new double[] {0.75 * outputFactor, 0.25 * outputFactor}, false));
        return CircuitDocument.builder().name("pump-alarms").variables(VARS).nodes(n)
                .outputs(List.of(new Output("joint", 14))).build();
    }

    /** Brute force: each node's total mass, summing its value over every assignment of its scope (independent of the engine). */
    private static double[] bruteForceMass(CircuitDocument doc) {
        List<Node> nodes = doc.nodes();
        Map<Integer, Integer> index = new HashMap<>();
        for (int i = 0; i < nodes.size(); i++) {
            index.put(nodes.get(i).id(), i);
        }
        BitSet[] scope = new BitSet[nodes.size()];
        for (int i = 0; i < nodes.size(); i++) {
            scope[i] = new BitSet();
            if (nodes.get(i) instanceof InputNode in) {
                scope[i].set(in.var());
            }
            for (int c : nodes.get(i).children()) {
                scope[i].or(scope[index.get(c)]);
            }
        }
        double[] mass = new double[nodes.size()];
        double[] value = new double[nodes.size()];
        int[] x = new int[3];
        for (x[0] = 0; x[0] < 2; x[0]++) {
            for (x[1] = 0; x[1] < 3; x[1]++) {
                for (x[2] = 0; x[2] < 2; x[2]++) {
                    for (int i = 0; i < nodes.size(); i++) {
                        Node node = nodes.get(i);
                        if (node instanceof InputNode in) {
                            int s = x[in.var()];
                            value[i] = switch (in.family()) {
                                case BERNOULLI -> s == 1 ? in.params()[0] : 1 - in.params()[0];
                                case CATEGORICAL -> in.logForm() ? Math.exp(in.params()[s]) : in.params()[s];
                                case INDICATOR -> s == in.params()[0] ? 1 : 0;
                                default -> throw new IllegalStateException();
                            };
                        } else if (node instanceof ProductNode p) {
                            double v = 1;
                            for (int c : p.children()) {
                                v *= value[index.get(c)];
                            }
                            value[i] = v;
                        } else {
                            SumNode s = (SumNode) node;
                            double v = 0;
                            for (int j = 0; j < s.children().length; j++) {
                                v += s.weight(j) * value[index.get(s.children()[j])];
                            }
                            value[i] = v;
                        }
                        mass[i] += value[i];
                    }
                }
            }
        }
        for (int i = 0; i < nodes.size(); i++) {
            double outside = 1;
            for (int v = 0; v < 3; v++) {
                if (!scope[i].get(v)) {
                    outside *= STATES[v];
                }
            }
            mass[i] /= outside;
        }
        return mass;
    }

    private static SumNode sum(CircuitDocument doc, int id) {
        return (SumNode) doc.nodes().stream().filter(x -> x.id() == id).findFirst().orElseThrow();
    }

    @Test
    void normalize_outputSumScaledByKnownFactor_recoversOriginalWeights() throws Exception {
        CircuitDocument original = discrete(false, 1);
        NormalizationResult r = Renormalizer.normalize(discrete(false, 3.7));
        // arithmetic: the output's mass is 3.7 times that of the normalised original (common practice)
        assertEquals(Math.log(3.7), r.logPartitionBefore()[0], 1e-12);
        assertEquals(0, r.logPartitionAfter()[0], 1e-12);
        for (int id : new int[] {9, 10, 11, 14}) {
            SumNode want = sum(original, id);
            SumNode got = sum(r.document(), id);
            assertEquals(want.logWeights(), got.logWeights());
            for (int j = 0; j < want.weights().length; j++) {
                assertEquals(want.weight(j), got.weight(j), 1e-12, "sum " + id + " weight " + j);
            }
        }
        assertEquals(0, r.inputsChanged());
    }

    @Test
    void normalize_recordsItselfInProvenance_keepingWhatCameBefore() throws Exception {
        CircuitDocument input = new dev.circa.format.io.CircuitReader().read(EXAMPLE);
        NormalizationResult r = Renormalizer.normalize(discrete(false, 3.7));
        String source = r.document().provenance().source();
        assertEquals("circa 0.1.0", r.document().provenance().producer());
        assertTrue(source.startsWith("renormalised by circa normalize (log Z before: "), source);
        // log Z before, as computed above by arithmetic: log 3.7
        assertTrue(source.contains(Double.toString(r.logPartitionBefore()[0])), source);
        NormalizationResult again = Renormalizer.normalize(input);
        String kept = again.document().provenance().source();
        assertTrue(input.provenance() == null || input.provenance().source() == null
                || kept.contains("from " + input.provenance().source()), kept);
    }

    @Test
    void normalize_innerSumsScaled_weightsAreWZjOverZiByBruteForce() throws Exception {
        CircuitDocument input = discrete(true, 2.5);
        double[] z = bruteForceMass(input);
        NormalizationResult r = Renormalizer.normalize(input);
        Map<Integer, Integer> index = new HashMap<>();
        for (int i = 0; i < input.nodes().size(); i++) {
            index.put(input.nodes().get(i).id(), i);
        }
        for (Node node : input.nodes()) {
            if (node instanceof SumNode s) {
                SumNode got = sum(r.document(), s.id());
                double zi = z[index.get(s.id())];
                for (int j = 0; j < s.children().length; j++) {
                    double want = s.weight(j) * z[index.get(s.children()[j])] / zi;
                    assertEquals(want, got.weight(j), 1e-12 * want, "sum " + s.id() + " weight " + j);
                }
            }
        }
        assertEquals(Math.log(z[index.get(14)]), r.logPartitionBefore()[0], 1e-12);
        assertEquals(0, r.logPartitionAfter()[0], 1e-12);
        InputNode cat = (InputNode) r.document().nodes().get(2);
        assertArrayEquals(new double[] {0.2 / 1.6, 0.5 / 1.6, 0.9 / 1.6}, cat.params(), 1e-15);
        InputNode logCat = (InputNode) r.document().nodes().get(3);
        assertTrue(logCat.logForm());
        assertEquals(Math.log(0.5), logCat.params()[1], 1e-15);
        assertEquals(2, r.inputsChanged());

        // brute force over all 12 assignments: the normalised output sums to 1
        Evaluator ev = new Evaluator(CompiledCircuit.compile(r.document()));
        double total = 0;
        double[] row = new double[3];
        double[] out = new double[1];
        for (int a = 0; a < 2; a++) {
            for (int v = 0; v < 3; v++) {
                for (int p = 0; p < 2; p++) {
                    row[0] = a;
                    row[1] = v;
                    row[2] = p;
                    ev.logDensity(row, 1, out);
                    total += Math.exp(out[0]);
                }
            }
        }
        assertEquals(1, total, 1e-12);

    }

    @Test
    void normalize_innerSumsScaled_compareAgreesWithInputDividedByZ() throws Exception {
        // inner sums and the output unnormalised, inputs normalised: the input divided by Z (brute force)
        // is its normalised distribution, with every variable present or missing
        CircuitDocument input = discrete(true, false, 2.5);
        double[] z = bruteForceMass(input);
        Map<Integer, Integer> index = new HashMap<>();
        for (int i = 0; i < input.nodes().size(); i++) {
            index.put(input.nodes().get(i).id(), i);
        }
        NormalizationResult r = Renormalizer.normalize(input);
        assertEquals(Math.log(z[index.get(14)]), r.logPartitionBefore()[0], 1e-12);
        List<Node> divided = new ArrayList<>(input.nodes());
        SumNode root = sum(input, 14);
        double zr = z[index.get(14)];
        divided.set(index.get(14), new SumNode(14, root.label(), root.children(),
                new double[] {root.weights()[0] / zr, root.weights()[1] / zr}, false));
        CircuitDocument dividedDoc = CircuitDocument.builder().variables(VARS).nodes(divided).outputs(input.outputs()).build();
        ComparisonReport cmp = CircuitComparison.compare(CompiledCircuit.compile(r.document()),
                CompiledCircuit.compile(dividedDoc), new CompareOptions(1000, 0, 1e-9, 1e-9));
        assertTrue(cmp.passed(), cmp::toText);
        assertEquals(4000, cmp.points());
        assertTrue(r.sumsChanged() >= 3);
    }

    @Test
    void normalize_givenTheValidatorsReport_sameNumbersAsValidatingAgain() throws Exception {
        // circa normalize passes the report the model was loaded with; the result must not depend on it
        for (CircuitDocument doc : List.of(discrete(true, 2.5), discrete(false, 3.7), discrete(true, false, 0.4))) {
            CompiledCircuit c = CompiledCircuit.compile(doc);
            ValidationReport report = new Validator(ValidationOptions.defaults()).validate(doc);
            NormalizationResult plain = Renormalizer.normalize(doc, c);
            NormalizationResult given = Renormalizer.normalize(doc, c, report);
            assertEquals(plain.sumsChanged(), given.sumsChanged());
            assertEquals(plain.inputsChanged(), given.inputsChanged());
            assertArrayEquals(plain.logPartitionAfter(), given.logPartitionAfter());
            for (int i = 0; i < doc.nodes().size(); i++) {
                Node a = plain.document().nodes().get(i);
                Node b = given.document().nodes().get(i);
                assertArrayEquals(numbers(a), numbers(b));
            }
        }
    }

    /** A sum's weights, an input's parameters, nothing for a product. */
    private static double[] numbers(Node n) {
        return n instanceof SumNode s ? s.weights() : n instanceof InputNode in ? in.params() : new double[0];
    }

    @Test
    void normalize_notDecomposable_refusedNamingProductAndVariable() {
        List<Node> n = List.of(
                new InputNode(0, null, Family.BERNOULLI, new int[] {0}, new double[] {0.2}, false),
                new InputNode(1, null, Family.BERNOULLI, new int[] {0}, new double[] {0.9}, false),
                new ProductNode(2, null, new int[] {0, 1}));
        CircuitDocument doc = CircuitDocument.builder().variables(VARS).nodes(n).outputs(List.of(new Output("joint", 2))).build();
        NotNormalizableException e = assertThrows(NotNormalizableException.class, () -> Renormalizer.normalize(doc));
        assertTrue(e.getMessage().contains("not decomposable") && e.getMessage().contains("product node 2")
                && e.getMessage().contains("alarm"), e.getMessage());
    }

    @Test
    void normalize_notSmooth_refusedNamingSumAndVariable() {
        List<Node> n = List.of(
                new InputNode(0, null, Family.BERNOULLI, new int[] {0}, new double[] {0.2}, false),
                new InputNode(1, null, Family.CATEGORICAL, new int[] {1}, new double[] {0.2, 0.3, 0.5}, false),
                new SumNode(2, null, new int[] {0, 1}, new double[] {0.5, 0.5}, false));
        CircuitDocument doc = CircuitDocument.builder().variables(VARS).nodes(n).outputs(List.of(new Output("joint", 2))).build();
        NotNormalizableException e = assertThrows(NotNormalizableException.class, () -> Renormalizer.normalize(doc));
        assertTrue(e.getMessage().contains("not smooth") && e.getMessage().contains("sum node 2")
                && e.getMessage().contains("alarm"), e.getMessage());
    }

    @Test
    void normalize_negativeWeight_refusedBeforeAnyRescaling() {
        List<Node> n = List.of(
                new InputNode(0, null, Family.BERNOULLI, new int[] {0}, new double[] {0.2}, false),
                new InputNode(1, null, Family.BERNOULLI, new int[] {0}, new double[] {0.9}, false),
                new SumNode(2, null, new int[] {0, 1}, new double[] {1.5, -0.5}, false));
        CircuitDocument doc = CircuitDocument.builder().variables(VARS).nodes(n).outputs(List.of(new Output("joint", 2))).build();
        // the compiler refuses it already; a circuit compiled elsewhere is refused by the renormaliser
        Exception e = assertThrows(Exception.class, () -> Renormalizer.normalize(doc));
        assertTrue(e instanceof CompileException || e instanceof NotNormalizableException, e.toString());
        assertTrue(e.getMessage().contains("-0.5"), e.getMessage());
    }

    @Test
    void normalize_scaledFormatExample_checksShiftedBackToSciPyValues() throws Exception {
        CircuitDocument pump = new CircuitReader().read(EXAMPLE);
        List<Node> nodes = new ArrayList<>(pump.nodes());
        SumNode root = (SumNode) nodes.get(6);
        nodes.set(6, new SumNode(6, null, root.children(), new double[] {0.85 * 2, 0.15 * 2}, false));
        List<CheckCase> cases = new ArrayList<>();
        for (CheckCase c : pump.checks().cases()) {
            cases.add(new CheckCase(c.output(), c.values(), c.logDensity() + Math.log(2)));
        }
        CircuitDocument scaled = CircuitDocument.builder().variables(pump.variables()).nodes(nodes).outputs(pump.outputs())
                .checks(new Checks(1e-9, 1e-9, cases)).build();
        NormalizationResult r = Renormalizer.normalize(scaled);
        assertEquals(Math.log(2), r.logPartitionBefore()[0], 1e-15);
        // FORMAT.md: the example's reference values were computed with SciPy 1.10
        assertEquals(0.18261296103078395, r.document().checks().cases().get(0).logDensity(), 1e-12);
        assertEquals(-2.1428574782131147, r.document().checks().cases().get(1).logDensity(), 1e-12);

        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        new CircuitWriter().write(r.document(), bytes);
        CircuitDocument back = new CircuitReader().readString(bytes.toString(StandardCharsets.UTF_8), "normalized.json");
        RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(back), Tolerance.resolve(back.checks(), null, null));
        check.checkEmbedded(back);
        CheckReport report = check.report();
        assertEquals(2, report.cases());
        assertEquals(0, report.failures(), report::toText);
    }
}
