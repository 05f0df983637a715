package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * A row's log-density is the same double, bit for bit, whatever the batch it is evaluated in (its size,
 * the row's position, the number of threads): every row is summed in one fixed order. Checked on both
 * paths on random region-graph circuits with missing values and values far in the tails, and the fast
 * path also against the generic one there (FORMAT.md's engine tolerance, 1e-12 relative).
 */
class ReproducibilityTest {
    private static final int ROWS = 301;

    @Test
    void logDensity_sameRowAnyBatchPositionOrThreadCount_bitIdentical() {
        for (long seed = 1; seed <= 8; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 6 + (int) (seed % 5), 2 + (int) (seed % 3),
                    2 + (int) (seed % 2), 1 + (int) (seed % 2), 0.3, seed % 2 == 0);
            CompiledCircuit circuit = rc.compile();
            double[] data = withTails(rc.rows(ROWS, 0.15), circuit.variableCount(), seed);
            for (Evaluator.Mode mode : Evaluator.Mode.values()) {
                assertReproducible(circuit, data, mode, "seed " + seed + " " + mode);
            }
        }
    }

    @Test
    void logDensity_tailsAndMissingValues_fastEqualsGeneric() {
        for (long seed = 20; seed < 32; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 5 + (int) (seed % 6), 2 + (int) (seed % 4),
                    1 + (int) (seed % 3), 1, 0.3, seed % 3 == 0);
            CompiledCircuit circuit = rc.compile();
            DenseBlockAgreementTest.assertAgree(circuit, withTails(rc.rows(200, 0.2), circuit.variableCount(), seed),
                    "tails seed " + seed);
        }
    }

    /**
     * Puts values far in the tails into a third of the rows' real cells (every third variable is real in
     * {@link RandomCircuits}): large enough that z^2 of a normal overflows, or the density underflows far
     * below the smallest double.
     */
    static double[] withTails(double[] data, int nv, long seed) {
        double[] tails = {40, -55, 1e5, -3e7, 1e154, -1e200, 1e300, Double.MAX_VALUE, -1e-300, 6e-310};
        Random random = new Random(seed);
        for (int r = 0; r < data.length / nv; r += 3) {
            for (int v = 0; v < nv; v += 3) {
                if (!Double.isNaN(data[r * nv + v]) && random.nextBoolean()) {
                    data[r * nv + v] = tails[random.nextInt(tails.length)];
                }
            }
        }
        return data;
    }

    private static void assertReproducible(CompiledCircuit circuit, double[] data, Evaluator.Mode mode, String what) {
        int nv = circuit.variableCount();
        int outs = circuit.outputCount();
        int rows = data.length / nv;
        double[] alone = new double[rows * outs];
        Evaluator single = new Evaluator(circuit, mode);
        double[] one = new double[outs];
        for (int r = 0; r < rows; r++) {
            single.logDensity(java.util.Arrays.copyOfRange(data, r * nv, (r + 1) * nv), 1, one);
            System.arraycopy(one, 0, alone, r * outs, outs);
        }
        int finite = 0;
        for (double v : alone) {
            finite += Double.isFinite(v) ? 1 : 0;
        }
        assertTrue(finite > rows / 2, what + ": most values finite");
        // the whole batch at once on 1, 2 and 3 threads
        for (int threads = 1; threads <= 3; threads++) {
            double[] out = new double[rows * outs];
            try (BatchRunner runner = new BatchRunner(circuit, threads, mode)) {
                runner.logDensity(data, rows, out);
            }
            assertBits(alone, 0, out, 0, rows * outs, what + ", whole batch on " + threads + " threads");
        }
        // rotated by 37 rows, in batches of 1, 7, 64, 256, 1000 rows: every row at a different position
        int shift = 37;
        double[] rotated = new double[data.length];
        for (int r = 0; r < rows; r++) {
            System.arraycopy(data, r * nv, rotated, ((r + shift) % rows) * nv, nv);
        }
        for (int batch : new int[] {1, 7, 64, 256, 1000}) {
            Evaluator e = new Evaluator(circuit, mode);
            double[] out = new double[rows * outs];
            for (int r0 = 0; r0 < rows; r0 += batch) {
                int n = Math.min(batch, rows - r0);
                double[] part = new double[n * outs];
                e.logDensity(java.util.Arrays.copyOfRange(rotated, r0 * nv, (r0 + n) * nv), n, part);
                System.arraycopy(part, 0, out, r0 * outs, n * outs);
            }
            for (int r = 0; r < rows; r++) {
                assertBits(alone, r * outs, out, ((r + shift) % rows) * outs, outs, what + ", batch " + batch + ", row " + r);
            }
        }
    }

    private static void assertBits(double[] expected, int eo, double[] actual, int ao, int n, String what) {
        for (int i = 0; i < n; i++) {
            assertEquals(Double.doubleToRawLongBits(expected[eo + i]), Double.doubleToRawLongBits(actual[ao + i]),
                    () -> what + ": " + expected[eo] + " vs " + actual[ao]);
        }
    }
}
