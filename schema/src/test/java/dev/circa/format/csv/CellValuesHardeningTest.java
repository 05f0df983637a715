package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;

import dev.circa.format.Variable;
import java.time.Duration;
import org.junit.jupiter.api.Test;

/** Cells that once took minutes: every cell ends in bounded time (a hang guard, not a timing test). */
class CellValuesHardeningTest {
    private static final Variable REAL = CsvReaderFuzzTest.VARIABLES.get(0);
    private static final Duration GUARD = Duration.ofSeconds(30);

    @Test
    void parse_millionDigitsThenALetter_rejectedInBoundedTime() {
        // A backtracking pattern needed about 73 s for 100,000 digits and a letter, and hours for a MiB.
        String cell = "1".repeat(1 << 20) + "x";
        assertTimeoutPreemptively(GUARD, () -> {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> CellValues.parse(REAL, cell));
            assertEquals(true, e.getMessage().contains("is not a number"), e.getMessage());
            assertThrows(IllegalArgumentException.class, () -> CellValues.parseLogDensity(cell));
        });
    }

    @Test
    void parse_millionDigitNumber_readInBoundedTime() {
        // 10^(2^20 - 1) is beyond the largest double, about 1.8e308 (IEEE 754 binary64, common practice).
        String big = "9".repeat(1 << 20);
        String small = "0." + "0".repeat(1 << 20) + "1";
        assertTimeoutPreemptively(GUARD, () -> {
            assertThrows(IllegalArgumentException.class, () -> CellValues.parse(REAL, big));
            assertEquals(0.0, CellValues.parse(REAL, small));
            assertThrows(IllegalArgumentException.class, () -> CellValues.parseLogDensity(big));
        });
    }

    @Test
    void parse_decimalForms_sameAsJavaGrammar() {
        // Double.parseDouble (Java SE API, FloatingDecimal grammar) agrees on every accepted form.
        for (String s : new String[] {"1", "-1", "+1", "1.", ".5", "-.5", "1e3", "1E-3", "1.5e+2", "0.0", "-0"}) {
            assertEquals(Double.parseDouble(s), CellValues.parse(REAL, s), s);
            assertEquals(Double.parseDouble(s), CellValues.parseLogDensity(s), s);
        }
        for (String s : new String[] {".", "-", "+", "e3", "1e", "1e+", "1.2.3", "1x", "0x10", "1d", "1f", "NaN", "Infinity",
            "1 2", "--1", "1e3.5"}) {
            assertThrows(IllegalArgumentException.class, () -> CellValues.parse(REAL, s), s);
        }
    }

    @Test
    void parse_manyDecimals_sameDoubleAsJavaParserToTheBit() {
        // Reference: Double.parseDouble (Java SE API), which rounds every decimal to the nearest double.
        // Written doubles (Double.toString: 17 digits at most), digit strings of 1 to 40 digits with
        // exponents across the whole range, subnormals, and the cases where rounding is hardest (halfway
        // between two doubles, the edges of the range; the values are common practice for decimal parsers).
        java.util.SplittableRandom rnd = new java.util.SplittableRandom(20261203);
        java.util.List<String> cells = new java.util.ArrayList<>(java.util.List.of("9007199254740993", "9007199254740995",
                "2.2250738585072011e-308", "2.2250738585072012e-308", "4.9e-324", "2.4703282292062327e-324",
                "2.4703282292062328e-324", "1.7976931348623157e308", "1.7976931348623158e308", "0.1", "0.3",
                "1.00000000000000011102230246251565404236316680908203125", "123456789012345678901234567890",
                "-0.0", "+0e999", "0.000000000000000000000000000000001e-290"));
        for (int i = 0; i < 100_000; i++) {
            double d = Double.longBitsToDouble(rnd.nextLong());
            if (Double.isFinite(d)) {
                cells.add(Double.toString(d));
            }
            StringBuilder b = new StringBuilder();
            if (rnd.nextBoolean()) {
                b.append(rnd.nextBoolean() ? '-' : '+');
            }
            int digits = 1 + rnd.nextInt(rnd.nextBoolean() ? 17 : 40);
            int point = rnd.nextInt(digits + 1);
            for (int k = 0; k < digits; k++) {
                if (k == point) {
                    b.append('.');
                }
                b.append((char) ('0' + rnd.nextInt(10)));
            }
            if (rnd.nextBoolean()) {
                b.append(rnd.nextBoolean() ? 'e' : 'E').append(rnd.nextInt(-345, 330));
            }
            cells.add(b.toString());
        }
        int finite = 0;
        for (String s : cells) {
            double want = Double.parseDouble(s);
            if (Double.isFinite(want)) {
                assertEquals(Double.doubleToRawLongBits(want), Double.doubleToRawLongBits(CellValues.parse(REAL, s)), s);
                assertEquals(Double.doubleToRawLongBits(want), Double.doubleToRawLongBits(CellValues.parseLogDensity(s)), s);
                finite++;
            } else {
                assertThrows(IllegalArgumentException.class, () -> CellValues.parse(REAL, s), s);
                assertThrows(IllegalArgumentException.class, () -> CellValues.parseLogDensity(s), s);
            }
        }
        assertEquals(true, finite > 190_000, "finite cells compared: " + finite);
    }
}
