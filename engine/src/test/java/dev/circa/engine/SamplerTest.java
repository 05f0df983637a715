package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.Arrays;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class SamplerTest {
    private static final int DRAWS = 30_000;
    /** Significance level of the goodness-of-fit tests. */
    private static final double ALPHA = 1e-3;
    /** Bins expected to hold fewer draws than this are pooled, as the chi-square approximation needs (common practice). */
    private static final double MIN_EXPECTED = 5;

    @ParameterizedTest
    @ValueSource(booleans = {false, true})
    void sample_discreteCircuit_frequenciesPassChiSquare(boolean unnormalised) {
        CompiledCircuit circuit = TestCircuits.randomDiscrete(21, unnormalised).compile();
        int nv = TestCircuits.DISCRETE_SIZES.length;
        double[] all = TestCircuits.allAssignments();
        int cells = all.length / nv;
        double[] logP = new double[cells];
        Evaluator evaluator = new Evaluator(circuit);
        evaluator.logDensity(all, cells, logP);
        double logZ = evaluator.logPartition()[0];
        double[] draws = new double[DRAWS * nv];
        new Sampler(circuit, 2026).sample(0, DRAWS, draws);
        long[] observed = new long[cells];
        for (int r = 0; r < DRAWS; r++) {
            int cell = 0;
            for (int v = 0; v < nv; v++) {
                cell = cell * TestCircuits.DISCRETE_SIZES[v] + (int) draws[r * nv + v];
            }
            observed[cell]++;
        }
        double statistic = 0;
        int bins = 0;
        double pooledExpected = 0;
        long pooledObserved = 0;
        for (int c = 0; c < cells; c++) {
            // an unnormalised circuit must be sampled from its normalised distribution p / Z (FORMAT.md)
            double expected = DRAWS * Math.exp(logP[c] - logZ);
            if (expected < MIN_EXPECTED) {
                pooledExpected += expected;
                pooledObserved += observed[c];
                continue;
            }
            statistic += (observed[c] - expected) * (observed[c] - expected) / expected;
            bins++;
        }
        if (pooledExpected > 0) {
            statistic += (pooledObserved - pooledExpected) * (pooledObserved - pooledExpected) / Math.max(pooledExpected, 1e-300);
            bins++;
        }
        // critical value of the chi-square distribution with bins - 1 degrees of freedom, commons-math3 3.6.1
        double critical = new ChiSquaredDistribution(bins - 1).inverseCumulativeProbability(1 - ALPHA);
        assertTrue(statistic <= critical, "chi-square " + statistic + " over " + bins + " bins (critical " + critical + ")");
    }

    @Test
    void sample_sameSeed_sameRowsWhateverTheSplit() {
        CompiledCircuit circuit = TestCircuits.randomDiscrete(4, true).compile();
        int nv = circuit.variableCount();
        double[] once = new double[1000 * nv];
        new Sampler(circuit, 99).sample(0, 1000, once);
        double[] split = new double[1000 * nv];
        Sampler incremental = new Sampler(circuit, 99);
        double[] part = new double[600 * nv];
        incremental.sample(0, 400, part);
        System.arraycopy(part, 0, split, 0, 400 * nv);
        incremental.sample(0, 600, part);
        System.arraycopy(part, 0, split, 400 * nv, 600 * nv);
        assertArrayEquals(once, split);
        double[] tail = new double[300 * nv];
        new Sampler(circuit, 99).sample(0, 700L, 300, tail);
        assertArrayEquals(Arrays.copyOfRange(once, 700 * nv, 1000 * nv), tail);
        double[] other = new double[1000 * nv];
        new Sampler(circuit, 100).sample(0, 1000, other);
        assertFalse(Arrays.equals(once, other), "another seed gives other rows");
    }

    @Test
    void sample_variableOutsideScope_leftMissing() {
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL).variable("alarm", VariableType.BINARY);
        t.output("joint", t.input(Family.NORMAL, 0, 3.1, 0.2));
        double[] out = new double[2 * 5];
        new Sampler(t.compile(), 1).sample(0, 5, out);
        for (int r = 0; r < 5; r++) {
            assertFalse(Double.isNaN(out[r * 2]));
            assertTrue(Double.isNaN(out[r * 2 + 1]));
        }
    }

    @Test
    void sample_deepChainOf100000Nodes_noStackOverflow() {
        TestCircuits t = new TestCircuits().variable("restarts", VariableType.COUNT);
        int node = t.input(Family.POISSON, 0, 2.0);
        for (int i = 1; i < 100_000; i++) {
            node = i % 2 == 0 ? t.sum(new double[] {0.5}, node) : t.product(node);
        }
        t.output("joint", node);
        double[] out = new double[2000];
        new Sampler(t.compile(), 5).sample(0, out.length, out);
        // the chain scales the mass but not the distribution: Poisson mean 2 (commons-math3 3.6.1 moments)
        org.apache.commons.math3.distribution.PoissonDistribution ref = new org.apache.commons.math3.distribution.PoissonDistribution(2.0);
        FamilySamplingTest.assertMoments(out, ref.getNumericalMean(), ref.getNumericalVariance(), "chain");
    }

    @Test
    void sample_zeroMass_rejected() {
        TestCircuits t = new TestCircuits().variable("alarm", VariableType.BINARY);
        int a = t.input(Family.BERNOULLI, 0, 0.5);
        t.output("joint", t.sum(new double[] {0.0}, a));
        CompiledCircuit circuit = t.compile();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new Sampler(circuit, 1).sample(0, 1, new double[1]));
        assertTrue(e.getMessage().contains("joint"), e.getMessage());
        assertEquals(Double.NEGATIVE_INFINITY, new Evaluator(circuit).logPartition()[0]);
    }
}
