package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.StringReader;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Every value written as a CSV cell reads back as the same value of its variable (FORMAT.md section 5:
 * a cell equal to a label is that state; cells are values exactly as written). Labels that differ only by
 * surrounding white space are distinct states.
 */
class CellValuesRoundTripTest {
    @Test
    void parse_labelsDifferingBySurroundingSpace_exactLabelWins() throws FormatException {
        Variable v = new Variable("valve", VariableType.CATEGORICAL, List.of("a", " a", "a ", "\tb"), null, null);
        for (int k = 0; k < 4; k++) {
            String cell = CellValues.format(v, k);
            assertEquals(k, CellValues.parse(v, cell), "state " + k + " written as \"" + cell + "\"");
            // through the CSV reader: the cell as written, quoted or not
            String csv = "valve\n\"" + cell + "\"\n" + (cell.startsWith("\t") ? "" : cell + "\n");
            try (CsvReader r = new CsvReader(new StringReader(csv), "t.csv", ReadLimits.DEFAULT)) {
                r.next();
                List<String> rec;
                while ((rec = r.next()) != null) {
                    assertEquals(k, CellValues.parse(v, rec.get(0)), "state " + k + " read from " + rec);
                }
            }
        }
        // a cell that is no label is still read as the stripped label or index, as before
        assertEquals(3, CellValues.parse(v, " 3 "));
    }

    @Test
    void parse_countsUpToTwoToThe53_beyondRefused() {
        Variable c = Variable.of("restarts", VariableType.COUNT);
        long max = CellValues.MAX_COUNT;
        assertEquals((double) max, CellValues.parse(c, CellValues.format(c, max)));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> CellValues.parse(c, "9007199254740993"));
        assertTrue(e.getMessage().contains("is a count from 0 to 9007199254740992"), e.getMessage());
        Variable x = Variable.of("x", VariableType.REAL);
        for (double d : new double[] {Double.MAX_VALUE, -Double.MAX_VALUE, Double.MIN_VALUE, Double.MIN_NORMAL, -0.0}) {
            assertEquals(d, CellValues.parse(x, CellValues.format(x, d)));
        }
    }
}
