package dev.circa.engine.family;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.random.Xoshiro256;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.apache.commons.math3.distribution.UniformRealDistribution;
import org.apache.commons.math3.special.Beta;
import org.apache.commons.math3.special.Gamma;
import org.junit.jupiter.api.Test;

/**
 * Every one-variable family at the ends of double range, parameters and values: the largest and
 * smallest normal and subnormal numbers, 0, and values at and just outside the support. Each
 * log-density is finite or -inf (never NaN, never +inf, never a hang), each draw is a number (never
 * NaN; an overflow is reported by {@link Families#representable}), and every finite answer that
 * commons-math3 3.6.1 also gives finitely agrees with it.
 */
class FamilyExtremesTest {
    /** Relative agreement with commons-math3 at extreme arguments (its own accuracy there is about 1e-13). */
    private static final double REFERENCE_TOLERANCE = 1e-9;
    /** A hang shows up as a timeout: every evaluation here takes microseconds. */
    private static final Duration NO_HANG = Duration.ofSeconds(20);

    private static final double MAX = Double.MAX_VALUE;
    private static final double[] POSITIVE = {Double.MIN_VALUE, 1e-320, Double.MIN_NORMAL, 1e-300, 1e-10, 0.5, 1,
        1.5, 15, 1e10, 1e300, 1.7e308, MAX};
    private static final double[] VALUES = {0, -0.0, Double.MIN_VALUE, -Double.MIN_VALUE, Double.MIN_NORMAL,
        -Double.MIN_NORMAL, 1e-300, 0.5, Math.nextDown(1.0), 1, Math.nextUp(1.0), 2, 1e300, -1e300, 1.7e308,
        -1.7e308, MAX, -MAX};
    private static final double[] PROBABILITIES = {0, Double.MIN_VALUE, 1e-300, 0.5, Math.nextDown(1.0), 1};

    /** Every valid parameter vector built from the extreme numbers, per family code. */
    private static List<double[]> parameters(int code) {
        List<double[]> out = new ArrayList<>();
        switch (code) {
            case Families.BERNOULLI:
                for (double p : PROBABILITIES) {
                    out.add(new double[] {p});
                }
                break;
            case Families.NORMAL:
            case Families.LOGNORMAL:
                for (double m : VALUES) {
                    for (double sd : POSITIVE) {
                        out.add(new double[] {m, sd});
                    }
                }
                break;
            case Families.EXPONENTIAL:
            case Families.POISSON:
                for (double r : POSITIVE) {
                    out.add(new double[] {r});
                }
                break;
            case Families.GAMMA:
            case Families.BETA:
                for (double a : POSITIVE) {
                    for (double b : POSITIVE) {
                        out.add(new double[] {a, b});
                    }
                }
                break;
            case Families.UNIFORM:
                for (double lo : VALUES) {
                    for (double hi : VALUES) {
                        if (lo < hi) {
                            out.add(new double[] {lo, hi});
                        }
                    }
                }
                break;
            case Families.BINOMIAL:
                for (double n : new double[] {0, 1, 64, 65, 1e6, 1e15, Families.MAX_COUNT}) {
                    for (double p : PROBABILITIES) {
                        out.add(new double[] {n, p});
                    }
                }
                break;
            default:
                throw new IllegalArgumentException("no extremes for family code " + code);
        }
        return out;
    }

    private static final int[] SCALAR = {Families.BERNOULLI, Families.NORMAL, Families.LOGNORMAL, Families.EXPONENTIAL,
        Families.GAMMA, Families.BETA, Families.UNIFORM, Families.POISSON, Families.BINOMIAL};

    @Test
    void logDensity_extremeParametersAndValues_finiteOrMinusInfinity() {
        assertTimeoutPreemptively(NO_HANG, () -> {
            for (int code : SCALAR) {
                for (double[] p : parameters(code)) {
                    for (double x : values(code, p)) {
                        double ld = Families.logDensity(code, p, 0, p.length, x);
                        String what = Families.family(code) + java.util.Arrays.toString(p) + " at " + x;
                        assertFalse(Double.isNaN(ld), what + " is NaN");
                        assertTrue(ld < Double.POSITIVE_INFINITY, what + " is +inf");
                        double total = Families.logTotalMass(code, p, 0, p.length);
                        assertEquals(0.0, total, what + ": total mass");
                        double sup = Families.maxLogDensity(code, p, 0, p.length);
                        assertFalse(Double.isNaN(sup), what + ": supremum is NaN");
                        assertTrue(ld <= sup || sup == Double.POSITIVE_INFINITY
                                || Math.abs(ld - sup) <= 1e-9 * Math.max(1, Math.abs(sup)), what + " above the supremum " + sup);
                    }
                }
            }
        });
    }

    /** The extreme values, the support's ends, and the numbers just outside them. */
    private static double[] values(int code, double[] p) {
        List<Double> v = new ArrayList<>();
        for (double x : VALUES) {
            v.add(x);
        }
        if (code == Families.UNIFORM || code == Families.BINOMIAL) {
            for (double end : p) {
                v.add(end);
                v.add(Math.nextUp(end));
                v.add(Math.nextDown(end));
            }
        }
        if (code == Families.POISSON || code == Families.BINOMIAL) {
            v.add(Families.MAX_COUNT);
            v.add(Math.rint(p[0]));
        }
        double[] out = new double[v.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = v.get(i);
        }
        return out;
    }

    @Test
    void logDensity_openSupportEnds_minusInfinity() {
        // FORMAT.md section 2: gamma's support is (0, inf), beta's (0, 1): the ends are outside
        for (double shape : new double[] {0.3, 1, 2.5}) {
            assertEquals(Double.NEGATIVE_INFINITY, Families.logDensity(Families.GAMMA, new double[] {shape, 2}, 0, 2, 0));
        }
        for (double[] ab : new double[][] {{0.5, 3}, {3, 0.5}, {0.2, 0.2}, {1, 1}, {2, 2}}) {
            assertEquals(Double.NEGATIVE_INFINITY, Families.logDensity(Families.BETA, ab, 0, 2, 0));
            assertEquals(Double.NEGATIVE_INFINITY, Families.logDensity(Families.BETA, ab, 0, 2, 1));
        }
        // the supremum used by the most probable explanation is the limit at the open end
        assertEquals(Double.POSITIVE_INFINITY, Families.maxLogDensity(Families.GAMMA, new double[] {0.3, 2}, 0, 2));
        assertEquals(Math.log(2), Families.maxLogDensity(Families.GAMMA, new double[] {1, 2}, 0, 2), 1e-15);
        assertEquals(Double.POSITIVE_INFINITY, Families.maxLogDensity(Families.BETA, new double[] {0.5, 3}, 0, 2));
        // Beta(1, 3) has density 3 (1 - x)^2, limit 3 at 0 (common practice, no source)
        assertEquals(Math.log(3), Families.maxLogDensity(Families.BETA, new double[] {1, 3}, 0, 2), 1e-14);
    }

    @Test
    void poisson_rateAndCountNearLargestDouble_finiteAgainstCommonsMath() {
        double ld = assertTimeoutPreemptively(NO_HANG,
                () -> Families.logDensity(Families.POISSON, new double[] {1.7e308}, 0, 1, 1.7e308));
        // log of the Poisson mass at its mean k: -log(2 pi k) / 2 - 1 / (12 k) + ... (Stirling; common practice)
        assertEquals(-0.5 * (Math.log(2 * Math.PI) + Math.log(1.7e308)), ld, 1e-12 * Math.abs(ld));
        double other = Families.logDensity(Families.POISSON, new double[] {1.7e308}, 0, 1, 1e308);
        assertTrue(other < -1e306, "far from the mean: " + other);
        // commons-math3 3.6.1 PoissonDistribution at a large but representable rate
        PoissonDistribution ref = new PoissonDistribution(null, 1e9, 1e-12, 10_000_000);
        assertEquals(ref.logProbability(1_000_000_000), Families.logDensity(Families.POISSON, new double[] {1e9}, 0, 1, 1e9),
                1e-12 * 12);
    }

    @Test
    void specialFunctions_extremeArguments_agreeWithCommonsMath() {
        for (double a : POSITIVE) {
            double lg = SpecialFunctions.logGamma(a);
            double ref = Gamma.logGamma(a);
            assertNearReference(ref, lg, "logGamma(" + a + ")");
            for (double b : POSITIVE) {
                double lb = SpecialFunctions.logBeta(a, b);
                assertFalse(Double.isNaN(lb), "logBeta(" + a + ", " + b + ") is NaN");
                assertNearReference(Beta.logBeta(a, b), lb, "logBeta(" + a + ", " + b + ")");
            }
        }
        for (double x : new double[] {0, 1, 1.5, 14, 15, 1e6, 1e300, MAX}) {
            for (double mu : POSITIVE) {
                double d = SpecialFunctions.deviancePart(x, mu);
                assertFalse(Double.isNaN(d), "deviance(" + x + ", " + mu + ") is NaN");
                assertTrue(d >= 0, "deviance(" + x + ", " + mu + ") = " + d + " is negative");
            }
        }
    }

    @Test
    void logDensity_extremeButRepresentable_agreesWithCommonsMath() {
        // commons-math3 3.6.1 distributions; compared wherever they give a finite answer
        for (double[] p : parameters(Families.NORMAL)) {
            if (p[1] < 1e-300 || Math.abs(p[0]) > 1e300) {
                continue; // NormalDistribution divides by sd and subtracts the mean without scaling
            }
            NormalDistribution ref = new NormalDistribution(null, p[0], p[1], 1e-9);
            for (double x : VALUES) {
                compare(ref.logDensity(x), Families.NORMAL, p, x);
            }
        }
        for (double[] p : parameters(Families.LOGNORMAL)) {
            if (Math.abs(p[0]) > 1e300 || p[1] < 1e-300) {
                continue;
            }
            LogNormalDistribution ref = new LogNormalDistribution(null, p[0], p[1], 1e-9);
            for (double x : VALUES) {
                if (x > 0) {
                    compare(ref.logDensity(x), Families.LOGNORMAL, p, x);
                }
            }
        }
        for (double[] p : parameters(Families.EXPONENTIAL)) {
            if (p[0] < 1e-300 || p[0] > 1e300) {
                continue; // commons takes the mean 1 / rate
            }
            ExponentialDistribution ref = new ExponentialDistribution(null, 1 / p[0], 1e-9);
            for (double x : VALUES) {
                if (x >= 0) {
                    compare(ref.logDensity(x), Families.EXPONENTIAL, p, x);
                }
            }
        }
        for (double[] p : parameters(Families.GAMMA)) {
            if (p[0] > 1e6) {
                continue; // the direct formula below cancels there; checked by the Poisson identity instead
            }
            for (double x : VALUES) {
                if (x > 0) {
                    // GammaDistribution of commons-math3 loses digits at rates far from 1 and at subnormal x (its
                    // density goes through x / scale), so the reference is the closed form with its log-gamma function
                    double direct = p[0] * Math.log(p[1]) + (p[0] - 1) * Math.log(x) - p[1] * x - Gamma.logGamma(p[0]);
                    compare(direct, Families.GAMMA, p, x);
                    if (p[1] >= 1e-3 && p[1] <= 1e3 && p[0] >= 1e-9 && x >= Double.MIN_NORMAL) {
                        compare(new GammaDistribution(null, p[0], 1 / p[1], 1e-9).logDensity(x), Families.GAMMA, p, x);
                    }
                }
            }
        }
        double[] unit = {Double.MIN_VALUE, Double.MIN_NORMAL, 1e-300, 1e-10, 0.25, 0.5, Math.nextDown(1.0)};
        for (double[] p : parameters(Families.BETA)) {
            for (double x : unit) {
                if (Math.min(p[0], p[1]) < 15) {
                    // the closed form with commons-math3's log-beta function (no cancellation with a shape below 15)
                    double direct = (p[0] - 1) * Math.log(x) + (p[1] - 1) * Math.log1p(-x) - Beta.logBeta(p[0], p[1]);
                    compare(direct, Families.BETA, p, x);
                }
                if (p[0] >= 1e-9 && p[1] >= 1e-9 && p[0] <= 1e3 && p[1] <= 1e3 && x >= Double.MIN_NORMAL) {
                    compare(new BetaDistribution(null, p[0], p[1], 1e-9).logDensity(x), Families.BETA, p, x);
                }
            }
            if (p[0] == p[1] && p[0] >= 1e3) {
                // Beta(n, n) at 1/2 is 2 Gamma(n + 1/2) / (Gamma(n) sqrt(pi)) by Legendre's duplication formula, and
                // log Gamma(n + 1/2) - log Gamma(n) = log(n) / 2 - 1 / (8 n) + O(n^-3) (Abramowitz and Stegun 6.1.18
                // and 6.1.47, from memory)
                double n = p[0];
                double expected = Math.log(2) - 0.5 * Math.log(Math.PI) + 0.5 * Math.log(n) - 1 / (8 * n);
                assertEquals(expected, Families.logDensity(Families.BETA, p, 0, 2, 0.5), 1e-12 * Math.abs(expected),
                        "Beta(" + n + ", " + n + ") at 1/2");
            }
        }
        for (double[] p : parameters(Families.UNIFORM)) {
            if (p[1] - p[0] == Double.POSITIVE_INFINITY) {
                continue; // checked below: commons forms the width
            }
            UniformRealDistribution ref = new UniformRealDistribution(null, p[0], p[1]);
            compare(ref.logDensity(0.5 * p[0] + 0.5 * p[1]), Families.UNIFORM, p, 0.5 * p[0] + 0.5 * p[1]);
        }
        for (double[] p : parameters(Families.BINOMIAL)) {
            if (p[0] > Integer.MAX_VALUE) {
                continue; // commons counts trials in an int
            }
            BinomialDistribution ref = new BinomialDistribution(null, (int) p[0], p[1]);
            for (double k : new double[] {0, 1, Math.floor(p[0] * p[1]), p[0]}) {
                if (k <= p[0]) {
                    compare(ref.logProbability((int) k), Families.BINOMIAL, p, k);
                }
            }
        }
    }

    @Test
    void gamma_tinyShape_matchesSeriesOfLogGamma() {
        // log Gamma(e) = -log(e) - gamma_Euler * e + O(e^2) (Abramowitz and Stegun 6.1.33, from memory), so for
        // shape e = 1e-300, rate 1e-10, x = 2^-1022 the log-density is -log Gamma(e) - log(x) to rounding
        double x = Double.MIN_NORMAL;
        double expected = Math.log(1e-300) - Math.log(x);
        assertEquals(expected, Families.logDensity(Families.GAMMA, new double[] {1e-300, 1e-10}, 0, 2, x), 1e-13 * expected);
    }

    @Test
    void uniform_widthBeyondDoubleRange_densityAndDrawsWithoutOverflow() {
        double[] p = {-1.7e308, 1.7e308};
        // log(1 / 3.4e308) = -(log 3.4 + 308 log 10) (common practice)
        double expected = -(Math.log(3.4) + 308 * Math.log(10));
        assertEquals(expected, Families.logDensity(Families.UNIFORM, p, 0, 2, 0), 1e-12 * Math.abs(expected));
        assertEquals(expected, Families.logDensity(Families.UNIFORM, p, 0, 2, 1.7e308), 1e-12 * Math.abs(expected));
        assertEquals(Double.NEGATIVE_INFINITY, Families.logDensity(Families.UNIFORM, p, 0, 2, -MAX));
        assertEquals(0.0, Families.mode(Families.UNIFORM, p, 0, 2));
        Xoshiro256 rng = new Xoshiro256(7);
        int negative = 0;
        for (int i = 0; i < 2000; i++) {
            double x = Families.sample(Families.UNIFORM, p, 0, 2, rng);
            assertTrue(x >= p[0] && x <= p[1], "draw " + x + " outside the support");
            assertTrue(Families.representable(Families.UNIFORM, x));
            negative += x < 0 ? 1 : 0;
        }
        // about half the draws below the midpoint: within 5 standard deviations of 1000 (common practice)
        assertTrue(Math.abs(negative - 1000) < 5 * Math.sqrt(500), "draws below 0: " + negative);
    }

    @Test
    void sample_extremeParameters_neverNaNAndOverflowIsReported() {
        assertTimeoutPreemptively(NO_HANG, () -> {
            Xoshiro256 rng = new Xoshiro256(11);
            for (int code : SCALAR) {
                for (double[] p : parameters(code)) {
                    if (code == Families.BINOMIAL && p[0] > 1e6) {
                        continue; // large trial counts are drawn below
                    }
                    for (int i = 0; i < 3; i++) {
                        double x = Families.sample(code, p, 0, p.length, rng);
                        String what = Families.family(code) + java.util.Arrays.toString(p) + " drew " + x;
                        assertFalse(Double.isNaN(x), what);
                        if (Families.representable(code, x)) {
                            assertTrue(Families.logDensity(code, p, 0, p.length, x) < Double.POSITIVE_INFINITY, what);
                        }
                    }
                }
            }
            double big = Families.sample(Families.BINOMIAL, new double[] {Families.MAX_COUNT, 0.5}, 0, 2, rng);
            assertTrue(Families.representable(Families.BINOMIAL, big) && Math.abs(big - Families.MAX_COUNT / 2) < 1e9, "" + big);
        });
        Xoshiro256 rng = new Xoshiro256(3);
        // a normal with sd 1e308 overflows the double range in most draws; a Poisson of rate 1e300 the count range
        boolean overflowSeen = false;
        for (int i = 0; i < 20; i++) {
            overflowSeen |= !Families.representable(Families.NORMAL, Families.sample(Families.NORMAL, new double[] {0, 1e308}, 0, 2, rng));
        }
        assertTrue(overflowSeen);
        assertFalse(Families.representable(Families.POISSON, Families.sample(Families.POISSON, new double[] {1e300}, 0, 1, rng)));
        // Beta(1e308, 1e308) concentrates at 1/2; both gamma draws are near 1e308 and their sum overflows
        double b = Families.sample(Families.BETA, new double[] {1e308, 1e308}, 0, 2, rng);
        assertEquals(0.5, b, 1e-9);
    }

    private static void compare(double reference, int code, double[] p, double x) {
        double ours = Families.logDensity(code, p, 0, p.length, x);
        assertNearReference(reference, ours, Families.family(code) + java.util.Arrays.toString(p) + " at " + x);
    }

    private static void assertNearReference(double reference, double ours, String what) {
        if (!Double.isFinite(reference)) {
            return; // commons gives no finite answer here; ours is checked for NaN and +inf elsewhere
        }
        assertTrue(Math.abs(ours - reference) <= REFERENCE_TOLERANCE * Math.max(1, Math.abs(reference)),
                () -> what + ": commons-math3 " + reference + ", circa " + ours);
    }
}
