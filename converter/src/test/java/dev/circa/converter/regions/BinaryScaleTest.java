package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigDecimal;
import java.math.MathContext;
import org.junit.jupiter.api.Test;

/**
 * The power-of-two arithmetic of the linear region evaluation ({@link BinaryScale}): exact powers of two against
 * {@link Math#scalb} (the JDK), and log(y * 2^E) for |E| up to 2^21 against 40-digit decimal arithmetic with ln 2
 * to 60 digits (handbook value, from memory; checked here against the split constant to 2^-85).
 */
class BinaryScaleTest {
    private static final MathContext DIGITS = new MathContext(40);
    private static final BigDecimal LN2 = new BigDecimal("0.693147180559945309417232121458176568075500134360255254120680");

    @Test
    void pow2_equalsScalbOfOne_normalSubnormalAndZero() {
        for (long k = -1100; k <= 1023; k++) {
            assertEquals(Math.scalb(1.0, (int) k), BinaryScale.pow2(k), "2^" + k);
        }
    }

    @Test
    void exponent_isFloorOfLog2_subnormalsIncluded() {
        // reference: Math.getExponent of the number scaled into the normal range by an exact power of two (the JDK)
        double[] w = {Double.MIN_VALUE, 3 * Double.MIN_VALUE, 0x1p-1050, Double.MIN_NORMAL, 0.3, 1, 1.9999, 2, 1e300, Double.MAX_VALUE};
        int[] want = {-1074, -1073, -1050, -1022, -2, 0, 0, 1, 996, 1023};
        for (int i = 0; i < w.length; i++) {
            assertEquals(want[i], BinaryScale.exponent(w[i]), "floor(log2 " + w[i] + ")");
        }
    }

    @Test
    void splitLn2_sumsToLn2() {
        BigDecimal split = new BigDecimal(BinaryScale.LN2_HI).add(new BigDecimal(BinaryScale.LN2_LO));
        assertTrue(split.subtract(LN2).abs().compareTo(new BigDecimal("1e-25")) < 0, split.toString());
        assertEquals(21, Long.numberOfTrailingZeros(Double.doubleToRawLongBits(BinaryScale.LN2_HI)));
    }

    @Test
    void log_ofScaledValue_withinOneUlp_forLargeExponents() {
        double[] ys = {1, 1.5, 1.9999999, 0x1p-900, 3.7};
        long[] es = {0, 1, -1, 999, -1000, 1001, -1075, 14427, -14428, 1 << 20, -(1 << 21) + 1, 5_000_000L, -123_456_789L};
        for (double y : ys) {
            for (long e : es) {
                double got = BinaryScale.log(y, e);
                // log y to 40 digits: log of the double y, from Math.log's value corrected by one Newton step in decimal
                BigDecimal want = logDecimal(y).add(LN2.multiply(BigDecimal.valueOf(e), DIGITS), DIGITS);
                double err = new BigDecimal(got).subtract(want).abs().doubleValue();
                assertTrue(err <= Math.ulp(got) + Math.ulp(Math.log(y)), "log(" + y + " * 2^" + e + "): " + got + ", want " + want);
            }
        }
    }

    @Test
    void linear_ofLogValue_relativeErrorAFewUlps_farFromZero() {
        // e^(v - E ln 2) with E = floor(v / ln 2), v from -1e5 to +1e5: against e^(exact difference) in decimal
        for (double v : new double[] {-1e5 - 0.3, -14000.25, -745.5, -0.5, 0, 0.7, 690.1, 2000.75, 99_999.9}) {
            long e = BinaryScale.exponentOf(v);
            double y = BinaryScale.linear(v, e);
            BigDecimal d = new BigDecimal(v).subtract(LN2.multiply(BigDecimal.valueOf(e), DIGITS), DIGITS);
            double want = Math.exp(d.doubleValue());
            assertTrue(y >= 0.999999 && y < 2.000001, "in [1, 2): " + y + " at " + v);
            assertTrue(Math.abs(y - want) <= 4 * Math.ulp(want), "e^(" + v + " - " + e + " ln 2): " + y + ", want " + want);
        }
    }

    /** log y to about 40 digits for a double y {@literal >} 0: Math.log's value refined by Newton steps on e^x = y. */
    private static BigDecimal logDecimal(double y) {
        BigDecimal x = new BigDecimal(Math.log(y));
        BigDecimal target = new BigDecimal(y);
        for (int step = 0; step < 2; step++) {
            BigDecimal ex = expDecimal(x);
            x = x.add(target.subtract(ex, DIGITS).divide(ex, DIGITS), DIGITS);
        }
        return x;
    }

    /** e^x by its Taylor series after halving x until it is small (then squaring back), to about 40 digits. */
    private static BigDecimal expDecimal(BigDecimal x) {
        int halvings = 0;
        BigDecimal r = x;
        while (r.abs().compareTo(new BigDecimal("0.01")) > 0) {
            r = r.divide(BigDecimal.valueOf(2), DIGITS);
            halvings++;
        }
        BigDecimal sum = BigDecimal.ONE;
        BigDecimal term = BigDecimal.ONE;
        for (int n = 1; n < 40; n++) {
            term = term.multiply(r, DIGITS).divide(BigDecimal.valueOf(n), DIGITS);
            sum = sum.add(term, DIGITS);
        }
        for (int i = 0; i < halvings; i++) {
            sum = sum.multiply(sum, DIGITS);
        }
        return sum;
    }
}
