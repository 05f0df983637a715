package dev.circa.engine;

import static dev.circa.engine.Tolerances.assertClose;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitReader;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Random;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * What every evaluator variant must do. A variant's test extends this class and says how to build it;
 * the generic path ({@link Evaluator.Mode#GENERIC}) is the first.
 */
abstract class EvaluatorContractTest {
    static final Path PUMP_STATION = Path.of("..", "fixtures", "circuits", "pump-station.json");

    /** The operations of an evaluator, as the contract sees them. */
    interface Variant {
        void logDensity(double[] data, int rows, double[] out);

        void conditional(double[] data, int rows, boolean[] given, double[] out);

        double[] logPartition();

        void mpe(double[] data, int rows, int output, double[] completed, double[] logValue);
    }

    /** A fresh evaluator variant for {@code circuit}. */
    protected abstract Variant create(CompiledCircuit circuit);

    /** The variant that runs every operation on {@code e}. */
    static Variant of(Evaluator e) {
        return of(e, e::logDensity, e::conditional);
    }

    /** The variant that runs densities and conditionals as given, partition and MPE on {@code e}. */
    static Variant of(Evaluator e, Densities densities, Conditionals conditionals) {
        return new Variant() {
            @Override
            public void logDensity(double[] data, int rows, double[] out) {
                densities.logDensity(data, rows, out);
            }

            @Override
            public void conditional(double[] data, int rows, boolean[] given, double[] out) {
                conditionals.conditional(data, rows, given, out);
            }

            @Override
            public double[] logPartition() {
                return e.logPartition();
            }

            @Override
            public void mpe(double[] data, int rows, int output, double[] completed, double[] logValue) {
                e.mpe(data, rows, output, completed, logValue);
            }
        };
    }

    /** Log-densities of a batch of rows. */
    interface Densities {
        void logDensity(double[] data, int rows, double[] out);
    }

    /** Conditional log-densities of a batch of rows. */
    interface Conditionals {
        void conditional(double[] data, int rows, boolean[] given, double[] out);
    }

    private double[] densities(CompiledCircuit circuit, double[] rows) {
        double[] out = new double[rows.length / circuit.variableCount() * circuit.outputCount()];
        create(circuit).logDensity(rows, rows.length / circuit.variableCount(), out);
        return out;
    }

    @Test
    void logDensity_pumpStationExample_matchesSciPyReference() throws Exception {
        CircuitDocument doc = new CircuitReader().read(PUMP_STATION);
        CompiledCircuit circuit = CompiledCircuit.compile(doc);
        double[] out = densities(circuit, new double[] {3.0, 2, 2.1, Double.NaN});
        // FORMAT.md section 5: SciPy 1.10 reference values of the example circuit
        assertClose(0.18261296103078395, out[0], "p(inlet_pressure 3.0, valve open)");
        assertClose(-2.1428574782131147, out[1], "p(inlet_pressure 2.1)");
    }

    @Test
    void logDensity_standardNormal_matchesHandbookTable() {
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL);
        t.output("joint", t.input(Family.NORMAL, 0, 0, 1));
        double[] out = densities(t.compile(), new double[] {0, 1, 2});
        // Abramowitz & Stegun, Handbook of Mathematical Functions, Table 26.1, Z(x) at x = 0, 1, 2
        // (values quoted from memory, 12 significant digits)
        double[] table = {0.398942280401, 0.241970724519, 0.053990966513};
        for (int i = 0; i < 3; i++) {
            assertEquals(table[i], Math.exp(out[i]), 5e-13, "Z(" + i + ")");
        }
    }

    @Test
    void logDensity_allCompleteAssignments_sumToOne() {
        for (long seed = 1; seed <= 5; seed++) {
            double[] out = densities(TestCircuits.randomDiscrete(seed, false).compile(), TestCircuits.allAssignments());
            double total = 0;
            for (double v : out) {
                total += Math.exp(v);
            }
            // a normalised discrete distribution sums to 1 over its assignments (common practice)
            assertEquals(1.0, total, 1e-12, "seed " + seed);
        }
    }

    @Test
    void logDensity_missingValues_equalBruteForceMarginal() {
        int nv = TestCircuits.DISCRETE_SIZES.length;
        double[] all = TestCircuits.allAssignments();
        int count = all.length / nv;
        for (long seed = 1; seed <= 3; seed++) {
            CompiledCircuit circuit = TestCircuits.randomDiscrete(seed, false).compile();
            double[] joint = densities(circuit, all);
            for (int mask = 1; mask < 1 << nv; mask++) {
                double[] rows = masked(all, mask, nv);
                double[] marginal = densities(circuit, rows);
                for (int a = 0; a < count; a++) {
                    // the marginal is the sum of the joint over the missing variables (common practice)
                    double brute = 0;
                    for (int b = 0; b < count; b++) {
                        if (agrees(all, a, b, mask, nv)) {
                            brute += Math.exp(joint[b]);
                        }
                    }
                    assertClose(Math.log(brute), marginal[a], "seed " + seed + " mask " + mask + " row " + a);
                }
            }
        }
    }

    @Test
    void logPartition_unnormalisedCircuit_equalsBruteForceSum() {
        for (long seed = 1; seed <= 3; seed++) {
            CompiledCircuit circuit = TestCircuits.randomDiscrete(seed, true).compile();
            double[] joint = densities(circuit, TestCircuits.allAssignments());
            double brute = 0;
            for (double v : joint) {
                brute += Math.exp(v);
            }
            double logZ = create(circuit).logPartition()[0];
            // the partition function is the sum over all complete assignments (common practice)
            assertClose(Math.log(brute), logZ, "seed " + seed);
            assertTrue(Math.abs(logZ) > 1e-3, "the scaled circuit is not normalised");
        }
    }

    @Test
    void conditional_discreteEvidence_equalsBruteForceRatio() {
        int nv = TestCircuits.DISCRETE_SIZES.length;
        double[] all = TestCircuits.allAssignments();
        int count = all.length / nv;
        CompiledCircuit circuit = TestCircuits.randomDiscrete(7, false).compile();
        double[] joint = densities(circuit, all);
        boolean[] given = {true, false, false, true};
        int givenMask = 0b0110; // bits of the variables that are not given, as in masked()
        double[] out = new double[count];
        create(circuit).conditional(all, count, given, out);
        for (int a = 0; a < count; a++) {
            double evidence = 0;
            for (int b = 0; b < count; b++) {
                if (agrees(all, a, b, givenMask, nv)) {
                    evidence += Math.exp(joint[b]);
                }
            }
            // p(query | evidence) = p(query, evidence) / p(evidence) (common practice)
            assertClose(joint[a] - Math.log(evidence), out[a], "row " + a);
        }
    }

    @Test
    void conditional_continuousWithMissing_equalsDifferenceOfSeparateDensities() throws Exception {
        CompiledCircuit circuit = CompiledCircuit.compile(new CircuitReader().read(PUMP_STATION));
        double[] data = {3.0, 2, 2.1, 0, 2.6, Double.NaN, Double.NaN, 1};
        double[] out = new double[4];
        create(circuit).conditional(data, 4, new boolean[] {false, true}, out);
        double[] all = densities(circuit, data);
        double[] evidence = densities(circuit, new double[] {Double.NaN, 2, Double.NaN, 0, Double.NaN, Double.NaN,
                Double.NaN, 1});
        for (int r = 0; r < 4; r++) {
            // log p(q | e) = log p(q, e) - log p(e), the evidence density computed in a separate call (common practice)
            assertClose(all[r] - evidence[r], out[r], "row " + r);
        }
        // nothing given: the conditional is the density itself
        create(circuit).conditional(data, 4, new boolean[] {false, false}, out);
        for (int r = 0; r < 4; r++) {
            assertClose(all[r], out[r], "row " + r);
        }
    }

    @Test
    void conditional_evidenceOfProbabilityZero_notANumber() {
        TestCircuits t = new TestCircuits().variable("alarm", VariableType.BINARY)
                .variable("inlet_pressure", VariableType.REAL);
        t.output("joint", t.product(t.input(Family.INDICATOR, 0, 1), t.input(Family.NORMAL, 1, 3.1, 0.2)));
        double[] out = new double[2];
        create(t.compile()).conditional(new double[] {0, 3.0, 1, 3.0}, 2, new boolean[] {true, false}, out);
        // p(q | e) is undefined when p(e) = 0 (common practice)
        assertTrue(Double.isNaN(out[0]), "alarm 0 has probability 0");
        // the indicator is certain, so the conditional is the normal density (commons-math3 3.6.1)
        assertClose(new NormalDistribution(null, 3.1, 0.2).logDensity(3.0), out[1], "alarm 1");
    }

    @Test
    void mpe_deterministicCircuit_equalsBruteForceArgmax() {
        Random random = new Random(11);
        TestCircuits t = new TestCircuits()
                .variable("alarm", VariableType.BINARY)
                .variable("valve", VariableType.CATEGORICAL, "closed", "half", "open")
                .variable("restarts", VariableType.COUNT)
                .variable("leak", VariableType.BINARY);
        double[] w = TestCircuits.simplex(random, 2);
        double[][] v = new double[2][];
        double[][] pc = new double[2][3];
        double[][] pd = new double[2][3];
        int[] branches = new int[2];
        for (int a = 0; a < 2; a++) {
            v[a] = TestCircuits.simplex(random, 3);
            int[] kids = new int[3];
            for (int b = 0; b < 3; b++) {
                pc[a][b] = 0.1 + 0.8 * random.nextDouble();
                pd[a][b] = 0.1 + 0.8 * random.nextDouble();
                kids[b] = t.product(t.input(Family.INDICATOR, 1, b), t.input(Family.BINOMIAL, 2, 2, pc[a][b]),
                        t.input(Family.BERNOULLI, 3, pd[a][b]));
            }
            branches[a] = t.product(t.input(Family.INDICATOR, 0, a), t.sum(v[a], kids));
        }
        t.output("joint", t.sum(w, branches));
        CompiledCircuit circuit = t.compile();
        int nv = 4;
        double[] all = TestCircuits.allAssignments();
        int count = all.length / nv;
        // the joint from its factors, with commons-math3 3.6.1 BinomialDistribution masses for the count and
        // the Bernoulli factor (one trial)
        double[] joint = new double[count];
        for (int b = 0; b < count; b++) {
            int a = (int) all[b * nv];
            int s = (int) all[b * nv + 1];
            joint[b] = Math.log(w[a] * v[a][s])
                    + new BinomialDistribution(null, 2, pc[a][s]).logProbability((int) all[b * nv + 2])
                    + new BinomialDistribution(null, 1, pd[a][s]).logProbability((int) all[b * nv + 3]);
        }
        Variant evaluator = create(circuit);
        for (int mask = 0; mask < 1 << nv; mask++) {
            double[] rows = masked(all, mask, nv);
            double[] completed = new double[rows.length];
            double[] logValue = new double[count];
            evaluator.mpe(rows, count, 0, completed, logValue);
            for (int a = 0; a < count; a++) {
                int best = -1;
                for (int b = 0; b < count; b++) {
                    if (agrees(all, a, b, mask, nv) && (best < 0 || joint[b] > joint[best])) {
                        best = b;
                    }
                }
                // the most probable completion by enumeration (common practice)
                assertClose(joint[best], logValue[a], "mask " + mask + " row " + a);
                assertArrayEquals(Arrays.copyOfRange(all, best * nv, best * nv + nv),
                        Arrays.copyOfRange(completed, a * nv, a * nv + nv), "mask " + mask + " row " + a);
            }
        }
    }

    @Test
    void logDensity_deepChainOf100000Nodes_noStackOverflow() {
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL);
        int node = t.input(Family.NORMAL, 0, 3.1, 0.2);
        for (int i = 1; i < 100_000; i++) {
            node = i % 2 == 0 ? t.sum(new double[] {1.0}, node) : t.product(node);
        }
        t.output("joint", node);
        CompiledCircuit circuit = t.compile();
        assertEquals(100_000, circuit.nodeCount());
        double[] out = densities(circuit, new double[] {3.0, 2.5, Double.NaN});
        NormalDistribution reference = new NormalDistribution(null, 3.1, 0.2);
        // commons-math3 3.6.1 NormalDistribution: a chain of unit sums and single products keeps the value
        assertClose(reference.logDensity(3.0), out[0], "x = 3.0");
        assertClose(reference.logDensity(2.5), out[1], "x = 2.5");
        assertEquals(0.0, out[2], "missing");
        double[] completed = new double[1];
        double[] logValue = new double[1];
        create(circuit).mpe(new double[] {Double.NaN}, 1, 0, completed, logValue);
        assertEquals(3.1, completed[0]);
        assertClose(reference.logDensity(3.1), logValue[0], "mode");
    }

    @Test
    void logDensity_batchLargerThanChunk_equalsRowByRow() {
        CompiledCircuit circuit = TestCircuits.randomDiscrete(3, true).compile();
        Random random = new Random(5);
        int rows = 1000;
        double[] data = new double[rows * 4];
        for (int i = 0; i < data.length; i++) {
            int size = TestCircuits.DISCRETE_SIZES[i % 4];
            data[i] = random.nextInt(5) == 0 ? Double.NaN : random.nextInt(size);
        }
        double[] batch = new double[rows];
        Variant evaluator = create(circuit);
        evaluator.logDensity(data, rows, batch);
        double[] one = new double[1];
        for (int r = 0; r < rows; r++) {
            evaluator.logDensity(Arrays.copyOfRange(data, r * 4, r * 4 + 4), 1, one);
            assertEquals(one[0], batch[r], "row " + r);
        }
    }

    @Test
    void logDensity_valuesOutsideSupport_negativeInfinity() {
        double[] out = densities(TestCircuits.randomDiscrete(2, false).compile(), new double[] {
            2, 0, 0, 0, // binary value 2
            0, 3, 0, 0, // state index past the last state
            0, 0, 2.5, 0, // count 2.5
            0, 0, 3, 0, // count above the binomial's trials
            0, 0, -1, 0});
        for (int r = 0; r < out.length; r++) {
            assertEquals(Double.NEGATIVE_INFINITY, out[r], "row " + r);
        }
        double inside = densities(TestCircuits.randomDiscrete(2, false).compile(), new double[] {0, 0, 0, 0})[0];
        assertFalse(Double.isNaN(inside), "a value inside the support is a number");
    }

    /** Rows of {@code all} with variable v set missing where bit v of {@code mask} is set. */
    static double[] masked(double[] all, int mask, int nv) {
        double[] rows = all.clone();
        for (int i = 0; i < rows.length; i++) {
            if ((mask >> (i % nv) & 1) != 0) {
                rows[i] = Double.NaN;
            }
        }
        return rows;
    }

    /** Whether rows a and b of {@code all} agree on every variable not in {@code mask}. */
    static boolean agrees(double[] all, int a, int b, int mask, int nv) {
        for (int v = 0; v < nv; v++) {
            if ((mask >> v & 1) == 0 && all[a * nv + v] != all[b * nv + v]) {
                return false;
            }
        }
        return true;
    }
}
