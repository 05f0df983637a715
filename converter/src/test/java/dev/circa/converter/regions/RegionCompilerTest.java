package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.npz.NpyArray;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.FormatException;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphReader;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.UnaryOperator;
import org.junit.jupiter.api.Test;

class RegionCompilerTest {
    private static final Path NPZ = Path.of("..", "fixtures", "npz");
    /** The pass rule of FORMAT.md for the example reference set: atol = rtol = 1e-9. */
    private static final double TOL = 1e-9;

    static RegionGraph example() throws IOException {
        return new RegionGraphReader().read(NPZ.resolve("example-regions.json"));
    }

    static NpzArchive exampleParams() throws IOException {
        return NpzArchive.read(NPZ.resolve("example-params.npz"), 1 << 20);
    }

    static CompileOptions k3i2c1() {
        return new CompileOptions(3, 2, 1, Map.of());
    }

    /** Rows of example-reference.csv: variable values (NaN = empty cell) and the log-density last. */
    static List<double[]> referenceRows() throws IOException {
        List<double[]> rows = new ArrayList<>();
        for (String line : Files.readAllLines(NPZ.resolve("example-reference.csv"))) {
            if (line.startsWith("#") || line.startsWith("inlet_pressure")) {
                continue;
            }
            String[] cells = line.split(",", -1);
            double[] r = new double[cells.length];
            for (int i = 0; i < cells.length; i++) {
                r[i] = cells[i].isEmpty() ? Double.NaN
                        : cells[i].equals("-inf") ? Double.NEGATIVE_INFINITY : Double.parseDouble(cells[i]);
            }
            rows.add(r);
        }
        return rows;
    }

    /** The validator's verdict on a produced model: valid, smooth, decomposable (STYLE.md: validate what a converter makes). */
    static void assertValid(CircuitDocument doc) {
        dev.circa.validator.ValidationReport r = new dev.circa.validator.Validator(
                dev.circa.validator.ValidationOptions.defaults()).validate(doc);
        assertTrue(r.valid(), r.toString());
        assertEquals(dev.circa.validator.Verdict.TRUE, r.property(dev.circa.validator.Property.SMOOTH));
        assertEquals(dev.circa.validator.Verdict.TRUE, r.property(dev.circa.validator.Property.DECOMPOSABLE));
    }

    private static boolean passes(double got, double want) {
        if (want == Double.NEGATIVE_INFINITY) {
            return got == want;
        }
        return Math.abs(got - want) <= TOL + TOL * Math.abs(want);
    }

    @Test
    void compile_exampleWithNumpyParams_reproducesScipyReference() throws IOException {
        // Source: shared/data/npz/example-reference.csv, computed with NumPy 1.24 / SciPy 1.10 (README there);
        // the circuit is evaluated with commons-math3 3.6.1 densities (CircuitMath) node by node.
        CircuitDocument doc = RegionCompiler.compile(example(), k3i2c1(), exampleParams());
        List<double[]> rows = referenceRows();
        assertEquals(6, rows.size());
        for (double[] r : rows) {
            double want = r[4];
            double got = CircuitMath.logDensity(doc, java.util.Arrays.copyOf(r, 4))[0];
            assertTrue(passes(got, want), "got " + got + ", SciPy reference " + want);
        }
        assertEquals(List.of("joint"), doc.outputs().stream().map(o -> o.name()).toList());
        assertValid(doc);
        assertEquals(List.of(), dev.circa.format.schema.SchemaCatalog.get().validate(
                dev.circa.format.schema.SchemaCatalog.Kind.CIRCUIT,
                dev.circa.format.io.JsonInput.mapperFor(dev.circa.format.io.ReadLimits.DEFAULT).readTree(bytes(doc))));
    }

    @Test
    void tensorEvaluator_exampleWithNumpyParams_reproducesScipyReference() throws IOException {
        // Source: shared/data/npz/example-reference.csv (NumPy 1.24 / SciPy 1.10).
        RegionStructure s = RegionStructure.of(example());
        RegionParameters p = RegionParameters.fromArchive(s, k3i2c1(), exampleParams());
        List<double[]> rows = referenceRows();
        double[] data = new double[rows.size() * 4];
        for (int i = 0; i < rows.size(); i++) {
            System.arraycopy(rows.get(i), 0, data, i * 4, 4);
        }
        double[] out = new double[rows.size()];
        new RegionTensorEvaluator(p).logDensity(data, rows.size(), out);
        for (int i = 0; i < rows.size(); i++) {
            assertTrue(passes(out[i], rows.get(i)[4]), "row " + i + ": got " + out[i] + ", want " + rows.get(i)[4]);
        }
    }

    @Test
    void compile_example_smoothDecomposableNotStructured() throws IOException {
        // Definitions of FORMAT.md section 2 (smooth, decomposable, structured-decomposable), checked on scopes directly.
        CircuitDocument doc = RegionCompiler.compile(example(), k3i2c1(), exampleParams());
        assertTrue(CircuitMath.smooth(doc));
        assertTrue(CircuitMath.decomposable(doc));
        // the root's two partitions split it as {0,2}|{1,3} and {0,1}|{2,3}: no single variable tree
        assertFalse(CircuitMath.structuredDecomposable(doc));
    }

    @Test
    void compile_exampleLayout_countsAsFormatSaysAndIdsChildrenFirst() throws IOException {
        // FORMAT.md section 3 by hand: leaves 5..8 have 2 bundles of 1 input; leaves 3, 4 have 2 bundles of
        // 2 inputs and a product; regions 1, 2 have 2x2 products and 3 sums; the root 3x3 + 2x2 = 13 products, 1 sum.
        CircuitDocument doc = RegionCompiler.compile(example(), k3i2c1(), exampleParams());
        int inputs = 0;
        int products = 0;
        int sums = 0;
        for (int i = 0; i < doc.nodes().size(); i++) {
            Node n = doc.nodes().get(i);
            assertEquals(i, n.id());
            for (int c : n.children()) {
                assertTrue(c < i, "child " + c + " of node " + i + " comes later");
            }
            if (n instanceof InputNode) {
                inputs++;
            } else if (n instanceof SumNode s) {
                sums++;
                assertEquals(s.children().length, s.weights().length);
            } else {
                products++;
            }
        }
        assertEquals(4 * 2 + 2 * 2 * 2, inputs);
        assertEquals(2 * 2 + 2 * 4 + 13, products);
        assertEquals(2 * 3 + 1, sums);
        SumNode root = (SumNode) doc.nodes().get(doc.outputs().get(0).node());
        assertEquals(13, root.children().length);
        assertTrue(root.logWeights() == false);
    }

    @Test
    void compile_singlePartitionGraphs_structuredDecomposable() throws FormatException {
        // FORMAT.md section 3: one partition per inner region gives a structured-decomposable circuit.
        CompileOptions o = new CompileOptions(2, 2, 1, Map.of());
        for (RegionGraph g : List.of(GridRegions.generate(3, 4),
                RandomRegions.generate(RandomRegions.realVariables(7), 3, 1, 11))) {
            CircuitDocument doc = RegionCompiler.compile(g, o, 5);
            assertTrue(CircuitMath.smooth(doc));
            assertTrue(CircuitMath.decomposable(doc));
            assertTrue(CircuitMath.structuredDecomposable(doc));
        }
    }

    @Test
    void compile_rootSplitTwoWays_notStructuredDecomposable() throws FormatException {
        // Random graph with 3 repetitions at seed 2: the root's partitions differ (checked below), which breaks it.
        RegionGraph g = RandomRegions.generate(RandomRegions.realVariables(6), 2, 3, 2);
        List<Partition> rootParts = g.partitions().stream().filter(p -> p.region() == 0).toList();
        assertEquals(3, rootParts.size());
        assertFalse(java.util.Arrays.equals(g.regions().get(rootParts.get(0).parts()[0]).vars(),
                g.regions().get(rootParts.get(1).parts()[0]).vars()));
        CircuitDocument doc = RegionCompiler.compile(g, new CompileOptions(2, 2, 2, Map.of()), 9);
        assertTrue(CircuitMath.smooth(doc));
        assertTrue(CircuitMath.decomposable(doc));
        assertFalse(CircuitMath.structuredDecomposable(doc));
        assertEquals(List.of("out0", "out1"), doc.outputs().stream().map(o -> o.name()).toList());
        RegionParameters p = RegionParameters.seeded(RegionStructure.of(g), new CompileOptions(2, 2, 2, Map.of()), 9);
        RegionVerifier.Result r = RegionVerifier.verify(p, CircuitMath.evaluation(doc), 30, 4, TOL, TOL);
        assertTrue(r.passed(), r.summary());
    }

    @Test
    void tensorEvaluator_everyCompileFamily_agreesWithCommonsMath() throws IOException {
        // Densities of commons-math3 3.6.1 (CircuitMath) against the converter's own log-densities.
        RegionGraph g = mixedGraph();
        for (Family real : List.of(Family.NORMAL, Family.LOGNORMAL, Family.EXPONENTIAL, Family.GAMMA, Family.BETA,
                Family.UNIFORM)) {
            for (Family count : List.of(Family.POISSON, Family.BINOMIAL)) {
                Family binary = real.ordinal() % 2 == 0 ? Family.BERNOULLI : Family.INDICATOR;
                Family categorical = real.ordinal() % 3 == 0 ? Family.CATEGORICAL : Family.INDICATOR;
                CompileOptions o = new CompileOptions(2, 3, 1, Map.of(VariableType.REAL, real, VariableType.COUNT, count,
                        VariableType.BINARY, binary, VariableType.CATEGORICAL, categorical));
                RegionParameters p = RegionParameters.seeded(RegionStructure.of(g), o, real.ordinal() * 10L + count.ordinal());
                CircuitDocument doc = RegionCompiler.compile(p);
                assertValid(doc);
                RegionVerifier.Result r = RegionVerifier.verify(p, CircuitMath.evaluation(doc), 30, 5, TOL, TOL);
                assertTrue(r.passed(), real + " " + count + ": " + r.summary());
            }
        }
    }

    @Test
    void compile_seeded_normalisedAndRepeatable() throws IOException {
        // Normalised parameters are what FORMAT.md section 3 asks of a seed (common practice: weights sum to 1).
        RegionGraph g = mixedGraph();
        CompileOptions o = new CompileOptions(3, 3, 1, Map.of());
        CircuitDocument a = RegionCompiler.compile(g, o, 42);
        for (Node n : a.nodes()) {
            if (n instanceof SumNode s) {
                double t = 0;
                for (double w : s.weights()) {
                    assertTrue(w >= 0);
                    t += w;
                }
                assertEquals(1, t, 1e-12);
            } else if (n instanceof InputNode in && in.family() == Family.CATEGORICAL) {
                double t = 0;
                for (double q : in.params()) {
                    t += q;
                }
                assertEquals(1, t, 1e-12);
            }
        }
        assertArrayEquals(bytes(a), bytes(RegionCompiler.compile(g, o, 42)));
        assertFalse(java.util.Arrays.equals(bytes(a), bytes(RegionCompiler.compile(g, o, 43))));
        // the all-missing point integrates to 1: log Z = 0 for a normalised smooth decomposable circuit (FORMAT.md)
        double[] missing = {Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN};
        assertEquals(0, CircuitMath.logDensity(a, missing)[0], 1e-12);
    }

    @Test
    void compile_familyOptions_inputsUseThem() throws IOException {
        RegionGraph g = mixedGraph();
        CompileOptions o = new CompileOptions(2, 2, 1, Map.of(VariableType.REAL, Family.GAMMA,
                VariableType.COUNT, Family.BINOMIAL, VariableType.BINARY, Family.CATEGORICAL));
        CircuitDocument doc = RegionCompiler.compile(g, o, 3);
        for (Node n : doc.nodes()) {
            if (n instanceof InputNode in) {
                VariableType t = doc.variables().get(in.var()).type();
                assertEquals(o.family(t), in.family());
            }
        }
        RegionStructure s = RegionStructure.of(g);
        RegionParameters p = RegionParameters.seeded(s, o, 3);
        // the direct evaluation and the commons-math3 node-by-node evaluation agree
        RegionVerifier.Result r = RegionVerifier.verify(p, CircuitMath.evaluation(RegionCompiler.compile(p)), 40, 1, TOL, TOL);
        assertTrue(r.passed(), r.summary());
        assertThrows(IllegalArgumentException.class, () -> o.withFamily(VariableType.REAL, Family.MVNORMAL));
        assertThrows(IllegalArgumentException.class, () -> o.withFamily(VariableType.REAL, Family.POISSON));
        assertEquals(Family.LOGNORMAL, o.withFamilyOption("real=lognormal").family(VariableType.REAL));
        IllegalArgumentException bad = assertThrows(IllegalArgumentException.class, () -> o.withFamilyOption("real=gauss"));
        assertTrue(bad.getMessage().contains("unknown input family \"gauss\""), bad.getMessage());
    }

    @Test
    void compile_rootWithoutPartition_cSumsOverBundles() throws IOException {
        RegionGraph g = RegionGraph.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL),
                Variable.of("alarm", VariableType.BINARY))).regions(List.of(new Region(7, new int[] {0, 1}))).build();
        CircuitDocument doc = RegionCompiler.compile(g, new CompileOptions(5, 3, 2, Map.of()), 1);
        // 3 bundles x (2 inputs + 1 product) + 2 sums of 3 children
        assertEquals(11, doc.nodes().size());
        assertEquals(2, doc.outputs().size());
        SumNode s = (SumNode) doc.nodes().get(doc.outputs().get(1).node());
        assertArrayEquals(new int[] {2, 5, 8}, s.children());
        NpzArchive back = RegionCompiler.exportParameters(doc, g);
        assertEquals(List.of(2, 3), java.util.Arrays.stream(back.get("r7.weights").shape()).boxed().toList());
    }

    @Test
    void compile_chainOfTenThousandRegions_noStackOverflow() throws IOException {
        int n = 5_000;
        List<Variable> vars = RandomRegions.realVariables(n);
        List<Region> regions = new ArrayList<>();
        List<Partition> parts = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            int[] v = new int[n - i];
            for (int j = 0; j < v.length; j++) {
                v[j] = i + j;
            }
            regions.add(new Region(2 * i, v));
            if (i < n - 1) {
                regions.add(new Region(2 * i + 1, new int[] {i}));
                parts.add(new Partition(2 * i, new int[] {2 * i + 1, 2 * i + 2}));
            }
        }
        RegionGraph g = RegionGraph.builder().variables(vars).regions(regions).partitions(parts).build();
        CircuitDocument doc = RegionCompiler.compile(g, new CompileOptions(1, 1, 1, Map.of()), 0);
        // n leaf inputs, one product and one sum per inner region
        assertEquals(n + (n - 1) * 2, doc.nodes().size());
        NpzArchive back = RegionCompiler.exportParameters(doc, g);
        // mean and sd per leaf, weights per inner region
        assertEquals(2 * n + n - 1, back.size());
    }

    @Test
    void exportThenCompile_seededMixedFamilies_bitExact() throws IOException {
        RegionGraph g = mixedGraph();
        CompileOptions o = new CompileOptions(3, 2, 2, Map.of(VariableType.REAL, Family.UNIFORM,
                VariableType.COUNT, Family.BINOMIAL));
        CircuitDocument a = RegionCompiler.compile(g, o, 77);
        // through the file formats: circuit written and read back, archive written and read back
        CircuitDocument read = new CircuitReader().readString(new String(bytes(a), StandardCharsets.UTF_8), "a.json");
        NpzArchive exported = RegionCompiler.exportParameters(read, g);
        ByteArrayOutputStream zip = new ByteArrayOutputStream();
        exported.write(zip, true);
        NpzArchive again = NpzArchive.read(new ByteArrayInputStream(zip.toByteArray()), "p.npz", 1 << 24);
        CircuitDocument b = RegionCompiler.compile(g, o, again);
        assertValid(b);
        assertEquals(string(a).replaceAll("\"provenance\".*\n", ""), string(b).replaceAll("\"provenance\".*\n", ""));
        assertTrue(exported.contains("r0.weights"));
        assertTrue(exported.contains("r" + leafIdOf(g, 2) + ".v2.p") || exported.contains("r" + leafIdOf(g, 2) + ".v2.probs"));
    }

    @Test
    void exportThenCompile_numpyParamsWithLogWeights_bitExact() throws IOException {
        CircuitDocument a = RegionCompiler.compile(example(), k3i2c1(), exampleParams());
        NpzArchive exported = RegionCompiler.exportParameters(a, example());
        assertTrue(exported.contains("r2.logweights"));
        assertTrue(exported.contains("r3.v0.mean"), "per-variable arrays replace the per-region shorthand");
        CircuitDocument b = RegionCompiler.compile(example(), k3i2c1(), exported);
        assertEquals(string(a).replaceAll("\"provenance\".*\n", ""), string(b).replaceAll("\"provenance\".*\n", ""));
        // the shorthand r3.mean (2, 2) gives bundle i, variable position j at [i, j] (FORMAT.md section 3)
        NpyArray shorthand = exampleParams().get("r3.mean");
        assertEquals(Double.doubleToLongBits(shorthand.value(1 * 2 + 1)), Double.doubleToLongBits(exported.get("r3.v1.mean").value(1)));
    }

    @Test
    void export_circuitFromOtherGraph_locatedError() throws IOException {
        CircuitDocument a = RegionCompiler.compile(GridRegions.generate(2, 2), new CompileOptions(2, 2, 1, Map.of()), 1);
        // same variables, but the root splits {r0c0, r1c0} | {r0c1, r1c1} instead of by rows
        RegionGraph other = RegionGraph.builder().variables(GridRegions.variables(2, 2))
                .regions(List.of(new Region(0, new int[] {0, 1, 2, 3}), new Region(1, new int[] {0, 2}),
                        new Region(2, new int[] {1, 3}), new Region(3, new int[] {0}), new Region(4, new int[] {2}),
                        new Region(5, new int[] {1}), new Region(6, new int[] {3})))
                .partitions(List.of(new Partition(0, new int[] {1, 2}), new Partition(1, new int[] {3, 4}),
                        new Partition(2, new int[] {5, 6})))
                .build();
        FormatException e = assertThrows(FormatException.class, () -> RegionCompiler.exportParameters(a, other));
        assertTrue(e.getMessage().contains("not what compiling the region graph gives"), e.getMessage());
    }

    @Test
    void fromArchive_badArrays_errorsNameTheArray() throws IOException {
        NpzArchive good = exampleParams();
        record Case(UnaryOperator<List<NpyArray>> edit, String fragment) {
        }
        List<Case> cases = List.of(
                new Case(l -> without(l, "r5.v0.sd"), "array r5.v0.sd: missing"),
                new Case(l -> with(l, NpyArray.ofDoubles("r9.weights", new int[] {1}, new double[] {1})),
                        "array r9.weights: unexpected"),
                new Case(l -> replace(l, NpyArray.ofDoubles("r1.weights", new int[] {4, 3}, new double[12])),
                        "array r1.weights: has shape (4, 3); expected (3, 4)"),
                new Case(l -> with(l, NpyArray.ofDoubles("r3.v0.mean", new int[] {2}, new double[] {1, 2})),
                        "array r3.v0.mean: the mean of variable 0 in region 3 is given twice"),
                new Case(l -> with(l, NpyArray.ofDoubles("r2.weights", new int[] {3, 4}, new double[12])),
                        "array r2.weights: region 2's weights are given twice"),
                new Case(l -> replace(l, NpyArray.ofDoubles("r5.v0.sd", new int[] {2}, new double[] {1, -0.5})),
                        "array r5.v0.sd: the sd of variable 0, bundle 1 is -0.5; expected sd > 0"),
                new Case(l -> replace(l, NpyArray.ofDoubles("r4.v2.p", new int[] {2}, new double[] {1.5, 0.5})),
                        "array r4.v2.p: the p of variable 2, bundle 0 is 1.5; expected p in [0, 1]"),
                new Case(l -> replace(l, NpyArray.ofDoubles("r0.weights", new int[] {1, 13}, nan(13))),
                        "array r0.weights: value at [0, 0] is NaN"));
        for (Case c : cases) {
            NpzArchive bad = NpzArchive.of(c.edit().apply(new ArrayList<>(good.arrays())));
            FormatException e = assertThrows(FormatException.class,
                    () -> RegionCompiler.compile(example(), k3i2c1(), bad), c.fragment());
            assertTrue(e.getMessage().contains(c.fragment()), e.getMessage() + "\n expected: " + c.fragment());
        }
    }

    @Test
    void verify_tamperedCircuit_fails() throws IOException {
        RegionStructure s = RegionStructure.of(example());
        RegionParameters p = RegionParameters.fromArchive(s, k3i2c1(), exampleParams());
        CircuitDocument doc = RegionCompiler.compile(p);
        RegionVerifier.Result ok = RegionVerifier.verify(p, CircuitMath.evaluation(doc), 50, 3, TOL, TOL);
        assertTrue(ok.passed(), ok.summary());
        assertEquals(151, ok.points());
        List<Node> nodes = new ArrayList<>(doc.nodes());
        SumNode root = (SumNode) nodes.get(nodes.size() - 1);
        double[] w = root.weights().clone();
        w[0] *= 1.01;
        nodes.set(nodes.size() - 1, new SumNode(root.id(), null, root.children(), w, false));
        CircuitDocument bad = CircuitDocument.builder().variables(doc.variables()).nodes(nodes).outputs(doc.outputs()).build();
        RegionVerifier.Result r = RegionVerifier.verify(p, CircuitMath.evaluation(bad), 50, 3, TOL, TOL);
        assertFalse(r.passed());
        assertTrue(r.maxAbsDifference() > 1e-6);
        assertNotEquals(0, r.failures());
    }

    @Test
    void tensorEvaluator_zeroWeightOnDominantChild_exactLogSumExp() throws IOException {
        // A zero weight on the only child that does not underflow: the value is the other child's, about -5000.
        RegionGraph g = RegionGraph.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL)))
                .regions(List.of(new Region(0, new int[] {0}))).build();
        NpzArchive a = NpzArchive.of(List.of(NpyArray.ofDoubles("r0.v0.mean", new int[] {2}, new double[] {0, 100}),
                NpyArray.ofDoubles("r0.v0.sd", new int[] {2}, new double[] {1, 1}),
                NpyArray.ofDoubles("r0.weights", new int[] {1, 2}, new double[] {0, 1})));
        CompileOptions o = new CompileOptions(1, 2, 1, Map.of());
        RegionParameters p = RegionParameters.fromArchive(RegionStructure.of(g), o, a);
        double[] out = new double[1];
        new RegionTensorEvaluator(p).logDensity(new double[] {0}, 1, out);
        // commons-math3 3.6.1 normal log-density of N(100, 1) at 0
        double want = new org.apache.commons.math3.distribution.NormalDistribution(null, 100, 1).logDensity(0);
        assertEquals(want, out[0], 1e-9 * Math.abs(want));
        assertEquals(want, CircuitMath.logDensity(RegionCompiler.compile(p), new double[] {0})[0], 1e-9 * Math.abs(want));
    }

    /** Pump-station variables of four types over two leaves and a 3-variable leaf. */
    static RegionGraph mixedGraph() {
        List<Variable> vars = List.of(Variable.of("inlet_pressure", VariableType.REAL),
                new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null),
                Variable.of("alarm", VariableType.BINARY), Variable.of("restarts", VariableType.COUNT),
                Variable.of("motor_current", VariableType.REAL));
        List<Region> regions = List.of(new Region(0, new int[] {0, 1, 2, 3, 4}), new Region(1, new int[] {0, 4}),
                new Region(2, new int[] {1, 2, 3}), new Region(3, new int[] {0}), new Region(4, new int[] {4}));
        List<Partition> parts = List.of(new Partition(0, new int[] {1, 2}), new Partition(1, new int[] {3, 4}));
        return RegionGraph.builder().variables(vars).regions(regions).partitions(parts).build();
    }

    private static int leafIdOf(RegionGraph g, int var) {
        for (Region r : g.regions()) {
            if (java.util.Arrays.binarySearch(r.vars(), var) >= 0 && g.partitions().stream().noneMatch(p -> p.region() == r.id())) {
                return r.id();
            }
        }
        return -1;
    }

    private static double[] nan(int n) {
        double[] d = new double[n];
        java.util.Arrays.fill(d, Double.NaN);
        return d;
    }

    private static List<NpyArray> without(List<NpyArray> l, String name) {
        l.removeIf(a -> a.name().equals(name));
        return l;
    }

    private static List<NpyArray> with(List<NpyArray> l, NpyArray a) {
        l.add(a);
        return l;
    }

    private static List<NpyArray> replace(List<NpyArray> l, NpyArray a) {
        without(l, a.name());
        l.add(a);
        return l;
    }

    static byte[] bytes(CircuitDocument d) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new CircuitWriter().write(d, out);
        return out.toByteArray();
    }

    private static String string(CircuitDocument d) throws IOException {
        return new String(bytes(d), StandardCharsets.UTF_8);
    }
}
