package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.internal.DenseBlocks;
import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.Arrays;
import java.util.Random;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * Dense blocks that hold their sums in linear form for the blocks reading them (mantissas and a log offset per
 * row, no exponential in the reader and no logarithm in the block), and fall back to log-values at the rows
 * that form cannot hold. References: the generic path (itself checked against commons-math3 and brute-force
 * sums in {@link EvaluatorContractTest}), and, on the hand-built chain below, commons-math3 3.6.1's normal
 * log-densities combined by a log-sum-exp written here over the circuit's known structure. Agreement is
 * FORMAT.md's engine tolerance, |a - b| <= 1e-12 max(1, |b|), -inf exactly.
 */
class LinearBlockTest {
    /** Inputs per variable: normals at these means, sd 1 (40 is about 800 nats from 0 at x = 0). */
    private static final double[] MEANS = {-2, 0, 3, 40};
    private static final int K = 4;
    private static final String[] NAMES = {"inlet_pressure", "outlet_pressure", "flow", "motor_current",
        "vibration", "bearing_temperature"};

    /**
     * Three blocks over pairs of variables (A: 0-1, B: 2-3, C: 4-5), each K = 4 sums over the 16 products of
     * their inputs; P, K sums over the 16 products of A's and B's sums; Q, K sums over the products of P's
     * and C's sums, the outputs. A, B, C and P are read only as parts of another block (linear form); Q is
     * read as outputs (log-values).
     */
    private static final class Chain {
        final TestCircuits t = new TestCircuits();
        /** Per block A, B, C, P, Q: its K sums' log-weights over its 16 products. */
        final double[][][] logWeights = new double[5][K][16];
        final int[][] sums = new int[5][];

        Chain() {
            for (String name : NAMES) {
                t.variable(name, VariableType.REAL);
            }
            int[][] inputs = new int[NAMES.length][MEANS.length];
            for (int v = 0; v < NAMES.length; v++) {
                for (int i = 0; i < MEANS.length; i++) {
                    inputs[v][i] = t.input(Family.NORMAL, v, MEANS[i], 1);
                }
            }
            Random random = new Random(11);
            for (int b = 0; b < 5; b++) {
                for (int k = 0; k < K; k++) {
                    double[] w = TestCircuits.simplex(random, 16);
                    for (int j = 0; j < 16; j++) {
                        logWeights[b][k][j] = Math.log(w[j]);
                    }
                }
            }
            for (int b = 0; b < 5; b++) {
                // sum 1: zero weights on every product but the last, the one of the two inputs at mean 40 (at
                // rows near 0 the sum is about e^-1600 of the others: no linear form, the exact way)
                Arrays.fill(logWeights[b][1], Double.NEGATIVE_INFINITY);
                logWeights[b][1][15] = 0;
                // sum 2: every weight times e^-200, so its mantissa is about 1e-87 of the largest
                for (int j = 0; j < 16; j++) {
                    logWeights[b][2][j] -= 200;
                }
                // sum 3: zero weight on the largest products at rows near 0 (inputs at means 0 and 3)
                for (int j : new int[] {5, 6, 9, 10}) {
                    logWeights[b][3][j] = Double.NEGATIVE_INFINITY;
                }
            }
            sums[0] = block(logWeights[0], inputs[0], inputs[1]);
            sums[1] = block(logWeights[1], inputs[2], inputs[3]);
            sums[2] = block(logWeights[2], inputs[4], inputs[5]);
            sums[3] = block(logWeights[3], sums[0], sums[1]);
            sums[4] = block(logWeights[4], sums[3], sums[2]);
            for (int k = 0; k < K; k++) {
                t.output("q" + k, sums[4][k]);
            }
        }

        private int[] block(double[][] lw, int[] left, int[] right) {
            int[] products = new int[16];
            for (int j = 0; j < 16; j++) {
                products[j] = t.product(left[j / 4], right[j % 4]);
            }
            int[] out = new int[K];
            for (int k = 0; k < K; k++) {
                out[k] = t.logSum(lw[k], products);
            }
            return out;
        }

        /** The outputs at one row, by commons-math3 densities and a log-sum-exp over the structure. */
        double[] reference(double[] x) {
            double[][] leaf = new double[NAMES.length][MEANS.length];
            for (int v = 0; v < NAMES.length; v++) {
                for (int i = 0; i < MEANS.length; i++) {
                    // a missing value is marginalised: the input's value is 1 (FORMAT.md)
                    leaf[v][i] = Double.isNaN(x[v]) ? 0 : new NormalDistribution(null, MEANS[i], 1).logDensity(x[v]);
                }
            }
            double[] a = sums(logWeights[0], leaf[0], leaf[1]);
            double[] b = sums(logWeights[1], leaf[2], leaf[3]);
            double[] c = sums(logWeights[2], leaf[4], leaf[5]);
            return sums(logWeights[4], sums(logWeights[3], a, b), c);
        }

        /** log sum_j w_kj e^(left[j/4] + right[j%4]) per k, the largest term taken out (common practice). */
        private static double[] sums(double[][] lw, double[] left, double[] right) {
            double[] out = new double[K];
            for (int k = 0; k < K; k++) {
                double[] terms = new double[16];
                double max = Double.NEGATIVE_INFINITY;
                for (int j = 0; j < 16; j++) {
                    terms[j] = lw[k][j] + left[j / 4] + right[j % 4];
                    max = Math.max(max, terms[j]);
                }
                if (max == Double.NEGATIVE_INFINITY) {
                    out[k] = max;
                    continue;
                }
                double s = 0;
                for (double term : terms) {
                    s += term == Double.NEGATIVE_INFINITY ? 0 : Math.exp(term - max);
                }
                out[k] = max + Math.log(s);
            }
            return out;
        }
    }

    /** Rows of every kind: near the means, far in the tails, missing, infinite, by variable. */
    private static double[] rows(int n, long seed) {
        Random random = new Random(seed);
        double[] data = new double[n * NAMES.length];
        for (int r = 0; r < n; r++) {
            for (int v = 0; v < NAMES.length; v++) {
                double x;
                switch ((r + v * (r / 7)) % 9) {
                    case 0, 1, 2 -> x = random.nextGaussian() * 2;
                    case 3 -> x = 40 + random.nextGaussian();
                    case 4 -> x = (random.nextBoolean() ? 1 : -1) * (380 + 40 * random.nextDouble());
                    case 5 -> x = Double.NaN;
                    case 6 -> x = 20 + random.nextGaussian();
                    case 7 -> x = r % 5 == 0 ? Double.POSITIVE_INFINITY : 3 + random.nextGaussian();
                    default -> x = r % 3 == 0 ? -1e200 : -2 + random.nextGaussian();
                }
                data[r * NAMES.length + v] = x;
            }
        }
        // one row every cell 400 from the means (log-density about -3e5 and below), one all missing
        Arrays.fill(data, 0, NAMES.length, 400);
        Arrays.fill(data, NAMES.length, 2 * NAMES.length, Double.NaN);
        return data;
    }

    @Test
    void denseBlocks_chainOfBlocks_innerBlocksHeldLinearOutputsNot() {
        Chain chain = new Chain();
        CompiledCircuit circuit = chain.t.compile();
        DenseBlocks blocks = circuit.denseBlocks();
        assertEquals(5, blocks.blockCount(), "five blocks");
        for (int b = 0; b < 5; b++) {
            int first = circuit.nodeIndexOfId(chain.sums[b][0]);
            int block = blocks.blockAt[first];
            if (b < 4) {
                assertTrue(blocks.offsetSlot[block] >= 0, "block " + b + " is read only as parts: linear");
            } else {
                assertEquals(-1, blocks.offsetSlot[block], "the outputs' block holds log-values");
            }
        }
    }

    @Test
    void logDensity_chainWithTailsZeroWeightsAndFarApartSums_equalsCommonsMathAndGeneric() {
        Chain chain = new Chain();
        CompiledCircuit circuit = chain.t.compile();
        double[] data = rows(600, 3);
        int nv = NAMES.length;
        int rows = data.length / nv;
        double[] out = new double[rows * K];
        new Evaluator(circuit).logDensity(data, rows, out);
        int finite = 0;
        boolean deep = false;
        for (int r = 0; r < rows; r++) {
            double[] expected = chain.reference(Arrays.copyOfRange(data, r * nv, (r + 1) * nv));
            for (int k = 0; k < K; k++) {
                Tolerances.assertClose(expected[k], out[r * K + k], "row " + r + " output " + k + " (commons-math3)");
                finite += Double.isFinite(expected[k]) ? 1 : 0;
                deep |= expected[k] < -3e5;
            }
        }
        assertTrue(finite > rows * K / 2, "most values finite");
        assertTrue(deep, "some rows at -3e5 and below, far below the double range in linear space");
        // the generic path, and each row alone against the batch, bit for bit
        DenseBlockAgreementTest.assertAgree(circuit, data, "chain of linear blocks");
    }

    @Test
    void logDensity_regionGraphsWithLinearBlocks_sameBitsOnAnyThreadCountAndEqualToGeneric() {
        for (long seed = 40; seed < 52; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 9 + (int) (seed % 4), 2 + (int) (seed % 4),
                    2 + (int) (seed % 3), 1 + (int) (seed % 2), 0.4, seed % 2 == 0);
            CompiledCircuit circuit = rc.compile();
            DenseBlocks blocks = circuit.denseBlocks();
            int linear = 0;
            for (int b = 0; b < blocks.blockCount(); b++) {
                linear += blocks.offsetSlot[b] >= 0 ? 1 : 0;
            }
            // (with extreme weights, a block whose sums' largest weights lie more than 1e100 apart holds log-values)
            assertTrue(linear > 0 || seed % 2 == 0, "seed " + seed + ": some blocks held linear");
            double[] data = ReproducibilityTest.withTails(rc.rows(300, 0.2), circuit.variableCount(), seed);
            DenseBlockAgreementTest.assertAgree(circuit, data, "region graph seed " + seed);
            int size = 300 * circuit.outputCount();
            double[] serial = new double[size];
            new Evaluator(circuit).logDensity(data, 300, serial);
            for (int threads = 2; threads <= 3; threads++) {
                double[] parallel = new double[size];
                try (BatchRunner runner = new BatchRunner(circuit, threads)) {
                    runner.logDensity(data, 300, parallel);
                }
                for (int i = 0; i < size; i++) {
                    assertEquals(Double.doubleToRawLongBits(serial[i]), Double.doubleToRawLongBits(parallel[i]),
                            "seed " + seed + " entry " + i + " on " + threads + " threads");
                }
            }
        }
    }
}
