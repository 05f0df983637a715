package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertFalse;

import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A byte that is not UTF-8 far into a data CSV or a reference set (past the reader's first buffer of
 * 64 Ki characters): eval and check stop with one message at the byte's own line and column, exit 2,
 * nothing written.
 */
class CliMalformedBytesTest {
    @TempDir
    Path tmp;

    /** {@code rows} rows of {@code row}, and on row {@code bad} its text up to {@code at}, the byte 0xC3 alone, the rest. */
    private Path file(String name, String header, String row, int rows, int bad, int at) throws Exception {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.write(header.getBytes(StandardCharsets.US_ASCII));
        for (int r = 1; r <= rows; r++) {
            byte[] line = row.getBytes(StandardCharsets.US_ASCII);
            if (r == bad) {
                b.write(line, 0, at);
                // 0xC3 starts a two-byte sequence; a comma is no continuation byte (RFC 3629 section 4)
                b.write(0xC3);
                b.write(line, at, line.length - at);
            } else {
                b.write(line);
            }
        }
        return Files.write(tmp.resolve(name), b.toByteArray());
    }

    @Test
    void eval_malformedByteOnRow20000_locatedThere() throws Exception {
        Path data = file("data.csv", "inlet_pressure,valve\n", "3.0,open\n", 30_000, 20_000, 3);
        Path out = tmp.resolve("out.csv");
        Cli.Result r = Cli.run("eval", Cli.EXAMPLE.toString(), "--data", data.toString(), "-o", out.toString());
        Cli.assertUnusable(r, data + ":20001:4", "0xC3");
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    void check_malformedByteOnRow20000_locatedThere() throws Exception {
        // 0.18261296103078395: the example's log-density at 3.0, open (FORMAT.md, computed with SciPy 1.10)
        Path ref = file("ref.csv", "inlet_pressure,valve,log_density\n", "3.0,open,0.18261296103078395\n", 30_000,
                20_000, 8);
        Cli.Result r = Cli.run("check", Cli.EXAMPLE.toString(), "--reference", ref.toString());
        Cli.assertUnusable(r, ref + ":20001:9", "0xC3");
    }
}
