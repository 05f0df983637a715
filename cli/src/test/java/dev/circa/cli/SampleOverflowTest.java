package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every value {@code sample} writes reads back as a value of its variable; a draw that overflows the
 * double range (IEEE 754: the largest finite double is 1.7976931348623157e308) or the count range
 * (IEEE 754: 2^53 is the last integer of an unbroken run a double holds exactly) stops the command
 * with one message naming the input node, and nothing is written.
 */
class SampleOverflowTest {
    private static final Path EXTREME = Path.of("..", "schema", "src", "test", "resources", "dev", "circa",
            "format", "io", "CircuitReaderFuzzTestInputs", "read", "valid-extreme-numbers.json");

    @TempDir
    Path tmp;

    private Path circuit(String variable, String input) throws Exception {
        Path p = tmp.resolve("c.json");
        Files.writeString(p, "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [" + variable + "],"
                + " \"nodes\": [{\"id\": 7, \"var\": 0, " + input + "}], \"outputs\": [{\"name\": \"o\", \"node\": 7}]}");
        return p;
    }

    private void assertRefused(Path c, String family) {
        Path out = tmp.resolve("out.csv");
        Cli.Result r = Cli.run("sample", c.toString(), "-n", "200", "--seed", "5", "-o", out.toString());
        Cli.assertUnusable(r, c.toString(), "input node 7 (" + family + ")");
        assertTrue(r.message().contains("variable v"), r::describe);
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    void normalWithHugeSd_drawsInfinity_refusedNamingTheNode() throws Exception {
        // mean + sd * z with sd = 1e308 passes the largest double once |z| > 1.8 (IEEE 754 overflow).
        assertRefused(circuit("{\"name\": \"v\", \"type\": \"real\"}", "\"input\": \"normal\", \"mean\": 0, \"sd\": 1e308"),
                "normal");
    }

    @Test
    void poissonWithHugeRate_drawsPastTwoToThe53_refusedNamingTheNode() throws Exception {
        // A Poisson draw is near its rate (1e300), far past 2^53 = 9007199254740992.
        assertRefused(circuit("{\"name\": \"v\", \"type\": \"count\"}", "\"input\": \"poisson\", \"rate\": 1e300"),
                "poisson");
    }

    @Test
    void extremeSeedFixture_exponentialOfTinyRate_refusedNamingNode9() {
        // The fuzz seed's node 9 is an exponential of rate 4.9e-324: -log(u) / rate passes the largest double.
        Path out = tmp.resolve("extreme.csv");
        Cli.Result r = Cli.run("sample", EXTREME.toString(), "-n", "200", "--seed", "3", "-o", out.toString());
        Cli.assertUnusable(r, EXTREME.toString(), "input node 9 (exponential)");
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    void extremeButRepresentableDraws_readBackByEval() throws Exception {
        // Near the ends of double range but inside it: exp(709.7) ~ 1.65e308 < 1.7976931348623157e308
        // (IEEE 754), a binomial of 2^53 trials, sub-normal rates and probabilities.
        Path c = tmp.resolve("edge.json");
        Files.writeString(c, "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": ["
                + "{\"name\": \"x\", \"type\": \"real\"}, {\"name\": \"z\", \"type\": \"real\"},"
                + " {\"name\": \"u\", \"type\": \"real\"}, {\"name\": \"c\", \"type\": \"count\"},"
                + " {\"name\": \"k\", \"type\": \"count\"}], \"nodes\": ["
                + "{\"id\": 0, \"input\": \"lognormal\", \"var\": 0, \"mu\": 709.7, \"sigma\": 4.9e-324},"
                + "{\"id\": 1, \"input\": \"beta\", \"var\": 1, \"alpha\": 1e308, \"beta\": 1e308},"
                + "{\"id\": 2, \"input\": \"uniform\", \"var\": 2, \"low\": -1.7e308, \"high\": 1.7e308},"
                + "{\"id\": 3, \"input\": \"poisson\", \"var\": 3, \"rate\": 4.9e-324},"
                + "{\"id\": 4, \"input\": \"binomial\", \"var\": 4, \"trials\": 9007199254740992, \"p\": 0.5},"
                + "{\"id\": 5, \"product\": [0, 1, 2, 3, 4]}], \"outputs\": [{\"name\": \"o\", \"node\": 5}]}");
        Path out = tmp.resolve("edge.csv");
        Cli.Result r = Cli.run("sample", c.toString(), "-n", "200", "--seed", "3", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        assertEquals(201, Files.readAllLines(out).size());
        Path scores = tmp.resolve("scores.csv");
        Cli.Result back = Cli.run("eval", c.toString(), "--data", out.toString(), "-o", scores.toString());
        assertEquals(ExitStatus.OK, back.status(), back::describe);
        assertEquals(201, Files.readAllLines(scores).size());
        assertFalse(Files.readString(scores).contains("NaN") || Files.readString(scores).contains("Infinity"));
    }

    @Test
    void wideUniform_samplesReadBack() throws Exception {
        // FORMAT.md: a uniform on [-1.7e308, 1.7e308] is valid; its draws are finite doubles.
        Path c = circuit("{\"name\": \"v\", \"type\": \"real\"}", "\"input\": \"uniform\", \"low\": -1.7e308, \"high\": 1.7e308");
        Path out = tmp.resolve("u.csv");
        Cli.Result r = Cli.run("sample", c.toString(), "-n", "100", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        Cli.Result back = Cli.run("eval", c.toString(), "--data", out.toString(), "-o", tmp.resolve("s.csv").toString());
        assertEquals(ExitStatus.OK, back.status(), back::describe);
    }
}
