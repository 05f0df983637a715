package dev.circa.validator.regression;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The text of a reference set: malformed bytes located where they are, header names exact as written. */
class ReferenceSetTextTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");

    @TempDir
    Path dir;

    @Test
    void checkReference_malformedByteFarIntoTheFile_locatedAtItsLineAndColumn() throws Exception {
        // 30,000 rows (about 1 MB, many reads of the CSV reader's buffer); row 25,000's label is "op",
        // the byte 0xFF, "n": 0xFF never occurs in UTF-8 (RFC 3629 section 1), nor starts UTF-16/32
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.write("inlet_pressure,valve,log_density\n".getBytes(StandardCharsets.US_ASCII));
        for (int row = 1; row <= 30_000; row++) {
            if (row == 25_000) {
                b.write("3.0,op".getBytes(StandardCharsets.US_ASCII));
                b.write(0xFF);
                b.write("n,0.18261296103078395\n".getBytes(StandardCharsets.US_ASCII));
            } else {
                b.write("3.0,open,0.18261296103078395\n".getBytes(StandardCharsets.US_ASCII));
            }
        }
        Path p = dir.resolve("reference.csv");
        Files.write(p, b.toByteArray());
        RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(new CircuitReader().read(EXAMPLE)),
                Tolerance.DEFAULT);
        FormatException e = assertThrows(FormatException.class, () -> check.checkReference(p, ReadLimits.DEFAULT));
        assertEquals(25_001, e.line(), e.getMessage());
        assertEquals(7, e.column(), e.getMessage());
        assertTrue(e.getMessage().contains("byte 0xFF is not UTF-8 text"), e.getMessage());
    }
}
