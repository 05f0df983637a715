package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** eval, impute and sample say on standard error how many rows they wrote to the file named by -o. */
class WroteRowsTest {
    @TempDir
    Path tmp;

    private static long dataLines(Path csv) throws Exception {
        try (var lines = Files.lines(csv)) {
            return lines.count() - 1;
        }
    }

    @Test
    void sample_toFile_saysRowsWrittenWithThousandsSeparator() throws Exception {
        Path out = tmp.resolve("s.csv");
        Cli.Result r = Cli.run("sample", Cli.EXAMPLE.toString(), "-n", "1000", "--seed", "3", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        assertTrue(r.err().contains("circa sample: wrote 1,000 rows to " + out + "\n"), r::toString);
        assertEquals(1000, dataLines(out));
        Cli.Result one = Cli.run("sample", Cli.EXAMPLE.toString(), "-n", "1", "-o", out.toString());
        assertTrue(one.err().contains("circa sample: wrote 1 row to " + out + "\n"), one::toString);
    }

    @Test
    void evalAndImpute_toFile_sayRowsWritten_toStandardOutput_sayNothing() throws Exception {
        // the rows of the data file (comment lines and the header aside) are the rows written
        long rows = Files.readAllLines(Cli.READINGS).stream().filter(l -> !l.startsWith("#") && !l.isBlank()).count() - 1;
        Path out = tmp.resolve("e.csv");
        Cli.Result e = Cli.run("eval", Cli.EXAMPLE.toString(), "--data", Cli.READINGS.toString(), "-o", out.toString());
        assertEquals(ExitStatus.OK, e.status(), e::toString);
        assertEquals(rows, dataLines(out));
        assertTrue(e.err().contains("circa eval: wrote " + rowsText(rows) + " to " + out + "\n"), e::toString);
        Path imp = tmp.resolve("i.csv");
        Cli.Result i = Cli.run("impute", Cli.EXAMPLE.toString(), "--data", Cli.READINGS.toString(), "-o", imp.toString());
        assertEquals(ExitStatus.OK, i.status(), i::toString);
        assertTrue(i.err().contains("circa impute: wrote " + rowsText(rows) + " to " + imp + "\n"), i::toString);
        Cli.Result std = Cli.run("eval", Cli.EXAMPLE.toString(), "--data", Cli.READINGS.toString());
        assertFalse(std.err().contains("wrote"), std::toString);
    }

    private static String rowsText(long n) {
        return String.format(java.util.Locale.ROOT, "%,d row%s", n, n == 1 ? "" : "s");
    }
}
