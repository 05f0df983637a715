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
}
