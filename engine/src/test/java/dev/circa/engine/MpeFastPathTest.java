package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * The most probable explanation on the automatic path (products of inputs evaluated without storing the
 * inputs) equals the generic path's: the same completed rows and the same max-product values, bit for bit,
 * on random region-graph circuits with missing cells and values far in the tails. The generic path is
 * checked against brute force in {@link EvaluatorContractTest}.
 */
class MpeFastPathTest {
    @Test
    void mpe_randomRegionGraphs_automaticEqualsGeneric() {
        int checked = 0;
        for (long seed = 60; seed < 72; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 5 + (int) (seed % 6), 2 + (int) (seed % 3),
                    1 + (int) (seed % 3), 1, 0.3, seed % 2 == 0);
            CompiledCircuit circuit = rc.compile();
            int nv = circuit.variableCount();
            int rows = 120;
            double[] data = ReproducibilityTest.withTails(rc.rows(rows, 0.4), nv, seed);
            double[] completedGeneric = new double[rows * nv];
            double[] valueGeneric = new double[rows];
            new Evaluator(circuit, Evaluator.Mode.GENERIC).mpe(data, rows, 0, completedGeneric, valueGeneric);
            Evaluator fast = new Evaluator(circuit);
            double[] completed = new double[rows * nv];
            double[] value = new double[rows];
            fast.mpe(data, rows, 0, completed, value);
            assertArrayEquals(completedGeneric, completed, "completed rows, seed " + seed);
            assertArrayEquals(valueGeneric, value, "max-product values, seed " + seed);
            checked += fast.usesDenseBlocks() ? 1 : 0;
        }
        assertTrue(checked > 6, "most circuits take the automatic path");
    }

    @Test
    void mpe_tiedChildren_firstOfTheLargestTakenOnBothPaths() throws Exception {
        // Two normal components of equal weight and spread have equal modes: the first child of the sum is
        // taken (the rule Evaluator#mpe states: the first of the largest, in the sum's order; common practice);
        // with unequal weights the heavier one. Every row missing, in a batch of 5.
        String json = """
                {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "flow", "type": "real"}],
                 "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 2.0, "sd": 0.5},
                           {"id": 1, "input": "normal", "var": 0, "mean": 7.0, "sd": 0.5},
                           {"id": 2, "sum": [0, 1], "weights": [0.5, 0.5]},
                           {"id": 3, "sum": [1, 0], "weights": [0.5, 0.5]},
                           {"id": 4, "sum": [0, 1], "weights": [0.4, 0.6]}],
                 "outputs": [{"name": "a", "node": 2}, {"name": "b", "node": 3}, {"name": "c", "node": 4}]}""";
        CompiledCircuit circuit = CompiledCircuit.compile(new dev.circa.format.io.CircuitReader().readString(json, "tie.json"));
        double[] data = {Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN};
        double[] expected = {2.0, 7.0, 7.0};
        for (Evaluator.Mode mode : Evaluator.Mode.values()) {
            for (int output = 0; output < 3; output++) {
                double[] completed = new double[5];
                double[] value = new double[5];
                new Evaluator(circuit, mode).mpe(data, 5, output, completed, value);
                double[] want = new double[5];
                java.util.Arrays.fill(want, expected[output]);
                assertArrayEquals(want, completed, mode + " output " + output);
            }
        }
    }
}
