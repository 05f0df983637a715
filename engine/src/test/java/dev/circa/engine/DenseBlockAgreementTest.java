package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * The dense-block path against the generic path on random circuits. The generic path is the reference: it
 * is itself checked against commons-math3 densities, handbook tables and brute-force sums in
 * {@link EvaluatorContractTest}. Agreement is FORMAT.md's rule with the engine tolerance:
 * |dense - generic| <= 1e-12 max(1, |generic|), -inf and NaN exactly.
 */
class DenseBlockAgreementTest {
    private static final int ROWS = 150;

    @Test
    void logDensity_randomRegionGraphs_denseEqualsGeneric() {
        for (long seed = 1; seed <= 24; seed++) {
            int k = 1 + (int) (seed % 5);
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 4 + (int) (seed % 7), k, 1 + (int) (seed % 4),
                    1 + (int) (seed % 3), 0.3, false);
            CompiledCircuit circuit = rc.compile();
            assertAgree(circuit, rc.rows(ROWS, 0.2), "region graph seed " + seed);
        }
    }

    @Test
    void logDensity_regionGraphsWithZeroTinyAndShiftedWeights_denseEqualsGeneric() {
        for (long seed = 100; seed < 124; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 5 + (int) (seed % 6), 2 + (int) (seed % 4),
                    2 + (int) (seed % 3), 1, 0.4, true);
            assertAgree(rc.compile(), rc.rows(ROWS, 0.25), "extreme weights seed " + seed);
        }
    }

    @Test
    void logDensity_randomUnstructuredCircuits_denseEqualsGeneric() {
        for (long seed = 200; seed < 220; seed++) {
            RandomCircuits rc = RandomCircuits.unstructured(seed, 5, 12, 150, seed % 2 == 0);
            assertAgree(rc.compile(), rc.rows(ROWS, 0.2), "unstructured seed " + seed);
        }
    }

    @Test
    void logDensity_regionGraphsWithSharedProductsAndExtraSums_denseEqualsGeneric() {
        for (long seed = 300; seed < 320; seed++) {
            RandomCircuits rc = RandomCircuits.mixed(seed, 5 + (int) (seed % 5), 2 + (int) (seed % 3),
                    2 + (int) (seed % 2));
            assertAgree(rc.compile(), rc.rows(ROWS, 0.2), "mixed seed " + seed);
        }
    }

    @Test
    void logDensity_weightsBelowDoubleRangeWhereProductsAreLarge_exactFallbackAgrees() {
        TestCircuits t = new TestCircuits();
        for (int v = 0; v < 2; v++) {
            t.variable("valve_" + v, VariableType.CATEGORICAL, "closed", "half", "open", "shut");
        }
        int[][] parts = new int[2][4];
        for (int v = 0; v < 2; v++) {
            for (int s = 0; s < 4; s++) {
                parts[v][s] = s == 0 ? t.input(Family.INDICATOR, v, 0)
                        : t.input(Family.CATEGORICAL, v, 0.1, 0.2, 0.3, 0.4);
            }
        }
        int[] products = new int[16];
        for (int a = 0; a < 4; a++) {
            for (int b = 0; b < 4; b++) {
                products[a * 4 + b] = t.product(parts[0][a], parts[1][b]);
            }
        }
        // the largest weight sits on the product of the two indicators; every other weight is exp(-740),
        // below the normal double range once scaled by the largest
        double[] lw = new double[16];
        Arrays.fill(lw, -740);
        lw[0] = 0;
        int s0 = t.logSum(lw, products);
        double[] lw2 = lw.clone();
        lw2[5] = 3;
        int s1 = t.logSum(lw2, products);
        t.output("joint", s0).output("other", s1);
        CompiledCircuit circuit = t.compile();
        assertEquals(1, circuit.denseBlockSummary().blocks(), "one block of two sums");
        // rows where the indicators' states do not occur (value 3) leave only the exp(-740) terms
        assertAgree(circuit, new double[] {3, 3, 0, 0, 3, 0, 0, 3, 2, 1, Double.NaN, 3}, "tiny weights");
        double[] out = new double[12];
        new Evaluator(circuit).logDensity(new double[] {3, 3, 0, 0, 3, 0, 0, 3, 2, 1, Double.NaN, 3}, 6, out);
        // by hand: at valve 3 the indicators are 0, leaving 9 products of two categoricals, 0.4 * 0.4 each,
        // under weight exp(-740) (common practice)
        Tolerances.assertClose(-740 + Math.log(9 * 0.4 * 0.4), out[0], "row 0");
        assertTrue(out[0] > -745, "not lost to underflow");
    }

    @Test
    void logDensity_partsZeroAtTheEdgeOfTheSupport_denseEqualsGeneric() {
        // a gamma input's support is open, (0, inf) (FORMAT.md), so it is 0 (log -inf) at 0 although its density
        // grows without bound towards 0 for shape < 1, while an exponential's support includes 0: at 0 a part holds
        // -inf nodes beside finite ones. (No valid parameters give a +inf log-density, so no NaN part arises.)
        // Both paths must give the same numbers (common practice: IEEE 754 rules)
        TestCircuits t = new TestCircuits().variable("motor_current", VariableType.REAL)
                .variable("alarm", VariableType.BINARY);
        int[] a = new int[4];
        int[] b = new int[4];
        for (int j = 0; j < 4; j++) {
            a[j] = j % 2 == 0 ? t.input(Family.GAMMA, 0, 0.5, 1 + j) : t.input(Family.EXPONENTIAL, 0, 1 + j);
            b[j] = j == 0 ? t.input(Family.INDICATOR, 1, 1) : t.input(Family.BERNOULLI, 1, 0.2 * j);
        }
        int[] products = new int[16];
        for (int i = 0; i < 16; i++) {
            products[i] = t.product(a[i / 4], b[i % 4]);
        }
        double[] w = new double[16];
        Arrays.fill(w, 1.0 / 16);
        int s0 = t.sum(w, products);
        w[3] = 0;
        int s1 = t.sum(w, products);
        t.output("joint", s0).output("other", s1).output("mix", t.sum(new double[] {0.5, 0.5}, s0, s1));
        CompiledCircuit circuit = t.compile();
        assertEquals(1, circuit.denseBlockSummary().blocks(), "one block");
        assertAgree(circuit, new double[] {0, 0, 0, 1, 0.5, 0, 0.5, 1, Double.NaN, 0, 0, Double.NaN}, "zero at the support's edge");
    }

    @Test
    void logDensity_partNodesZeroOrLargestLate_denseEqualsGenericAndAloneEqualsBatch() {
        // part nodes that are products of inputs, each 0 (log -inf) outside its inputs' supports: at some rows
        // the first node is 0 and the largest comes last, at others every node of the part is 0; rows of every
        // kind fill the chunks of the several-row block kernel and go one by one through the one-row kernel
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL)
                .variable("outlet_pressure", VariableType.REAL).variable("flow", VariableType.REAL);
        int[] a = {
            t.product(t.input(Family.NORMAL, 0, 0.5, 1), t.input(Family.EXPONENTIAL, 1, 0.5)),
            t.product(t.input(Family.GAMMA, 0, 0.5, 1), t.input(Family.EXPONENTIAL, 1, 1)),
            t.product(t.input(Family.NORMAL, 0, -1, 1), t.input(Family.EXPONENTIAL, 1, 2)),
            t.product(t.input(Family.GAMMA, 0, 0.5, 2), t.input(Family.NORMAL, 1, 1, 1))};
        int[] b = new int[3];
        for (int j = 0; j < 3; j++) {
            b[j] = t.input(Family.NORMAL, 2, j - 1.0, 0.5 + j);
        }
        int[] products = new int[12];
        for (int i = 0; i < 12; i++) {
            products[i] = t.product(a[i / 3], b[i % 3]);
        }
        double[] w = new double[12];
        Arrays.fill(w, 1.0 / 12);
        int s0 = t.sum(w, products);
        double[] w1 = new double[12];
        for (int i = 0; i < 12; i++) {
            w1[i] = (i + 1) / 78.0;
        }
        int s1 = t.sum(w1, products);
        t.output("joint", s0).output("other", s1);
        CompiledCircuit circuit = t.compile();
        assertEquals(1, circuit.denseBlockSummary().blocks(), "one block");
        double[][] kinds = {{0, -1, 0.3}, {0, 1, 0.3}, {1, -1, 0.3}, {2, 0.5, Double.NaN}, {Double.NaN, -1, 1},
            {0, Double.NaN, -2}, {-1, -1, 0}, {1e300, 3, 1e-300}};
        int rows = 300;
        double[] data = new double[rows * 3];
        for (int r = 0; r < rows; r++) {
            System.arraycopy(kinds[(r * 7) % kinds.length], 0, data, r * 3, 3);
        }
        assertAgree(circuit, data, "part nodes 0 or largest late");
        double[] out = new double[rows * circuit.outputCount()];
        new Evaluator(circuit).logDensity(data, rows, out);
        // (0, -1, 0.3): a gamma density is 0 at 0 and an exponential below 0, so every node of the first part is
        // 0 and so is every product (common practice: a density is 0 outside its support)
        assertEquals(Double.NEGATIVE_INFINITY, out[0], "every product 0");
        // row 6 is (1, -1, 0.3)
        assertTrue(Double.isFinite(out[6 * circuit.outputCount()]), "(1, -1, 0.3): only the last node of the part is not 0");
    }

    @Test
    void logDensity_everyCellMissingOrOutsideSupport_denseEqualsGeneric() {
        RandomCircuits rc = RandomCircuits.regionGraph(400, 9, 4, 3, 2, 0.3, true);
        CompiledCircuit circuit = rc.compile();
        double[] data = new double[3 * 9];
        Arrays.fill(data, 0, 9, Double.NaN);
        Arrays.fill(data, 9, 18, 7);
        for (int v = 0; v < 9; v++) {
            data[18 + v] = v % 3 == 0 ? 1.0 : 7;
        }
        assertAgree(circuit, data, "missing and outside support");
        double[] out = new double[3 * circuit.outputCount()];
        new Evaluator(circuit).logDensity(data, 3, out);
        // a discrete value outside every input's support makes every term 0 (common practice)
        assertEquals(Double.NEGATIVE_INFINITY, out[circuit.outputCount()], "all cells outside the support");
    }

    @Test
    void conditionalAndLogPartition_randomRegionGraphs_denseEqualsGeneric() {
        for (long seed = 500; seed < 510; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 7, 3, 2, 2, 0.3, seed % 2 == 0);
            CompiledCircuit circuit = rc.compile();
            double[] data = rc.rows(ROWS, 0.1);
            boolean[] given = new boolean[7];
            for (int v = 0; v < 7; v += 2) {
                given[v] = true;
            }
            int size = ROWS * circuit.outputCount();
            double[] generic = new double[size];
            double[] dense = new double[size];
            new Evaluator(circuit, Evaluator.Mode.GENERIC).conditional(data, ROWS, given, generic);
            Evaluator automatic = new Evaluator(circuit);
            assertTrue(automatic.usesDenseBlocks(), "seed " + seed + " has dense blocks");
            automatic.conditional(data, ROWS, given, dense);
            for (int i = 0; i < size; i++) {
                Tolerances.assertClose(generic[i], dense[i], "conditional seed " + seed + " entry " + i);
            }
            double[] z = new Evaluator(circuit, Evaluator.Mode.GENERIC).logPartition();
            double[] zd = automatic.logPartition();
            for (int o = 0; o < z.length; o++) {
                Tolerances.assertClose(z[o], zd[o], "log Z seed " + seed + " output " + o);
            }
        }
    }

    /**
     * Automatic and forced dense paths both agree with the generic one on every row and output, and give
     * the same bits for each row evaluated alone (the one-row kernels) as in the whole batch.
     */
    static void assertAgree(CompiledCircuit circuit, double[] data, String what) {
        int nv = circuit.variableCount();
        int outs = circuit.outputCount();
        int rows = data.length / nv;
        int size = rows * outs;
        double[] generic = new double[size];
        new Evaluator(circuit, Evaluator.Mode.GENERIC).logDensity(data, rows, generic);
        Evaluator[] variants = {new Evaluator(circuit), Evaluator.everyCandidateBlock(circuit)};
        int finite = 0;
        for (Evaluator e : variants) {
            double[] out = new double[size];
            e.logDensity(data, rows, out);
            double[] one = new double[outs];
            for (int r = 0; r < rows; r++) {
                e.logDensity(Arrays.copyOfRange(data, r * nv, (r + 1) * nv), 1, one);
                for (int o = 0; o < outs; o++) {
                    assertEquals(Double.doubleToRawLongBits(out[r * outs + o]), Double.doubleToRawLongBits(one[o]),
                            what + " row " + r + " alone, output " + o + ": " + out[r * outs + o] + " vs " + one[o]);
                }
            }
            for (int i = 0; i < size; i++) {
                Tolerances.assertClose(generic[i], out[i], what + " entry " + i + (e.usesDenseBlocks() ? " (dense)" : ""));
                if (Double.isFinite(generic[i])) {
                    finite++;
                }
            }
        }
        assertTrue(finite > 0, what + ": some values are finite");
    }
}
