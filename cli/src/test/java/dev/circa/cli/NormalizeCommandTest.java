package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.SumNode;
import dev.circa.format.io.CircuitReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class NormalizeCommandTest {
    @TempDir
    Path dir;

    /**
     * FORMAT.md's example with its first categorical doubled and the output weight above it halved and
     * then all output weights doubled: every value is 4 times the example's, its checks shifted by log 4.
     */
    private Path scaled() throws Exception {
        String json = Files.readString(CheckCommandTest.EXAMPLE)
                .replace("\"weights\": [0.85, 0.15]", "\"weights\": [1.7, 0.6]")
                .replace("\"probs\": [0.05, 0.15, 0.80]", "\"probs\": [0.1, 0.3, 1.6]")
                .replace("\"logDensity\": 0.18261296103078395", "\"logDensity\": " + (0.18261296103078395 + Math.log(4)))
                .replace("\"logDensity\": -2.1428574782131147", "\"logDensity\": " + (-2.1428574782131147 + Math.log(4)));
        Path p = dir.resolve("scaled.json");
        Files.writeString(p, json);
        return p;
    }

    @Test
    void normalize_scaledExample_recoversTheExampleAndReportsLogZ() throws Exception {
        Path in = scaled();
        Path out = dir.resolve("normalized.json");
        Cli.Result r = Cli.run("normalize", in.toString(), "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        Matcher m = Pattern.compile("output joint: log Z (\\S+) before, (\\S+) after").matcher(r.err());
        assertTrue(m.find(), r::toString);
        // the output's mass: 1.7 * 2 (the doubled categorical) + 0.6 * 1 = 4
        assertEquals(Math.log(4), Double.parseDouble(m.group(1)), 1e-12);
        assertEquals(0, Double.parseDouble(m.group(2)), 1e-12);
        assertTrue(r.err().contains("1 sum and 1 categorical input rescaled"), r::toString);
        CircuitDocument doc = new CircuitReader().read(out);
        SumNode root = (SumNode) doc.nodes().get(6);
        // the original numbers of FORMAT.md's example
        assertEquals(0.85, root.weight(0), 1e-12);
        assertEquals(0.15, root.weight(1), 1e-12);
        assertArrayEquals(new double[] {0.05, 0.15, 0.80}, ((InputNode) doc.nodes().get(1)).params(), 1e-15);
        Cli.Result cmp = Cli.run("compare", out.toString(), CheckCommandTest.EXAMPLE.toString());
        assertEquals(ExitStatus.OK, cmp.status(), cmp::toString);
        // the shifted checks are the SciPy 1.10 values of FORMAT.md again
        Cli.Result check = Cli.run("check", out.toString());
        assertEquals(ExitStatus.OK, check.status(), check::toString);
    }

    @Test
    void normalize_outputNamesTheInput_refusedWithStatus2() throws Exception {
        Path in = scaled();
        String before = Files.readString(in);
        Cli.Result r = Cli.run("normalize", in.toString(), "-o", in.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.err().contains("refusing to write over an input file"), r::toString);
        assertEquals(before, Files.readString(in));
    }

    @Test
    void normalize_notDecomposable_refusedWithStatus2AndNoOutput() throws Exception {
        Path in = dir.resolve("overlap.json");
        Files.writeString(in, ValidateCommandTest.OVERLAP);
        Path out = dir.resolve("never.json");
        Cli.Result r = Cli.run("normalize", in.toString(), "-o", out.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        // CLI.md: a decomposability diagnostic names the product and a variable its children share
        assertTrue(r.err().contains("inlet_pressure"), r::toString);
        assertFalse(Files.exists(out));
    }
}
