package dev.circa.engine;

import static dev.circa.engine.Tolerances.assertClose;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.VariableType;
import java.util.Random;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.junit.jupiter.api.Test;

/** The multivariate normal input against commons-math3 3.6.1 MultivariateNormalDistribution and its linear algebra. */
class MvNormalTest {
    private static final int D = 4;
    private static final double[] MEAN = {3.1, 5.0, -1.2, 0.4};

    /** A well-conditioned covariance A A^T + I from a seeded A. */
    private static double[][] covariance() {
        Random random = new Random(3);
        double[][] a = new double[D][D];
        for (double[] row : a) {
            for (int j = 0; j < D; j++) {
                row[j] = random.nextGaussian() * 0.6;
            }
        }
        double[][] c = new double[D][D];
        for (int i = 0; i < D; i++) {
            for (int j = 0; j < D; j++) {
                for (int k = 0; k < D; k++) {
                    c[i][j] += a[i][k] * a[j][k];
                }
                c[i][j] += i == j ? 1 : 0;
            }
        }
        return c;
    }

    private static CompiledCircuit circuit(double[][] cov) {
        TestCircuits t = new TestCircuits();
        for (String name : new String[] {"inlet_pressure", "outlet_pressure", "motor_current", "flow"}) {
            t.variable(name, VariableType.REAL);
        }
        double[] flat = new double[D * D];
        for (int i = 0; i < D; i++) {
            System.arraycopy(cov[i], 0, flat, i * D, D);
        }
        t.output("joint", t.mvnormal(new int[] {0, 1, 2, 3}, MEAN, flat));
        return t.compile();
    }

    @Test
    void logDensity_everyMissingPattern_matchesCommonsMathMarginal() {
        double[][] cov = covariance();
        CompiledCircuit circuit = circuit(cov);
        Evaluator evaluator = new Evaluator(circuit);
        Random random = new Random(9);
        double[] row = new double[D];
        double[] out = new double[1];
        for (int mask = 0; mask < 1 << D; mask++) {
            final int pattern = mask;
            int[] observed = java.util.stream.IntStream.range(0, D).filter(v -> (pattern >> v & 1) == 0).toArray();
            for (int trial = 0; trial < 25; trial++) {
                for (int v = 0; v < D; v++) {
                    row[v] = (mask >> v & 1) != 0 ? Double.NaN : MEAN[v] + 1.5 * random.nextGaussian();
                }
                evaluator.logDensity(row, 1, out);
                if (observed.length == 0) {
                    assertEquals(0.0, out[0], "all missing");
                    continue;
                }
                if (observed.length == 1) {
                    int v = observed[0];
                    // a one-variable marginal: commons-math3 3.6.1 NormalDistribution of mean_v, sqrt(cov_vv)
                    double ref = new org.apache.commons.math3.distribution.NormalDistribution(MEAN[v], Math.sqrt(cov[v][v]))
                            .logDensity(row[v]);
                    assertClose(ref, out[0], "mask " + mask);
                    continue;
                }
                double[] subMean = new double[observed.length];
                double[][] subCov = new double[observed.length][observed.length];
                double[] x = new double[observed.length];
                for (int a = 0; a < observed.length; a++) {
                    subMean[a] = MEAN[observed[a]];
                    x[a] = row[observed[a]];
                    for (int b = 0; b < observed.length; b++) {
                        subCov[a][b] = cov[observed[a]][observed[b]];
                    }
                }
                // the Gaussian marginal is the normal of the sub-mean and sub-covariance:
                // commons-math3 3.6.1 MultivariateNormalDistribution
                double ref = Math.log(new MultivariateNormalDistribution(subMean, subCov).density(x));
                assertClose(ref, out[0], "mask " + mask + " trial " + trial);
            }
        }
    }

    @Test
    void logDensity_infiniteValue_negativeInfinity() {
        Evaluator evaluator = new Evaluator(circuit(covariance()));
        double[] out = new double[2];
        evaluator.logDensity(new double[] {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, 0, 0,
            Double.NaN, Double.NEGATIVE_INFINITY, 1, Double.NaN}, 2, out);
        // a Gaussian density vanishes at infinity (common practice)
        assertEquals(Double.NEGATIVE_INFINITY, out[0]);
        assertEquals(Double.NEGATIVE_INFINITY, out[1]);
    }

    @Test
    void mpe_someVariablesMissing_conditionalMeanFromCommonsMath() {
        double[][] cov = covariance();
        Evaluator evaluator = new Evaluator(circuit(cov));
        double[] row = {3.4, Double.NaN, -0.7, Double.NaN};
        double[] completed = new double[D];
        double[] logValue = new double[1];
        evaluator.mpe(row, 1, 0, completed, logValue);
        int[] o = {0, 2};
        int[] m = {1, 3};
        RealMatrix soo = new Array2DRowRealMatrix(new double[][] {{cov[0][0], cov[0][2]}, {cov[2][0], cov[2][2]}});
        RealMatrix smo = new Array2DRowRealMatrix(new double[][] {{cov[1][0], cov[1][2]}, {cov[3][0], cov[3][2]}});
        double[] diff = {row[0] - MEAN[0], row[2] - MEAN[2]};
        // the mode of x_m given x_o is mu_m + S_mo S_oo^-1 (x_o - mu_o), with commons-math3 3.6.1 linear algebra
        double[] shift = smo.operate(new LUDecomposition(soo).getSolver().solve(new org.apache.commons.math3.linear.ArrayRealVector(diff))
                .toArray());
        for (int a = 0; a < 2; a++) {
            assertEquals(MEAN[m[a]] + shift[a], completed[m[a]], 1e-12, "variable " + m[a]);
            assertEquals(row[o[a]], completed[o[a]], "observed " + o[a]);
        }
        // the max-product value is the joint density at the completed point (commons-math3 3.6.1)
        double ref = Math.log(new MultivariateNormalDistribution(MEAN, cov).density(completed));
        assertClose(ref, logValue[0], "max value");
    }

    @Test
    void sample_fixedSeed_meanAndCovarianceMatch() {
        double[][] cov = covariance();
        int n = 40_000;
        double[] draws = new double[n * D];
        new Sampler(circuit(cov), 17).sample(0, n, draws);
        for (int i = 0; i < D; i++) {
            double mi = 0;
            for (int r = 0; r < n; r++) {
                mi += draws[r * D + i];
            }
            mi /= n;
            // the mean of the draws against the distribution's mean, 5 standard errors
            assertTrue(Math.abs(mi - MEAN[i]) <= 5 * Math.sqrt(cov[i][i] / n), "mean " + i + ": " + mi);
            for (int j = 0; j <= i; j++) {
                double s = 0;
                double mj = 0;
                for (int r = 0; r < n; r++) {
                    mj += draws[r * D + j];
                }
                mj /= n;
                for (int r = 0; r < n; r++) {
                    s += (draws[r * D + i] - mi) * (draws[r * D + j] - mj);
                }
                s /= n - 1;
                // sample covariance: standard error sqrt((S_ii S_jj + S_ij^2) / n) for a Gaussian (common practice)
                double se = Math.sqrt((cov[i][i] * cov[j][j] + cov[i][j] * cov[i][j]) / n);
                assertTrue(Math.abs(s - cov[i][j]) <= 5 * se, "cov " + i + "," + j + ": " + s + " vs " + cov[i][j]);
            }
        }
    }
}
