package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.npz.NpyArray;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.Family;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * The linear evaluation of {@link RegionTensorEvaluator} (values times a power of two per row) where it is
 * easiest to break: rows far in the tails (exponents past -10^4 and +10^3), a region whose values at a row differ
 * by more than 2^1074, zero weights on the largest products, a partition 2^-1050 and 2^-2900 below the other,
 * missing cells and cells outside the supports (-inf). The reference is the log-domain evaluation written
 * in the tests, one row at a time ({@link PerPointTensorEvaluation}), to 1e-12 relative; where the value has a
 * closed form, also commons-math3's normal log-density. Which rows the linear evaluation leaves to the log
 * domain is checked too ({@link RegionTensorEvaluator#logDomainRows}): the tails must not need it.
 */
class LinearEvaluationTest {
    private static final double REL = 1e-12;
    private static final int K = 2;
    private static final int I = 2;

    /**
     * Four real variables; the root {0,1,2,3} split two ways, {0,1} x {2,3} and {0,2} x {1,3}, each of those
     * into single-variable leaves: inner regions with sums below the root, and a root with two partitions.
     */
    private static RegionGraph graph() {
        List<Variable> vars = List.of(Variable.of("inlet_pressure", VariableType.REAL), Variable.of("outlet_pressure", VariableType.REAL),
                Variable.of("motor_current", VariableType.REAL), Variable.of("flow_rate", VariableType.REAL));
        List<Region> regions = List.of(new Region(0, new int[] {0, 1, 2, 3}), new Region(1, new int[] {0, 1}),
                new Region(2, new int[] {2, 3}), new Region(7, new int[] {0, 2}), new Region(8, new int[] {1, 3}),
                new Region(3, new int[] {0}), new Region(4, new int[] {1}), new Region(5, new int[] {2}),
                new Region(6, new int[] {3}));
        List<Partition> parts = List.of(new Partition(0, new int[] {1, 2}), new Partition(0, new int[] {7, 8}),
                new Partition(1, new int[] {3, 4}), new Partition(2, new int[] {5, 6}), new Partition(7, new int[] {3, 5}),
                new Partition(8, new int[] {4, 6}));
        return RegionGraph.builder().variables(vars).regions(regions).partitions(parts).build();
    }

    /**
     * Normal leaves (bundle i of every leaf: mean {@code mean[i]}, sd {@code sd[i]}), every inner sum with weights
     * {@code inner} (over 4 products), the root's weights {@code root} (over 8 products: {0,1} x {2,3} first).
     */
    private static RegionParameters params(double[] mean, double[] sd, double[][] inner, double[] root) throws Exception {
        return params(mean, sd, inner, inner, root);
    }

    /** The same with weights {@code inner78} in regions 7 and 8, {0,2} and {1,3}. */
    private static RegionParameters params(double[] mean, double[] sd, double[][] inner, double[][] inner78, double[] root)
            throws Exception {
        List<NpyArray> arrays = new ArrayList<>();
        for (int leaf = 3; leaf <= 6; leaf++) {
            arrays.add(NpyArray.ofDoubles("r" + leaf + ".v" + (leaf - 3) + ".mean", new int[] {I}, mean));
            arrays.add(NpyArray.ofDoubles("r" + leaf + ".v" + (leaf - 3) + ".sd", new int[] {I}, sd));
        }
        for (int r : new int[] {1, 2, 7, 8}) {
            arrays.add(NpyArray.ofDoubles("r" + r + ".weights", new int[] {K, 4}, flat(r < 7 ? inner : inner78)));
        }
        arrays.add(NpyArray.ofDoubles("r0.weights", new int[] {1, 8}, root));
        return RegionParameters.fromArchive(RegionStructure.of(graph()), new CompileOptions(K, I, 1, Map.of()), NpzArchive.of(arrays));
    }

    private static double[] flat(double[][] w) {
        return Arrays.stream(w).flatMapToDouble(Arrays::stream).toArray();
    }

    private static final double[][] SPREAD = {{0.1, 0.2, 0.3, 0.4}, {0.4, 0.3, 0.2, 0.1}};
    private static final double[] ROOT = {0.05, 0.1, 0.15, 0.2, 0.2, 0.15, 0.1, 0.05};

    /** Every row's log-values from both evaluations; returns the rows the linear evaluation left to the log domain. */
    private static long assertAgree(RegionParameters p, double[] data) {
        int rows = data.length / 4;
        double[] want = new double[rows];
        new PerPointTensorEvaluation(p).logDensity(data, rows, want);
        double[] got = new double[rows];
        RegionTensorEvaluator e = new RegionTensorEvaluator(p);
        e.logDensity(data, rows, got);
        for (int r = 0; r < rows; r++) {
            assertClose(want[r], got[r], "row " + r + " " + Arrays.toString(Arrays.copyOfRange(data, 4 * r, 4 * r + 4)));
            double[] alone = new double[1];
            e.sharing().logDensity(Arrays.copyOfRange(data, 4 * r, 4 * r + 4), 1, alone);
            assertEquals(Double.doubleToLongBits(got[r]), Double.doubleToLongBits(alone[0]), "row " + r + " alone");
        }
        return e.logDomainRows();
    }

    private static void assertClose(double want, double got, String where) {
        if (Double.isInfinite(want) || Double.isNaN(want)) {
            assertEquals(want, got, where);
            return;
        }
        assertTrue(Math.abs(got - want) <= REL * Math.abs(want) + 4 * Math.ulp(1.0), where + ": linear " + got + ", log domain " + want);
    }

    @Test
    void farTails_negativeExponentsPast10000_stayLinear() throws Exception {
        RegionParameters p = params(new double[] {0, 3}, new double[] {1, 0.5}, SPREAD, ROOT);
        SplitMix64 rng = new SplitMix64(3);
        int rows = 300;
        double[] data = new double[rows * 4];
        for (int i = 0; i < data.length; i++) {
            // from the mode to 400 sd out, on either side: log-densities to about -3e5 per row, E to about -4e5
            data[i] = (rng.nextDouble() < 0.5 ? -1 : 1) * 400 * rng.nextDouble() * (i / 4 % 3 == 0 ? 0.01 : 1);
        }
        assertEquals(0, assertAgree(p, data), "rows left to the log domain");
        double[] out = new double[rows];
        new RegionTensorEvaluator(p).logDensity(data, rows, out);
        assertTrue(Arrays.stream(out).filter(v -> v < -1e4).count() > 150, "rows below -1e4");
    }

    @Test
    void sharpLeaves_positiveExponentsPast1000_stayLinear() throws Exception {
        // bundle 0 of every leaf has sd 1e-200: at its mean a leaf's log-density is 459.6, the row's 1838.5 (E = 2652)
        RegionParameters p = params(new double[] {0.25, 3}, new double[] {1e-200, 1}, SPREAD, ROOT);
        double[] data = {0.25, 0.25, 0.25, 0.25, 0.25, 0.25, 0.25, 3, 0.25, 3, 3, 3, 3, 3, 3, 3};
        assertEquals(0, assertAgree(p, data), "rows left to the log domain");
        double[] out = new double[4];
        new RegionTensorEvaluator(p).logDensity(data, 4, out);
        // the top of each of the 8 products of the first row is w * e^(4 * 459.6...): commons-math3's normal log-density
        double leaf = new NormalDistribution(null, 0.25, 1e-200).logDensity(0.25);
        assertTrue(out[0] > 1000 && Math.abs(out[0] - 4 * leaf) < 5, out[0] + " near " + 4 * leaf);
    }

    @Test
    void regionValuesBeyond2pow1074_onlyTheSmallOneWeighted_exact() throws Exception {
        // bundles N(0, 1) and N(60, 1) at x = 0: -0.92 and -1800.9, a ratio of e^1800 (> 2^1074) inside each leaf.
        // Every inner sum 0 weighs only the product of the small bundles, the root only {0,1} sum 0 x {2,3} sum 0:
        // in linear space the small bundles are 0 next to the large ones, and the row must take the log domain
        double[][] onlySmall = {{0, 0, 0, 1}, {0.25, 0.25, 0.25, 0.25}};
        double[] root = {1, 0, 0, 0, 0, 0, 0, 0};
        RegionParameters p = params(new double[] {0, 60}, new double[] {1, 1}, onlySmall, root);
        double[] data = {0, 0, 0, 0, 0.5, -0.5, 1, 0};
        long logDomain = assertAgree(p, data);
        assertEquals(2, logDomain, "rows left to the log domain");
        double[] out = new double[2];
        new RegionTensorEvaluator(p).logDensity(data, 2, out);
        NormalDistribution far = new NormalDistribution(null, 60, 1);
        for (int r = 0; r < 2; r++) {
            double want = 0;
            for (int v = 0; v < 4; v++) {
                want += far.logDensity(data[4 * r + v]);
            }
            assertTrue(Math.abs(out[r] - want) <= REL * Math.abs(want), "row " + r + ": " + out[r] + ", commons-math3 " + want);
        }
    }

    @Test
    void regionValuesBeyond2pow1074_bothWeighted_theLargeOneCarriesTheSum() throws Exception {
        // the same leaves, every product weighted: the small bundles underflow to 0 and change nothing (e^-1800 of
        // the sum), the rows stay linear
        RegionParameters p = params(new double[] {0, 60}, new double[] {1, 1}, SPREAD, ROOT);
        double[] data = {0, 0, 0, 0, 0.5, -0.5, 1, 0, 60, 0, 0, 0, 61, 59, 60, 0};
        assertEquals(0, assertAgree(p, data), "rows left to the log domain");
    }

    @Test
    void zeroWeightsOnTheLargestProducts_partitionFarBelow_takeTheLogDomain() throws Exception {
        // bundles N(0, 1) and N(m, 1): near 0 bundle 1 is e^(-m^2 / 2) below bundle 0 in every leaf. Regions {0,1} and
        // {2,3} weigh only bundle 0 x bundle 0, {0,2} and {1,3} only bundle 1 x bundle 1 (their own scaled sums,
        // e^-m^2, stay above 2^-900), so the partition {0,2} x {1,3} lies e^(-2 m^2) below {0,1} x {2,3}: 2^-1731 at
        // m = 24.5, 2^-1050 (a subnormal scale) at m = 19.08. The root weighs only that lower partition: its scale
        // underflows, the root's scaled sum is below the floor, and the rows take the log domain
        double[][] first = {{1, 0, 0, 0}, {1, 0, 0, 0}};
        double[][] last = {{0, 0, 0, 1}, {0, 0, 0, 1}};
        double[] root = {0, 0, 0, 0, 0.25, 0.25, 0.25, 0.25};
        double[] data = {0.1, 0.2, -0.3, 0.4, 0, 0, 0, 0, Double.NaN, 0, 0.5, -0.5};
        for (double m : new double[] {24.5, 19.08}) {
            RegionParameters p = params(new double[] {0, m}, new double[] {1, 1}, first, last, root);
            // at m = 19.08 the row with a missing cell spans 3 variables: 2^-788 below, above the floor, linear
            assertEquals(m > 20 ? 3 : 2, assertAgree(p, data), "rows left to the log domain at m = " + m);
            double[] out = new double[3];
            new RegionTensorEvaluator(p).logDensity(data, 3, out);
            NormalDistribution far = new NormalDistribution(null, m, 1);
            for (int r = 0; r < 3; r++) {
                double want = 0;
                for (int v = 0; v < 4; v++) {
                    double x = data[4 * r + v];
                    want += Double.isNaN(x) ? 0 : far.logDensity(x);
                }
                assertTrue(Math.abs(out[r] - want) <= REL * Math.abs(want), "row " + r + ": " + out[r] + ", commons-math3 " + want);
            }
            // with a weight of 1e-200 on the upper partition the rows stay linear (2^-664 of it is above the floor)
            double[] some = root.clone();
            some[0] = 1e-200;
            some[4] -= 1e-200;
            p = params(new double[] {0, m}, new double[] {1, 1}, first, last, some);
            assertEquals(0, assertAgree(p, data), "rows left to the log domain, upper partition weighted, m = " + m);
        }
    }

    @Test
    void missingCells_andCellsOutsideTheSupport() throws Exception {
        // uniform leaves on [0, 1] and [0, 10] (seeded otherwise): at 5 one bundle is 0 (-inf) and the other is not,
        // so the row stays linear; at -1 or 11 every bundle of a leaf is 0 and the row is -inf, through the log domain
        RegionStructure s = RegionStructure.of(graph());
        List<NpyArray> arrays = new ArrayList<>();
        for (int leaf = 3; leaf <= 6; leaf++) {
            arrays.add(NpyArray.ofDoubles("r" + leaf + ".v" + (leaf - 3) + ".low", new int[] {I}, new double[] {0, 0}));
            arrays.add(NpyArray.ofDoubles("r" + leaf + ".v" + (leaf - 3) + ".high", new int[] {I}, new double[] {1, 10}));
        }
        for (int r : new int[] {1, 2, 7, 8}) {
            arrays.add(NpyArray.ofDoubles("r" + r + ".weights", new int[] {K, 4}, flat(SPREAD)));
        }
        arrays.add(NpyArray.ofDoubles("r0.weights", new int[] {1, 8}, ROOT));
        RegionParameters p = RegionParameters.fromArchive(s, new CompileOptions(K, I, 1, Map.of(VariableType.REAL, Family.UNIFORM)),
                NpzArchive.of(arrays));
        double nan = Double.NaN;
        double[] linear = {0.5, 0.5, 0.5, 0.5, 5, 0.5, 5, 5, nan, 5, nan, 0.2, nan, nan, nan, nan, 9.9, nan, 0.001, 1};
        assertEquals(0, assertAgree(p, linear), "rows left to the log domain");
        double[] outside = {-1, 0.5, 0.5, 0.5, 0.5, nan, 11, nan, -1, -1, -1, -1};
        assertEquals(3, assertAgree(p, outside), "rows left to the log domain");
        double[] out = new double[3];
        new RegionTensorEvaluator(p).logDensity(outside, 3, out);
        assertTrue(Arrays.stream(out).allMatch(v -> v == Double.NEGATIVE_INFINITY), Arrays.toString(out));
        // the all-missing row: every leaf 1, each sum the sum of its weights (1), the output 0
        double[] missing = new double[4];
        new RegionTensorEvaluator(p).logDensity(new double[] {nan, nan, nan, nan}, 1, missing);
        assertEquals(0, missing[0], 4 * Math.ulp(1.0));
    }

    @Test
    void mixedBatch_rowsLeftToTheLogDomain_sameBitsAloneAndOnThreads() throws Exception {
        // rows that stay linear and rows that do not, in one batch of 3 blocks: each row's value is that row's alone
        // (the leaves and weights of regionValuesBeyond2pow1074_onlyTheSmallOneWeighted_exact: a row needs the log
        // domain when some cell is near 0, where the weighted bundle is e^-1800 of the other)
        double[][] onlySmall = {{0, 0, 0, 1}, {0.25, 0.25, 0.25, 0.25}};
        RegionParameters p = params(new double[] {0, 60}, new double[] {1, 1}, onlySmall, new double[] {1, 0, 0, 0, 0, 0, 0, 0});
        SplitMix64 rng = new SplitMix64(11);
        int rows = 3 * RegionTensorEvaluator.CHUNK_ROWS - 7;
        double[] data = new double[rows * 4];
        for (int i = 0; i < data.length; i++) {
            data[i] = rng.nextDouble() < 0.1 ? Double.NaN : rng.nextDouble() < 0.1 ? rng.uniform(-3, 3) : rng.uniform(55, 65);
        }
        RegionTensorEvaluator e = new RegionTensorEvaluator(p);
        double[] one = new double[rows];
        e.logDensity(data, rows, one);
        assertTrue(e.logDomainRows() > 0 && e.logDomainRows() < rows, e.logDomainRows() + " of " + rows + " in the log domain");
        double[] two = new double[rows];
        e.logDensity(data, rows, two, 2);
        double[] want = new double[rows];
        new PerPointTensorEvaluation(p).logDensity(data, rows, want);
        for (int r = 0; r < rows; r++) {
            assertEquals(Double.doubleToLongBits(one[r]), Double.doubleToLongBits(two[r]), "row " + r);
            assertClose(want[r], one[r], "row " + r);
        }
    }
}
