package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureReader;
import java.util.Locale;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.apache.commons.math3.distribution.RealDistribution;
import org.apache.commons.math3.distribution.UniformRealDistribution;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.junit.jupiter.api.Test;

/** The independent source evaluator and sampler against commons-math3 3.6.1. */
class MixtureDensityTest {
    private static final double TOLERANCE = 1e-12;

    private static MixtureDocument one(String type, String input) throws Exception {
        return MixtureReader.readString("""
                {"format": "circa.mixture", "version": "1.0",
                 "variables": [{"name": "x", "type": "%s"}],
                 "model": {"var": "x", %s}}
                """.formatted(type, input), "inline.json", ReadLimits.DEFAULT);
    }

    private static double log(MixtureDocument doc, double... row) throws Exception {
        return MixtureDensity.of(doc, false).logDensity(row, 0);
    }

    private static void close(double expected, double actual, String what) {
        assertTrue(Math.abs(expected - actual) <= TOLERANCE * Math.max(1, Math.abs(expected)),
                () -> String.format(Locale.ROOT, "%s: expected %s, got %s", what, expected, actual));
    }

    @Test
    void logDensity_realFamilies_equalCommonsMath() throws Exception {
        Object[][] cases = {
            {"\"normal\": {\"mean\": 3.1, \"sd\": 0.2}", new NormalDistribution(3.1, 0.2), new double[] {2.5, 3.1, 3.7}},
            {"\"lognormal\": {\"mu\": 1.9, \"sigma\": 0.1}", new LogNormalDistribution(1.9, 0.1),
                new double[] {5.5, 6.7, 8}},
            {"\"exponential\": {\"rate\": 2.5}", new ExponentialDistribution(1 / 2.5), new double[] {0, 0.3, 4}},
            {"\"gamma\": {\"shape\": 40, \"rate\": 2.5}", new GammaDistribution(40, 1 / 2.5), new double[] {12, 16, 21}},
            {"\"gamma\": {\"shape\": 0.3, \"rate\": 1.5}", new GammaDistribution(0.3, 1 / 1.5),
                new double[] {0.01, 0.5, 3}},
            {"\"beta\": {\"alpha\": 2.5, \"beta\": 0.7}", new BetaDistribution(2.5, 0.7), new double[] {0.1, 0.5, 0.99}},
            {"\"uniform\": {\"low\": -1, \"high\": 3}", new UniformRealDistribution(-1, 3), new double[] {-1, 0, 3}},
        };
        for (Object[] c : cases) {
            MixtureDocument doc = one("real", (String) c[0]);
            RealDistribution d = (RealDistribution) c[1];
            for (double x : (double[]) c[2]) {
                // commons-math3 3.6.1: RealDistribution.density
                close(Math.log(d.density(x)), log(doc, x), c[0] + " at " + x);
            }
        }
    }

    @Test
    void logDensity_countFamilies_equalCommonsMath() throws Exception {
        MixtureDocument poisson = one("count", "\"poisson\": {\"rate\": 1.5}");
        MixtureDocument binomial = one("count", "\"binomial\": {\"trials\": 5, \"p\": 0.4}");
        PoissonDistribution p = new PoissonDistribution(1.5);
        BinomialDistribution b = new BinomialDistribution(5, 0.4);
        for (int k = 0; k <= 5; k++) {
            // commons-math3 3.6.1: logProbability
            close(p.logProbability(k), log(poisson, k), "poisson " + k);
            close(b.logProbability(k), log(binomial, k), "binomial " + k);
        }
        assertEquals(Double.NEGATIVE_INFINITY, log(binomial, 6));
        PoissonDistribution large = new PoissonDistribution(250);
        close(large.logProbability(300), log(one("count", "\"poisson\": {\"rate\": 250}"), 300), "poisson 250");
    }

    @Test
    void logDensity_mvnormalWithMissing_equalsCommonsMathMarginal() throws Exception {
        MixtureDocument doc = MixtureReader.readString("""
                {"format": "circa.mixture", "version": "1.0",
                 "variables": [{"name": "a", "type": "real"}, {"name": "b", "type": "real"}, {"name": "c", "type": "real"}],
                 "model": {"vars": ["a", "b", "c"], "mvnormal": {"mean": [1, 2, 3],
                   "cov": [[2.0, 0.3, 0.5], [0.3, 1.0, -0.2], [0.5, -0.2, 1.5]]}}}
                """, "inline.json", ReadLimits.DEFAULT);
        double[][] cov = {{2.0, 0.3, 0.5}, {0.3, 1.0, -0.2}, {0.5, -0.2, 1.5}};
        MultivariateNormalDistribution full = new MultivariateNormalDistribution(new double[] {1, 2, 3}, cov);
        // commons-math3 3.6.1: MultivariateNormalDistribution.density, and the marginal by sub-mean/sub-covariance
        close(Math.log(full.density(new double[] {0.5, 2.5, 2})), log(doc, 0.5, 2.5, 2), "full");
        MultivariateNormalDistribution ac = new MultivariateNormalDistribution(new double[] {1, 3},
                new double[][] {{2.0, 0.5}, {0.5, 1.5}});
        close(Math.log(ac.density(new double[] {0.5, 2})), log(doc, 0.5, Double.NaN, 2), "a and c");
        close(Math.log(new NormalDistribution(2, 1).density(2.5)), log(doc, Double.NaN, 2.5, Double.NaN), "b");
        assertEquals(0.0, log(doc, Double.NaN, Double.NaN, Double.NaN));
    }

    @Test
    void sample_normalAndGammaInputs_passKolmogorovSmirnov() throws Exception {
        Object[][] cases = {
            {"\"normal\": {\"mean\": 3.1, \"sd\": 0.2}", new NormalDistribution(3.1, 0.2)},
            {"\"gamma\": {\"shape\": 0.6, \"rate\": 2}", new GammaDistribution(0.6, 0.5)},
            {"\"beta\": {\"alpha\": 2.5, \"beta\": 0.7}", new BetaDistribution(2.5, 0.7)},
        };
        for (Object[] c : cases) {
            MixtureSampler s = MixtureSampler.of(one("real", (String) c[0]), false, 7L);
            double[] x = new double[2000];
            s.sample(x.length, x);
            // commons-math3 3.6.1: one-sample Kolmogorov-Smirnov test; seeded, so the p-value is fixed
            double pValue = new KolmogorovSmirnovTest().kolmogorovSmirnovTest((RealDistribution) c[1], x);
            assertTrue(pValue > 0.001, c[0] + ": p = " + pValue);
        }
    }

    @Test
    void sample_sameSeed_sameRows() throws Exception {
        MixtureDocument doc = MixtureReader.read(java.nio.file.Path.of("..", "fixtures", "mixtures",
                "pump-station-regimes.yaml"), ReadLimits.DEFAULT);
        double[] a = new double[600];
        double[] b = new double[600];
        MixtureSampler.of(doc, false, 42).sample(100, a);
        MixtureSampler.of(doc, false, 42).sample(100, b);
        org.junit.jupiter.api.Assertions.assertArrayEquals(a, b);
    }
}
