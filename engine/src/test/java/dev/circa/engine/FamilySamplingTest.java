package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.stream.Stream;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.apache.commons.math3.distribution.UniformRealDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Sample means and variances of every one-variable family, drawn by the {@link Sampler} at a fixed seed,
 * against the moments of the commons-math3 3.6.1 distributions. Bounds are {@value #SE_BOUND} standard
 * errors: sigma / sqrt(n) for the mean, sqrt((m4 - s^4) / n) for the variance with the sample's m4.
 */
class FamilySamplingTest {
    private static final int DRAWS = 40_000;
    private static final double SE_BOUND = 5;
    private static final long SEED = 42;

    static Stream<Arguments> cases() {
        // commons-math3 parameterisations: exponential by its mean, gamma by shape and scale (1 / rate)
        return Stream.of(
                Arguments.of(Family.NORMAL, VariableType.REAL, new double[] {3.1, 0.2}, moments(new NormalDistribution(3.1, 0.2))),
                Arguments.of(Family.LOGNORMAL, VariableType.REAL, new double[] {0.5, 0.4}, moments(new LogNormalDistribution(0.5, 0.4))),
                Arguments.of(Family.EXPONENTIAL, VariableType.REAL, new double[] {2.5}, moments(new ExponentialDistribution(0.4))),
                Arguments.of(Family.GAMMA, VariableType.REAL, new double[] {0.5, 2}, moments(new GammaDistribution(0.5, 0.5))),
                Arguments.of(Family.GAMMA, VariableType.REAL, new double[] {9, 3}, moments(new GammaDistribution(9, 1.0 / 3))),
                Arguments.of(Family.BETA, VariableType.REAL, new double[] {2, 5}, moments(new BetaDistribution(2, 5))),
                Arguments.of(Family.BETA, VariableType.REAL, new double[] {0.5, 0.5}, moments(new BetaDistribution(0.5, 0.5))),
                Arguments.of(Family.UNIFORM, VariableType.REAL, new double[] {-2.5, 7}, moments(new UniformRealDistribution(-2.5, 7))),
                Arguments.of(Family.POISSON, VariableType.COUNT, new double[] {4}, moments(new PoissonDistribution(4))),
                Arguments.of(Family.POISSON, VariableType.COUNT, new double[] {120}, moments(new PoissonDistribution(120))),
                Arguments.of(Family.BINOMIAL, VariableType.COUNT, new double[] {10, 0.3}, moments(new BinomialDistribution(10, 0.3))),
                Arguments.of(Family.BINOMIAL, VariableType.COUNT, new double[] {1000, 0.4}, moments(new BinomialDistribution(1000, 0.4))),
                // Bernoulli: mean p, variance p (1 - p) (common practice)
                Arguments.of(Family.BERNOULLI, VariableType.BINARY, new double[] {0.3}, new double[] {0.3, 0.21}));
    }

    private static double[] moments(org.apache.commons.math3.distribution.RealDistribution d) {
        return new double[] {d.getNumericalMean(), d.getNumericalVariance()};
    }

    private static double[] moments(org.apache.commons.math3.distribution.IntegerDistribution d) {
        return new double[] {d.getNumericalMean(), d.getNumericalVariance()};
    }

    @ParameterizedTest
    @MethodSource("cases")
    void sample_family_momentsMatchCommonsMath(Family family, VariableType type, double[] params, double[] expected) {
        TestCircuits t = new TestCircuits().variable("x", type);
        t.output("joint", t.input(family, 0, params));
        double[] draws = new double[DRAWS];
        new Sampler(t.compile(), SEED).sample(0, DRAWS, draws);
        assertMoments(draws, expected[0], expected[1], family.jsonName());
    }

    @Test
    void sample_categorical_momentsMatchDirectSums() {
        double[] probs = {0.05, 0.15, 0.8};
        TestCircuits t = new TestCircuits().variable("valve", VariableType.CATEGORICAL, "closed", "half", "open");
        t.output("joint", t.input(Family.CATEGORICAL, 0, probs));
        double[] draws = new double[DRAWS];
        new Sampler(t.compile(), SEED).sample(0, DRAWS, draws);
        // mean and variance of the state index by direct sums over the states (common practice)
        double mean = 0;
        double square = 0;
        for (int k = 0; k < 3; k++) {
            mean += k * probs[k];
            square += k * k * probs[k];
        }
        assertMoments(draws, mean, square - mean * mean, "categorical");
    }

    static void assertMoments(double[] draws, double mean, double variance, String what) {
        int n = draws.length;
        double m = 0;
        for (double x : draws) {
            m += x;
        }
        m /= n;
        double m2 = 0;
        double m4 = 0;
        for (double x : draws) {
            double d = x - m;
            m2 += d * d;
            m4 += d * d * d * d;
        }
        m2 /= n - 1;
        m4 /= n;
        double meanError = Math.abs(m - mean);
        double meanBound = SE_BOUND * Math.sqrt(variance / n);
        assertTrue(meanError <= meanBound, what + ": sample mean " + m + " vs " + mean + " (bound " + meanBound + ")");
        double varError = Math.abs(m2 - variance);
        double varBound = SE_BOUND * Math.sqrt(Math.max(m4 - m2 * m2, 0) / n);
        assertTrue(varError <= varBound, what + ": sample variance " + m2 + " vs " + variance + " (bound " + varBound + ")");
    }
}
