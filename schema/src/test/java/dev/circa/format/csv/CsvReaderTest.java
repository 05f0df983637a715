package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.StringReader;
import java.util.List;
import org.junit.jupiter.api.Test;

class CsvReaderTest {
    private static CsvReader reader(String text) {
        return new CsvReader(new StringReader(text), "t.csv", ReadLimits.DEFAULT);
    }

    @Test
    void next_commentsBlankLinesQuotesAndCrlf_recordsWithLines() throws Exception {
        CsvReader r = reader("# comment\r\na,b\r\n\r\n\"x, \"\"y\"\"\",\n1,\"multi\nline\"\n");
        assertEquals(List.of("a", "b"), r.next());
        assertEquals(2, r.line());
        assertEquals(List.of("x, \"y\"", ""), r.next());
        assertEquals(4, r.line());
        assertEquals(List.of("1", "multi\nline"), r.next());
        assertEquals(5, r.line());
        assertNull(r.next());
        assertNull(r.next(), "the end of the file stays the end");
    }

    @Test
    void next_unterminatedQuote_locatedError() {
        CsvReader r = reader("a,b\n1,\"open\n");
        FormatException e = assertThrows(FormatException.class, () -> {
            r.next();
            r.next();
        });
        assertEquals(2, e.line());
        assertEquals(3, e.column());
        assertTrue(e.getMessage().contains("quoted field"), e.getMessage());
    }

    @Test
    void parse_labelsIndicesCountsAndReals_asFormatSection5() {
        Variable valve = new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null);
        assertEquals(2.0, CellValues.parse(valve, "open"));
        assertEquals(1.0, CellValues.parse(valve, "1"));
        assertTrue(Double.isNaN(CellValues.parse(valve, "")));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(valve, "3"));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(valve, "ajar"));
        Variable restarts = Variable.of("restarts", VariableType.COUNT);
        assertEquals(4.0, CellValues.parse(restarts, "4"));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(restarts, "-1"));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(restarts, "2.5"));
        Variable p = Variable.of("p", VariableType.REAL);
        assertEquals(-2.5e-3, CellValues.parse(p, "-2.5e-3"));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(p, "NaN"));
        assertThrows(IllegalArgumentException.class, () -> CellValues.parse(p, "1e999"));
        assertEquals(Double.NEGATIVE_INFINITY, CellValues.parseLogDensity("-inf"));
    }
}
