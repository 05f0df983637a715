package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Malformed input on the command line (issue 8, CLI.md exit status 2): every case ends with status
 * 2 and one message naming the file and the problem, without a stack trace, and writes no output.
 * Every named limit's message names its option, and raising the limit lets the input through.
 */
class CliMalformedInputTest {
    @TempDir
    Path dir;
    private String example;
    private Path data;
    private Path out;

    @BeforeEach
    void setUp() throws IOException {
        example = Files.readString(Cli.EXAMPLE);
        data = dir.resolve("readings.csv");
        Files.copy(Cli.READINGS, data);
        out = dir.resolve("out.csv");
    }

    /** One malformed circuit file. */
    private record Case(String name, String file, byte[] content, String fragment) {
    }

    private List<Case> circuits() throws IOException {
        List<Case> t = new ArrayList<>();
        t.add(new Case("empty file", "empty.json", new byte[0], "the file is empty"));
        byte[] binary = new byte[4096];
        new Random(8).nextBytes(binary);
        t.add(new Case("binary file", "binary.json", binary, "not valid JSON"));
        t.add(new Case("truncated JSON", "truncated.json", utf8(example.substring(0, example.length() / 2)),
                "the input ends before the document is complete"));
        t.add(new Case("duplicate key", "duplicate.json", utf8(example.replace("\"mean\": 3.1,", "\"mean\": 3.1, \"mean\": 3.2,")),
                "duplicate key"));
        t.add(new Case("NaN", "nan.json", utf8(example.replace("\"mean\": 3.1", "\"mean\": NaN")),
                "NaN and Infinity are not JSON numbers"));
        t.add(new Case("1e999999", "huge.json", utf8(example.replace("\"mean\": 3.1", "\"mean\": 1e999999")),
                "out of double range"));
        t.add(new Case("100,000-digit number", "digits.json", utf8(example.replace("\"mean\": 3.1", "\"mean\": " + "3".repeat(100_000))),
                "--max-number"));
        t.add(new Case("200,000-deep nesting", "deep.json", utf8(example.replace("\"checks\":",
                "\"extensions\": {\"deep\": " + "[".repeat(200_000) + "]".repeat(200_000) + "}, \"checks\":")), "--max-depth"));
        t.add(new Case("not gzip although named .gz", "plain.json.gz", utf8(example), "not gzip-compressed"));
        t.add(new Case("id beyond 2^63", "bigid.json", utf8(example.replace("{\"id\": 6,", "{\"id\": 9223372036854775808,")),
                "out of range"));
        t.add(new Case("UTF-32 with an unusual byte order", "ucs4.json", new byte[] {0, 'I', 0, 0, '{', 'n', 'f', 'i'},
                "expected UTF-8, UTF-16 or UTF-32"));
        t.add(new Case("broken child reference", "dangling.json", utf8(example.replace("\"product\": [0, 1]", "\"product\": [0, 77]")),
                "77"));
        return t;
    }

    @Test
    void everyCommand_malformedCircuits_status2OneMessageNamingTheFile() throws IOException {
        Path good = dir.resolve("good.json");
        Files.writeString(good, example);
        for (Case c : circuits()) {
            Path f = dir.resolve(c.file());
            Files.write(f, c.content());
            Cli.Result sample = Cli.run("sample", f.toString(), "-n", "3", "-o", out.toString());
            Cli.assertUnusable(sample, f.toString(), c.fragment());
            Cli.Result eval = Cli.run("eval", f.toString(), "--data", data.toString(), "-o", out.toString());
            Cli.assertUnusable(eval, f.toString(), c.fragment());
            String[][] others = {{"check", f.toString()}, {"compare", f.toString(), good.toString()},
                {"compare", good.toString(), f.toString()}, {"normalize", f.toString(), "-o", out.toString()},
                {"render", f.toString(), "-o", out.toString()}};
            for (String[] args : others) {
                Cli.assertUnusable(Cli.run(args), f.toString(), c.fragment());
            }
            assertFalse(Files.exists(out), c.name() + ": an output was written");
            if (c.file().equals("dangling.json")) {
                // a model was built: validate reports its error diagnostic with status 1 (CLI.md)
                Cli.Result v = Cli.run("validate", f.toString());
                assertEquals(ExitStatus.FAILED, v.status(), v::describe);
                Cli.assertNoStackTrace(v);
                continue;
            }
            for (String format : new String[] {"text", "json", "sarif"}) {
                Cli.assertUnusable(Cli.run("validate", f.toString(), "--format", format), f.toString(), c.fragment());
            }
            Cli.assertUnusable(Cli.run("inspect", f.toString()), f.toString(), c.fragment());
        }
    }

    @Test
    void check_referenceCellNotAValue_status2NamingFileLineAndColumn() throws IOException {
        Path f = dir.resolve("example.json");
        Files.writeString(f, example);
        String[][] rows = {{"3.0,wide,0.1", "valve"}, {"3.0,open,high", "log-density"}, {"3.0,open,NaN", "log-density"},
            {"3.0,open,1e999999", "out of double range"}, {"x,open,0.1", "inlet_pressure"}};
        for (String[] row : rows) {
            Path ref = dir.resolve("ref.csv");
            Files.writeString(ref, "inlet_pressure,valve,log_density\n3.0,open,0.18261296103078395\n" + row[0] + "\n");
            Cli.assertUnusable(Cli.run("check", f.toString(), "--reference", ref.toString()), ref + ":3:", row[1]);
        }
        // a reference log-density of 19 characters is over a --max-number of 18, and reads under 19
        Path longRef = dir.resolve("long.csv");
        Files.writeString(longRef, "inlet_pressure,valve,log_density\n3.0,open,0.18261296103078395\n");
        Cli.assertUnusable(Cli.run("check", f.toString(), "--reference", longRef.toString(), "--max-number", "18"),
                longRef + ":2:", "--max-number");
        Cli.Result raised = Cli.run("check", f.toString(), "--reference", longRef.toString(), "--max-number", "19");
        assertEquals(ExitStatus.OK, raised.status(), raised::describe);
        Path ref = dir.resolve("unknown.csv");
        Files.writeString(ref, "inlet_pressure,flow,log_density\n3.0,1,0.1\n");
        Cli.assertUnusable(Cli.run("check", f.toString(), "--reference", ref.toString()), ref + ":1:", "flow");
    }

    @Test
    void validate_severalFiles_highestStatusAndEveryFileNamed() throws IOException {
        Path good = dir.resolve("good.json");
        Files.writeString(good, example);
        Path bad = dir.resolve("bad.json");
        Files.writeString(bad, example.replace("\"mean\": 3.1", "\"mean\": NaN"));
        Path empty = dir.resolve("empty.json");
        Files.write(empty, new byte[0]);
        Cli.Result r = Cli.run("validate", good.toString(), bad.toString(), empty.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains(bad + ":") && r.err().contains(empty + ":"), r::describe);
        Cli.assertNoStackTrace(r);
    }

    @Test
    void impute_malformedCircuit_status2() throws IOException {
        Path f = dir.resolve("nan.json");
        Files.writeString(f, example.replace("\"sd\": 0.2", "\"sd\": -Infinity"));
        Cli.assertUnusable(Cli.run("impute", f.toString(), "--data", data.toString(), "-o", out.toString()), f.toString(),
                "NaN and Infinity are not JSON numbers");
        assertFalse(Files.exists(out));
    }

    @Test
    void sample_gzipExpandingBeyondMaxBytes_limitNamedAndRaisingItReads() throws IOException {
        // The example followed by 3 MiB of spaces (RFC 8259 section 2: white space is allowed after a value).
        Path f = dir.resolve("padded.json.gz");
        try (OutputStream o = new GZIPOutputStream(Files.newOutputStream(f))) {
            o.write(utf8(example));
            o.write(utf8(" ".repeat(3 << 20)));
        }
        assertTrue(Files.size(f) < 100_000, "compressed size " + Files.size(f));
        Cli.Result r = Cli.run("sample", f.toString(), "-n", "2", "--max-bytes", "1000000", "-o", out.toString());
        Cli.assertUnusable(r, f.toString(), "--max-bytes");
        assertTrue(r.err().contains("exceeds the limit of 1000000 set by --max-bytes"), r::describe);
        Cli.Result raised = Cli.run("sample", f.toString(), "-n", "2", "--max-bytes", "4000000", "-o", out.toString());
        assertEquals(ExitStatus.OK, raised.status(), raised::describe);
        assertEquals(3, Files.readAllLines(out).size(), "header and two samples");
    }

    /** Each limit with a value the example exceeds and one it does not. */
    @Test
    void sample_everyLimitHit_messageNamesOptionAndRaisingItReads() throws IOException {
        Path f = dir.resolve("example.json");
        Files.writeString(f, example);
        String[][] limits = {
            {"--max-bytes", "500", "100000"},
            {"--max-nodes", "3", "7"},
            // the deepest value of the example is a check case's values, 5 levels down
            {"--max-depth", "4", "5"},
            // the longest string of the example is the provenance source, 36 characters
            {"--max-string", "10", "36"},
            // the longest number of the example is a reference log-density, 19 characters
            {"--max-number", "5", "19"},
        };
        for (String[] l : limits) {
            Cli.Result r = Cli.run("sample", f.toString(), "-n", "1", l[0], l[1], "-o", out.toString());
            Cli.assertUnusable(r, f.toString(), l[0]);
            assertTrue(r.err().contains("raise it with " + l[0]), r::describe);
            Cli.Result raised = Cli.run("sample", f.toString(), "-n", "1", l[0], l[2], "-o", out.toString());
            assertEquals(ExitStatus.OK, raised.status(), raised::describe);
            Files.delete(out);
        }
    }

    @Test
    void eval_dataFileLimits_messageNamesOption() throws IOException {
        Path f = dir.resolve("example.json");
        Files.writeString(f, example);
        // the example circuit is 1,117 bytes: a data file of 3,000 rows is far larger
        Files.writeString(data, "inlet_pressure,valve\n" + "3.0,open\n".repeat(3000));
        Cli.assertUnusable(Cli.run("eval", f.toString(), "--data", data.toString(), "--max-bytes", "2000", "-o", out.toString()),
                data.toString(), "--max-bytes");
        // a circuit whose longest string is its format name, 13 characters, and a data cell of 100
        Path small = dir.resolve("small.json");
        Files.writeString(small, "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [{\"name\": \"x\", \"type\": \"real\"}],"
                + " \"nodes\": [{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 0, \"sd\": 1}], \"outputs\": [{\"name\": \"j\", \"node\": 0}]}");
        Files.writeString(data, "x\n1\n" + "1".repeat(100) + "\n");
        Cli.assertUnusable(Cli.run("eval", small.toString(), "--data", data.toString(), "--max-string", "50", "-o", out.toString()),
                data + ":3:1", "--max-string");
        assertEquals(ExitStatus.OK, Cli.run("eval", small.toString(), "--data", data.toString(), "--max-string", "100",
                "-o", out.toString()).status());
        Files.delete(out);
        // a 100-digit number in a data cell is over a --max-number of 99 (line 3 of the data file)
        Cli.assertUnusable(Cli.run("eval", small.toString(), "--data", data.toString(), "--max-number", "99", "-o", out.toString()),
                data + ":3:1", "--max-number");
        assertEquals(ExitStatus.OK, Cli.run("eval", small.toString(), "--data", data.toString(), "--max-number", "100",
                "-o", out.toString()).status());
        Files.delete(out);
        assertFalse(Files.exists(out));
    }

    @Test
    void eval_dataCellNotAValueOfItsVariable_status2NamingFileRowAndColumn() throws IOException {
        Path f = dir.resolve("example.json");
        Files.writeString(f, example);
        String[][] cells = {{"3.0,wide", "valve"}, {"abc,open", "inlet_pressure"}, {"1e999999,open", "inlet_pressure"},
            {"NaN,open", "inlet_pressure"}, {"3.0,3", "valve"}, {"3.0,-1", "valve"}, {"3.0,\"open", "closing"}};
        for (String[] c : cells) {
            Path d = dir.resolve("bad.csv");
            Files.writeString(d, "inlet_pressure,valve\n3.0,open\n" + c[0] + "\n");
            Cli.Result r = Cli.run("eval", f.toString(), "--data", d.toString(), "-o", out.toString());
            Cli.assertUnusable(r, d + ":3:", c[1]);
            assertFalse(Files.exists(out), c[0]);
        }
        Path d = dir.resolve("unknown-column.csv");
        Files.writeString(d, "inlet_pressure,flow\n3.0,1\n");
        Cli.assertUnusable(Cli.run("eval", f.toString(), "--data", d.toString()), d + ":1:", "unknown column");
    }

    @Test
    void options_unknownOrBadValue_status2NamingTheOption() throws IOException {
        Path f = dir.resolve("example.json");
        Files.writeString(f, example);
        String[][] cases = {
            {"--frobnicate", "sample", f.toString(), "-n", "1", "--frobnicate"},
            {"-n", "sample", f.toString(), "-n", "many"},
            {"--seed", "sample", f.toString(), "-n", "1", "--seed", "0x"},
            {"--max-depth", "sample", f.toString(), "-n", "1", "--max-depth", "deep"},
            {"--max-bytes", "sample", f.toString(), "-n", "1", "--max-bytes", "99999999999999999999"},
            {"--max-", "sample", f.toString(), "-n", "1", "--max-nodes", "0"},
            {"-n", "sample", f.toString(), "-n", "-4"},
            {"--data", "eval", f.toString()},
            {"frobnicate", "frobnicate"},
        };
        for (String[] c : cases) {
            Cli.Result r = Cli.run(Arrays.copyOfRange(c, 1, c.length));
            Cli.assertUnusable(r, c[0], c[0]);
        }
    }

    @Test
    void debug_unusableInput_stackTraceOnlyWithDebug() throws IOException {
        Path f = dir.resolve("nan.json");
        Files.writeString(f, example.replace("\"mean\": 3.1", "\"mean\": NaN"));
        Cli.Result plain = Cli.run("sample", f.toString(), "-n", "1");
        Cli.assertUnusable(plain, f.toString(), "NaN");
        Cli.Result debug = Cli.run("sample", f.toString(), "-n", "1", "--debug");
        assertEquals(ExitStatus.UNUSABLE, debug.status(), debug::describe);
        assertTrue(debug.err().startsWith("circa: " + f), debug::describe);
        assertTrue(debug.err().contains("\tat dev.circa."), debug::describe);
    }

    @Test
    void sample_raisedDepthOnDeepExtensions_locatedErrorOrDocument() throws IOException {
        // With the depth limit raised far beyond the default, deep nesting must still end in a message, not a crash.
        Path f = dir.resolve("deep.json");
        Files.writeString(f, example.replace("\"checks\":",
                "\"extensions\": {\"deep\": " + "[".repeat(200_000) + "]".repeat(200_000) + "}, \"checks\":"));
        Cli.Result r = Cli.run("sample", f.toString(), "-n", "1", "--max-depth", "1000000", "-o", out.toString());
        Cli.assertNoStackTrace(r);
        if (r.status() != ExitStatus.OK) {
            Cli.assertUnusable(r, f.toString(), "--max-depth");
        }
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    static byte[] gzip(byte[] b) throws IOException {
        ByteArrayOutputStream o = new ByteArrayOutputStream();
        try (GZIPOutputStream gz = new GZIPOutputStream(o)) {
            gz.write(b);
        }
        return o.toByteArray();
    }
}
