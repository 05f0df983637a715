package dev.circa.converter.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.apache.commons.math3.special.Beta;
import org.apache.commons.math3.special.Gamma;
import org.junit.jupiter.api.Test;

/**
 * The converters' own densities over the whole double range (issue 16): never NaN for valid parameters
 * and values; equal to commons-math3 3.6.1 (test scope) where it gives a finite answer; -inf outside
 * the open supports; and the log-sum-exp never forming inf - inf or 0 * inf.
 */
class ReferenceDensitiesTest {
    private static final double MAX = Double.MAX_VALUE;
    private static final double TINY = Double.MIN_VALUE;
    private static final double MIN_NORMAL = Double.MIN_NORMAL;
    /** Parameters at the ends of double range: largest, smallest normal and subnormal, and ordinary ones. */
    private static final double[] POSITIVE = {TINY, 1e-310, MIN_NORMAL, 1e-300, 1e-8, 0.3, 1, 2.5, 17, 1e6, 1e15, 9.007199254740992e15,
        1e100, 1e300, 1.7e308, MAX};
    private static final double[] VALUES = {-MAX, -1e308, -1e10, -1, -TINY, 0, TINY, MIN_NORMAL, 1e-300, 1e-10, 0.25, 0.5,
        0.999999, 1, 3, 20, 1e6, 1e15, 1e300, 1.7e308, MAX};

    private static void close(double expected, double actual, String what) {
        if (Double.isInfinite(expected)) {
            assertEquals(expected, actual, what);
            return;
        }
        assertTrue(Math.abs(actual - expected) <= 1e-9 * Math.max(1, Math.abs(expected)),
                what + ": circa " + actual + ", commons-math3 " + expected);
    }

    @Test
    void logValue_everyFamilyAtTheExtremes_neverNaN() {
        int finite = 0;
        for (double a : POSITIVE) {
            for (double b : POSITIVE) {
                for (double x : VALUES) {
                    double[][] cases = {{a, b}, {-a, b}};
                    for (double[] p : cases) {
                        check(Family.NORMAL, p, x);
                        check(Family.LOGNORMAL, p, x);
                        check(Family.UNIFORM, new double[] {-a, b}, x);
                    }
                    check(Family.GAMMA, new double[] {a, b}, x);
                    check(Family.BETA, new double[] {a, b}, x);
                    check(Family.EXPONENTIAL, new double[] {a}, x);
                    check(Family.POISSON, new double[] {a}, Math.rint(x));
                    double trials = Math.rint(Math.min(a, 9.007199254740992e15));
                    double q = Math.min(b, 1);
                    check(Family.BINOMIAL, new double[] {trials, q}, Math.rint(x));
                    check(Family.BINOMIAL, new double[] {trials, 1 - Math.min(b, 0.5)}, Math.rint(Math.min(x, trials)));
                    if (Double.isFinite(ReferenceDensities.logValue(Family.GAMMA, new double[] {a, b}, x))) {
                        finite++;
                    }
                }
            }
        }
        assertTrue(finite > 1000, "most gamma cases are finite: " + finite);
    }

    private static void check(Family f, double[] p, double x) {
        double v = ReferenceDensities.logValue(f, p, x);
        assertFalse(Double.isNaN(v), f + " " + java.util.Arrays.toString(p) + " at " + x + " is NaN");
        double[] one = {0};
        ReferenceDensities.addLogValues(f, p, new double[] {x}, 1, one);
        assertEquals(Double.doubleToLongBits(0 + v), Double.doubleToLongBits(one[0]), f + " column form");
    }

    @Test
    void logValue_extremes_equalCommonsMathWhereFinite() {
        // commons-math3 3.6.1 densities, each compared only where it returns a finite number
        int compared = 0;
        for (double a : POSITIVE) {
            for (double b : POSITIVE) {
                for (double x : VALUES) {
                    compared += compare(Family.NORMAL, new double[] {-a, b}, x, () -> new NormalDistribution(null, -a, b).logDensity(x));
                    compared += compare(Family.LOGNORMAL, new double[] {Math.min(a, 700), b}, x,
                            () -> new LogNormalDistribution(null, Math.min(a, 700), b).logDensity(x));
                    if (b * x >= 1e-3 && b * x <= 1e3 && a <= 1e6) {
                        // commons-math3 forms the product rate * x, which rounds in the subnormal range (circa takes logs
                        // there), and takes an approximation far from it that is off by 1e-8 (gamma(0.3, rate 1e-8) at
                        // 0.25: -5.65159611586, where the direct formula in double gives -5.65159616772, as circa does;
                        // shape 1e15, rate 2.2e-308 at 1.7e308: -3.22104e16 against -3.22084e16 by the direct formula)
                        compared += compare(Family.GAMMA, new double[] {a, b}, x,
                                () -> new GammaDistribution(null, a, 1 / b).logDensity(x));
                    }
                    if (x > 0 && x < 1 && Math.max(a, b) <= 1e3) {
                        // commons-math3's BetaDistribution takes log Gamma(a) + log Gamma(b) - log Gamma(a + b) as they
                        // are, which loses digits for large shapes; those are checked by logBeta and the known values
                        compared += compare(Family.BETA, new double[] {a, b}, x, () -> new BetaDistribution(null, a, b).logDensity(x));
                    }
                    compared += compare(Family.EXPONENTIAL, new double[] {a}, x,
                            () -> new ExponentialDistribution(null, 1 / a).logDensity(x));
                    if (x >= 0 && x < Integer.MAX_VALUE && a < 1e15) {
                        compared += compare(Family.POISSON, new double[] {a}, Math.rint(x),
                                () -> new PoissonDistribution(null, a, 1e-12, 10_000_000).logProbability((int) Math.rint(x)));
                    }
                    if (a < Integer.MAX_VALUE && x >= 0 && x <= a && b <= 1) {
                        int n = (int) Math.rint(a);
                        compared += compare(Family.BINOMIAL, new double[] {n, b}, Math.rint(x),
                                () -> new BinomialDistribution(null, n, b).logProbability((int) Math.rint(x)));
                    }
                }
            }
        }
        assertTrue(compared > 5000, "compared " + compared);
    }

    private static int compare(Family f, double[] p, double x, java.util.function.DoubleSupplier reference) {
        double want;
        try {
            want = reference.getAsDouble();
        } catch (RuntimeException e) {
            return 0;
        }
        if (!Double.isFinite(want)) {
            return 0;
        }
        close(want, ReferenceDensities.logValue(f, p, x), f + " " + java.util.Arrays.toString(p) + " at " + x);
        return 1;
    }

    @Test
    void logValue_knownExtremeValues() {
        // a normal whose x - mean overflows: z = (1e308 + 1.79e308) / 1.79e308 is about 1.56 (arithmetic)
        double z = 1e308 / MAX + 1;
        close(-0.5 * z * z - Math.log(MAX) - 0.5 * Math.log(2 * Math.PI),
                ReferenceDensities.logValue(Family.NORMAL, new double[] {-MAX, MAX}, 1e308), "normal, difference overflows");
        // log Gamma of the smallest subnormal: -log(x) - Euler's gamma x, about 744.44 (series of log Gamma at 0, handbook)
        close(-Math.log(TINY), ReferenceDensities.logGamma(TINY), "log Gamma(4.9e-324)");
        // Poisson at rate 1.7e308 and count 1.7e308: the mass at the mean is about 1 / sqrt(2 pi rate) (Stirling, handbook)
        close(-0.5 * (Math.log(2 * Math.PI) + Math.log(1.7e308)), ReferenceDensities.logValue(Family.POISSON, new double[] {1.7e308}, 1.7e308),
                "poisson at its mean");
        // gamma with shape = rate = 1.7e308 at 1: mean 1, sd 1/sqrt(1.7e308), nearly normal: log(1 / (sqrt(2 pi) sd))
        close(0.5 * Math.log(1.7e308) - 0.5 * Math.log(2 * Math.PI),
                ReferenceDensities.logValue(Family.GAMMA, new double[] {1.7e308, 1.7e308}, 1), "gamma at its mean");
        // beta(1e308, 1e308) at 1/2: nearly normal with sd 1 / sqrt(8e308): log(sqrt(8e308 / (2 pi)))
        close(0.5 * (Math.log(8) + Math.log(1e308) - Math.log(2 * Math.PI)),
                ReferenceDensities.logValue(Family.BETA, new double[] {1e308, 1e308}, 0.5), "beta at its mean");
        // binomial with 2^53 trials and p = 2.2e-308: no success with probability (1 - p)^n, about -2e-292
        close(-9.007199254740992e15 * MIN_NORMAL, ReferenceDensities.logValue(Family.BINOMIAL,
                new double[] {9.007199254740992e15, MIN_NORMAL}, 0), "binomial, no success");
    }

    @Test
    void addNormalLogValues_plainCellsWithMissingOnes_bitIdenticalToAddLogValuesAndCommonsMath() {
        double[] cells = {0, 1.5, -3, Double.NaN, 1e-300, 6e-310, 40, -55, 1e5, -3e7, 1e154, -1e200, 1e300, 9e306,
            -9e306, Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, 0.25, Double.NaN, 7};
        int n = cells.length;
        int[] missing = new int[n + 3];
        int m = 3;
        for (int i = 0; i < n; i++) {
            if (Double.isNaN(cells[i])) {
                missing[m++] = i;
            }
        }
        double[] means = {0, 1.5, -2, 1e-300, 1e5, -4e306, 9e306};
        double[] sds = {1e-300, 1e-150, 0.01, 1, 7.5, 1e150, 1e300, MAX};
        double[] term = new double[n];
        double[] clean = new double[n];
        double[] seen = new double[n];
        for (int i = 0; i < n; i++) {
            clean[i] = Double.isNaN(cells[i]) ? 0 : cells[i];
            seen[i] = Double.isNaN(cells[i]) ? 0 : 1;
        }
        for (double mean : means) {
            for (double sd : sds) {
                assertTrue(ReferenceDensities.plain(mean, true));
                double[] want = new double[n + 1];
                double[] got = new double[n + 1];
                for (int i = 0; i <= n; i++) {
                    want[i] = i * 0.5 - 2.5;
                    got[i] = want[i];
                }
                ReferenceDensities.addLogValues(Family.NORMAL, new double[] {mean, sd}, cells, n, want);
                ReferenceDensities.addNormalLogValues(mean, sd, Math.log(sd), cells, clean, seen, n, missing, 3, m, term,
                        got);
                for (int i = 0; i <= n; i++) {
                    // the general loop is the reference: the same doubles, cell by cell
                    assertEquals(Double.doubleToRawLongBits(want[i]), Double.doubleToRawLongBits(got[i]),
                            "mean " + mean + ", sd " + sd + ", cell " + i + ": " + want[i] + " against " + got[i]);
                }
                // the first three cells alone, none missing
                double[] want3 = {1, -2, 0};
                double[] got3 = want3.clone();
                ReferenceDensities.addLogValues(Family.NORMAL, new double[] {mean, sd}, cells, 3, want3);
                ReferenceDensities.addNormalLogValues(mean, sd, Math.log(sd), cells, clean, seen, 3, missing, 3, 3, term,
                        got3);
                for (int i = 0; i < 3; i++) {
                    assertEquals(Double.doubleToRawLongBits(want3[i]), Double.doubleToRawLongBits(got3[i]),
                            "no cell missing: mean " + mean + ", sd " + sd + ", cell " + i);
                }
                for (int i = 0; i < n; i++) {
                    double x = cells[i];
                    if (Double.isFinite(x) && Double.isFinite(mean) && Math.abs(x - mean) < 1e6 * sd) {
                        // commons-math3 3.6.1 NormalDistribution.logDensity, from the observed cell's value
                        close(new NormalDistribution(null, mean, sd).logDensity(x), got[i] - i * 0.5 + 2.5,
                                "normal(" + mean + ", " + sd + ") at " + x);
                    }
                }
            }
        }
        for (double x : cells) {
            assertTrue(Double.isNaN(x) || ReferenceDensities.plain(x, false));
        }
        assertFalse(ReferenceDensities.plain(1e307, false));
        assertFalse(ReferenceDensities.plain(-MAX, false));
        assertFalse(ReferenceDensities.plain(Double.NaN, false));
        assertFalse(ReferenceDensities.plain(Double.POSITIVE_INFINITY, true));
    }

    @Test
    void logBeta_equalsCommonsMath() {
        // commons-math3 3.6.1 Beta.logBeta and Gamma.logGamma
        double[] shapes = {TINY, 1e-300, 1e-8, 0.5, 1, 3.7, 9.99, 10, 12.5, 40, 1e3, 1e8, 1e15, 1e100, 1e300};
        for (double a : shapes) {
            for (double b : shapes) {
                double want = Beta.logBeta(a, b);
                if (Double.isFinite(want)) {
                    close(want, ReferenceDensities.logBeta(a, b), "log B(" + a + ", " + b + ")");
                }
            }
            double g = Gamma.logGamma(a);
            if (Double.isFinite(g)) {
                close(g, ReferenceDensities.logGamma(a), "log Gamma(" + a + ")");
            }
        }
    }

    @Test
    void logSumExp_infinitiesAndZeroWeights() {
        // common practice: a zero weight removes its term; +inf dominates; -inf terms vanish; NaN is reported
        double inf = Double.POSITIVE_INFINITY;
        assertEquals(inf, LogSumExp.add(inf, inf));
        assertEquals(inf, LogSumExp.add(inf, -inf));
        assertEquals(-inf, LogSumExp.add(-inf, -inf));
        assertEquals(3.0, LogSumExp.add(3, -inf));
        assertEquals(MAX, LogSumExp.add(MAX, 0));
        assertTrue(Double.isNaN(LogSumExp.add(Double.NaN, 0)));
        assertEquals(2.0, LogSumExp.weighted(new double[] {0, 1}, false, new double[] {inf, 2}, 2));
        assertEquals(2.0, LogSumExp.weighted(new double[] {-inf, 0}, true, new double[] {inf, 2}, 2));
        assertEquals(inf, LogSumExp.weighted(new double[] {TINY, 1}, false, new double[] {inf, 2}, 2));
        assertEquals(-inf, LogSumExp.weighted(new double[] {0.5, 0.5}, false, new double[] {-inf, -inf}, 2));
        close(Math.log(TINY) + MAX, LogSumExp.weighted(new double[] {TINY, 1}, false, new double[] {MAX, 0}, 2), "huge terms");
        assertEquals(Math.log(2) + 1, LogSumExp.weighted(new double[] {1, 1}, false, new double[] {1, 1}, 2), 1e-15);
    }
}
