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
}
