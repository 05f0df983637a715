package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The region-by-region evaluation in blocks of rows ({@link RegionTensorEvaluator}) against the
 * evaluation one point at a time that it replaced ({@link PerPointTensorEvaluation}), on sampled points,
 * the same points with cells missing, points far in the tails (where the scaled sums underflow and the
 * exact log-sum-exp takes over), values outside the supports and the all-missing row.
 */
class BlockEvaluationTest {
    /** Relative agreement asked of the two evaluations (issue 14). */
    private static final double REL = 1e-12;

    private static List<RegionParameters> cases() throws Exception {
        return List.of(
                RegionParameters.fromArchive(RegionStructure.of(RegionCompilerTest.example()), RegionCompilerTest.k3i2c1(),
                        RegionCompilerTest.exampleParams()),
                RegionParameters.seeded(RegionStructure.of(RegionCompilerTest.mixedGraph()), new CompileOptions(3, 2, 2,
                        Map.of(VariableType.REAL, Family.GAMMA, VariableType.COUNT, Family.BINOMIAL)), 4),
                RegionParameters.seeded(RegionStructure.of(RegionCompilerTest.mixedGraph()), new CompileOptions(4, 3, 1,
                        Map.of()), 9),
                RegionParameters.seeded(RegionStructure.of(GridRegions.generate(3, 4)), new CompileOptions(3, 3, 1, Map.of()), 5),
                RegionParameters.seeded(RegionStructure.of(RandomRegions.generate(RandomRegions.realVariables(12), 3, 4, 6)),
                        new CompileOptions(4, 5, 3, Map.of(VariableType.REAL, Family.LOGNORMAL)), 6),
                RegionParameters.seeded(RegionStructure.of(RandomRegions.generate(RandomRegions.realVariables(9), 2, 2, 8)),
                        new CompileOptions(6, 4, 2, Map.of()), 7));
    }

    /** 800 rows: 200 drawn, the same with half the cells missing, 200 in the far tails, 200 at random (some outside the supports). */
    private static double[] rows(RegionParameters p, long seed) {
        int nv = p.structure().variables().size();
        int n = 200;
        double[] data = new double[4 * n * nv + nv];
        RegionSampler sampler = new RegionSampler(p, seed);
        SplitMix64 rng = new SplitMix64(seed * 31 + 1);
        for (int i = 0; i < n; i++) {
            sampler.sample(i % p.options().outputs(), data, i);
        }
        for (int i = 0; i < n * nv; i++) {
            data[n * nv + i] = rng.nextDouble() < 0.5 ? Double.NaN : data[i];
            double far = data[i] * (1 + 40 * rng.nextDouble()) + 30 * rng.nextDouble();
            Variable v = p.structure().variables().get(i % nv);
            data[2 * n * nv + i] = v.type() == VariableType.REAL ? far : data[i];
        }
        for (int i = 0; i < n; i++) {
            for (int v = 0; v < nv; v++) {
                Variable var = p.structure().variables().get(v);
                double x = switch (var.type()) {
                    case REAL -> rng.uniform(-4, 16);
                    case COUNT -> rng.nextInt(21);
                    case BINARY, CATEGORICAL -> rng.nextInt(var.stateCount() + 1);
                };
                data[(3 * n + i) * nv + v] = rng.nextDouble() < 0.3 ? Double.NaN : x;
            }
        }
        java.util.Arrays.fill(data, 4 * n * nv, data.length, Double.NaN);
        return data;
    }

    @Test
    void blocks_equalPerPointEvaluation_withMissingAndTailValues() throws Exception {
        int tails = 0;
        for (RegionParameters p : cases()) {
            int nv = p.structure().variables().size();
            double[] data = rows(p, 17);
            int rows = data.length / nv;
            int co = p.options().outputs();
            double[] want = new double[rows * co];
            PerPointTensorEvaluation old = new PerPointTensorEvaluation(p);
            for (int r = 0; r < rows; r++) {
                double[] one = new double[co];
                old.logDensity(java.util.Arrays.copyOfRange(data, r * nv, (r + 1) * nv), 1, one);
                System.arraycopy(one, 0, want, r * co, co);
            }
            double[] got = new double[rows * co];
            new RegionTensorEvaluator(p).logDensity(data, rows, got);
            for (int i = 0; i < want.length; i++) {
                assertClose(want[i], got[i], "row " + i / co + " output " + i % co);
                if (want[i] < -1e4) {
                    tails++;
                }
            }
        }
        assertTrue(tails > 0, "some rows reach the underflow fallback");
    }

    @Test
    void blocks_sameBitsWhateverTheBatchPositionAndThreads() throws Exception {
        // a fixed summation order per row: a row's value alone, inside any batch and on any number of threads is one double
        for (RegionParameters p : cases()) {
            int nv = p.structure().variables().size();
            double[] data = rows(p, 23);
            int rows = data.length / nv;
            int co = p.options().outputs();
            RegionTensorEvaluator e = new RegionTensorEvaluator(p);
            double[] whole = new double[rows * co];
            e.logDensity(data, rows, whole);
            double[] threaded = new double[rows * co];
            e.logDensity(data, rows, threaded, 3);
            double[] shifted = new double[(rows - 5) * co];
            e.sharing().logDensity(java.util.Arrays.copyOfRange(data, 5 * nv, data.length), rows - 5, shifted);
            for (int r = 0; r < rows; r += 37) {
                double[] alone = new double[co];
                e.logDensity(java.util.Arrays.copyOfRange(data, r * nv, (r + 1) * nv), 1, alone);
                for (int o = 0; o < co; o++) {
                    assertEquals(Double.doubleToLongBits(whole[r * co + o]), Double.doubleToLongBits(alone[o]));
                }
            }
            for (int i = 0; i < whole.length; i++) {
                assertEquals(Double.doubleToLongBits(whole[i]), Double.doubleToLongBits(threaded[i]));
                if (i >= 5 * co) {
                    assertEquals(Double.doubleToLongBits(whole[i]), Double.doubleToLongBits(shifted[i - 5 * co]));
                }
            }
        }
    }

    private static void assertClose(double want, double got, String where) {
        if (Double.isInfinite(want) || Double.isNaN(want)) {
            assertEquals(want, got, where);
            return;
        }
        // relative, plus 4 ulps of 1: where the true value is 0 (every variable missing, weights summing to 1) each
        // evaluation rounds its log of a sum near 1 on its own, to within an ulp or two of 0 (the linear blocks give 0,
        // the per-point evaluation -4.4e-16 there), which no relative bound covers
        assertTrue(Math.abs(got - want) <= REL * Math.abs(want) + 4 * Math.ulp(1.0), where + ": blocks " + got + ", per point "
                + want);
    }
}
