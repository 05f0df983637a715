package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import dev.circa.format.CircuitDocument;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.function.Supplier;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Malformed circuit input: every case ends in a located {@link FormatException}, never another
 * exception (issue 8). Positions are 1-based line and column as Jackson counts them (characters).
 */
class CircuitReaderHardeningTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    private static final String FILE = "case.json";
    /** Lines 1-3 of every constructed document; the node under test is alone on line 4. */
    private static final String HEAD = "{\"format\": \"circa.circuit\", \"version\": \"1.0\",\n"
            + "\"variables\": [{\"name\": \"x\", \"type\": \"real\"}, {\"name\": \"y\", \"type\": \"real\"}],\n"
            + "\"nodes\": [\n";
    private static final String TAIL = "\n],\n\"outputs\": [{\"name\": \"joint\", \"node\": 0}]}\n";
    private static final String NORMAL = "{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1}";

    @TempDir
    Path dir;

    /** One row of the malformed-input table. */
    private record Case(String name, Supplier<byte[]> input, ReadLimits limits, int line, int column,
            String pointer, String fragment) {
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    private static byte[] node(String nodeText) {
        return utf8(HEAD + nodeText + TAIL);
    }

    private static byte[] withNormalThen(String after) {
        return utf8(HEAD + NORMAL + after);
    }

    private static List<Case> table() {
        ReadLimits d = ReadLimits.DEFAULT;
        List<Case> t = new ArrayList<>();
        t.add(new Case("empty file", () -> new byte[0], d, 1, 1, "", "the file is empty"));
        t.add(new Case("only white space", () -> utf8("  \n\t "), d, 1, 1, "", "the file is empty"));
        t.add(new Case("control bytes", () -> new byte[] {0, 1, 2, (byte) 0xff, 7}, d, 1, 1, null, "not valid JSON"));
        t.add(new Case("image header", () -> new byte[] {(byte) 0x89, 'P', 'N', 'G', 13, 10, 26, 10}, d, 1, 2, null,
                "the byte 0x89 cannot start a UTF-8 character"));
        t.add(new Case("top-level array", () -> utf8("[1, 2]"), d, 1, 1, "", "expected a circuit document (a JSON object)"));
        t.add(new Case("content after the document", () -> utf8(HEAD + NORMAL + TAIL + "{}"), d, 7, 1, "",
                "unexpected content after the end of the document"));
        // RFC 8259 section 6: "Numeric values that cannot be represented ... (such as Infinity and NaN) are not permitted".
        // Column 49 is where NaN starts; Jackson reports the position where it stopped reading the token.
        t.add(new Case("NaN literal", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": NaN, \"sd\": 1}"),
                d, 4, 51, null, "NaN and Infinity are not JSON numbers"));
        t.add(new Case("Infinity literal", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": Infinity, \"sd\": 1}"),
                d, 4, 56, null, "NaN and Infinity are not JSON numbers"));
        t.add(new Case("-Infinity literal", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": -Infinity, \"sd\": 1}"),
                d, 4, 57, null, "NaN and Infinity are not JSON numbers"));
        // IEEE 754 binary64: the largest finite value is about 1.8e308, so 1e999999 overflows (common practice).
        t.add(new Case("1e999999", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1e999999, \"sd\": 1}"),
                d, 4, 48, "/nodes/0/mean", "out of double range"));
        t.add(new Case("100,000-digit number", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": "
                + "7".repeat(100_000) + ", \"sd\": 1}"), d, 4, 1499, null, "--max-number"));
        t.add(new Case("id beyond 2^63", () -> node("{\"id\": 9223372036854775808, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1}"),
                d, 4, 8, "/nodes/0/id", "is out of range"));
        t.add(new Case("id beyond 2^31", () -> node("{\"id\": 2147483648, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1}"),
                d, 4, 8, "/nodes/0/id", "is out of range"));
        t.add(new Case("id 1e300", () -> node("{\"id\": 1e300, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1}"),
                d, 4, 8, "/nodes/0/id", "expected an integer"));
        // RFC 8259 section 4: names within an object SHOULD be unique; CLI.md makes a duplicate an error.
        t.add(new Case("duplicate key in a node", () -> node("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1, \"mean\": 2}"),
                d, 4, 66, null, "duplicate key"));
        t.add(new Case("duplicate top-level key", () -> utf8(HEAD + NORMAL + "\n],\n\"nodes\": []}"), d, 6, 8, null, "duplicate key"));
        t.add(new Case("200,000-deep arrays in extensions", () -> withNormalThen("\n], \"extensions\": {\"x\": " + "[".repeat(200_000)),
                d, 5, 87, null, "--max-depth"));
        t.add(new Case("200,000-deep objects in an unknown property", () -> utf8(HEAD
                + "{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1, \"zzz\": " + "{\"a\":".repeat(200_000)),
                d, 4, 373, null, "--max-depth"));
        t.add(new Case("200,000-deep arrays as a parameter", () -> utf8(HEAD
                + "{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": " + "[".repeat(200_000)),
                d, 4, 50, "/nodes/0/mean/0/0", "expected a number, found an array"));
        t.add(new Case("string over --max-string", () -> node("{\"id\": 0, \"label\": \"" + "a".repeat(300)
                + "\", \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 1}"), d.withMaxString(100), 4, 221, null, "--max-string"));
        t.add(new Case("--max-nodes", () -> readExample(), d.withMaxNodes(3), 13, 5, "/nodes/3", "--max-nodes"));
        t.add(new Case("truncated string", () -> utf8(HEAD + "{\"id\": 0, \"input\": \"nor"), d, 4, 24, null,
                "the input ends before the document is complete"));
        t.add(new Case("invalid UTF-8 in a string", () -> {
            byte[] a = utf8(HEAD + "{\"id\": 0, \"label\": \"ab");
            byte[] b = Arrays.copyOf(a, a.length + 2);
            b[a.length] = (byte) 0xC3;
            b[a.length + 1] = (byte) 0x28;
            return b;
        }, d, 4, 25, null, "the byte 0x28 cannot continue a UTF-8 character"));
        t.add(new Case("mvnormal cov a number", () -> node("{\"id\": 0, \"input\": \"mvnormal\", \"vars\": [0, 1], \"mean\": [1, 2], \"cov\": 5}"),
                d, 4, 71, "/nodes/0/cov", "needs \"cov\""));
        t.add(new Case("unknown family", () -> node("{\"id\": 0, \"input\": \"gaussian\", \"var\": 0}"), d, 4, 20,
                "/nodes/0/input", "unknown input family \"gaussian\""));
        t.add(new Case("unknown major version", () -> utf8("{\"format\": \"circa.circuit\", \"version\": \"2.0\"}"), d, 1, 40,
                "/version", "unsupported major version"));
        t.add(new Case("missing nodes after a BOM and blank lines", () -> concat(new byte[] {(byte) 0xEF, (byte) 0xBB, (byte) 0xBF},
                utf8("\n\n  {\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [], \"outputs\": []}")),
                d, 3, 3, "/nodes", "missing \"nodes\""));
        t.add(new Case("missing format", () -> utf8("{\"version\": \"1.0\", \"variables\": [], \"nodes\": [], \"outputs\": []}"),
                d, 1, 1, "/format", "missing \"format\""));
        t.add(new Case("wrong format", () -> utf8("{\n  \"format\": \"circa.regions\"}"), d, 2, 13, "/format", "unknown format"));
        return t;
    }

    private static byte[] readExample() {
        try {
            return Files.readAllBytes(EXAMPLE);
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Reads {@code bytes}; returns the FormatException, failing on any other outcome. */
    private static FormatException rejected(String what, byte[] bytes, ReadLimits limits) {
        try {
            new CircuitReader(limits).read(new ByteArrayInputStream(bytes), FILE);
        } catch (FormatException e) {
            return e;
        } catch (Throwable t) {
            throw new AssertionError(what + ": expected a FormatException, got " + t, t);
        }
        return fail(what + ": read without error");
    }

    private static void assertLocated(String what, FormatException e) {
        assertEquals(FILE, e.file(), what);
        assertTrue(e.line() > 0 && e.column() > 0, what + ": no position in " + e.getMessage());
        assertTrue(e.getMessage().startsWith(FILE + ":" + e.line() + ":" + e.column() + ": "), what + ": " + e.getMessage());
    }

    @Test
    void read_malformedInputTable_locatedFormatException() {
        for (Case c : table()) {
            FormatException e = rejected(c.name(), c.input().get(), c.limits());
            assertLocated(c.name(), e);
            assertEquals(c.line(), e.line(), c.name() + ": " + e.getMessage());
            assertEquals(c.column(), e.column(), c.name() + ": " + e.getMessage());
            assertTrue(e.getMessage().contains(c.fragment()), c.name() + ": " + e.getMessage());
            if (c.pointer() != null) {
                assertEquals(c.pointer(), e.pointer(), c.name());
            }
            if (c.fragment().startsWith("--max-")) {
                LimitExceededException le = assertInstanceOf(LimitExceededException.class, e, c.name());
                assertEquals(c.fragment(), le.option());
                assertTrue(e.getMessage().contains("raise it with " + c.fragment()), c.name() + ": " + e.getMessage());
            }
        }
    }

    @Test
    void read_everyTruncationOfExample_formatException() throws Exception {
        byte[] full = readExample();
        int end = new String(full, StandardCharsets.UTF_8).lastIndexOf('}') + 1;
        assertTrue(end > 1000, "example is " + end + " bytes up to its closing brace");
        for (int n = 0; n < end; n++) {
            byte[] prefix = Arrays.copyOf(full, n);
            FormatException e = rejected("prefix of " + n + " bytes", prefix, ReadLimits.DEFAULT);
            assertLocated("prefix of " + n + " bytes", e);
            long lines = 1 + new String(prefix, StandardCharsets.UTF_8).chars().filter(ch -> ch == '\n').count();
            assertTrue(e.line() <= lines, "prefix of " + n + " bytes: line " + e.line() + " beyond the input");
        }
    }

    /** RFC 1952 section 2.2: a gzip file is a series of members; truncating one anywhere must be reported. */
    @Test
    void read_everyTruncationOfGzippedExample_formatException() throws Exception {
        byte[] gz = gzip(readExample());
        Path p = dir.resolve("cut.json.gz");
        for (int n = 0; n < gz.length; n++) {
            Files.write(p, Arrays.copyOf(gz, n));
            try {
                new CircuitReader().read(p);
                fail("gzip prefix of " + n + " bytes read without error");
            } catch (FormatException e) {
                assertTrue(e.getMessage().startsWith(p.toString() + ":"), e.getMessage());
            } catch (Throwable t) {
                throw new AssertionError("gzip prefix of " + n + " bytes: " + t, t);
            }
        }
    }

    @Test
    void read_seededByteFlips_documentOrLocatedFormatException() throws Exception {
        byte[] full = readExample();
        Random random = new Random(20261201L);
        int documents = 0;
        int errors = 0;
        for (int i = 0; i < 10_000; i++) {
            byte[] b = full.clone();
            int flips = 1 + random.nextInt(3);
            for (int f = 0; f < flips; f++) {
                int at = random.nextInt(b.length);
                b[at] = random.nextBoolean() ? (byte) (b[at] ^ (1 << random.nextInt(8))) : (byte) random.nextInt(256);
            }
            CircuitDocument doc;
            try {
                doc = new CircuitReader().read(new ByteArrayInputStream(b), FILE);
            } catch (FormatException e) {
                assertLocated("flip case " + i, e);
                errors++;
                continue;
            } catch (Throwable t) {
                throw new AssertionError("flip case " + i + ": " + t + "\n" + new String(b, StandardCharsets.ISO_8859_1), t);
            }
            documents++;
            // A document that was read must also survive a rewrite and a second read.
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            new CircuitWriter().write(doc, out);
            assertNotNull(new CircuitReader().read(new ByteArrayInputStream(out.toByteArray()), "rewritten.json"));
        }
        assertTrue(documents > 0 && errors > 0, documents + " documents, " + errors + " errors");
    }

    @Test
    void read_unicodeEncodings_sameDocumentAsUtf8() throws Exception {
        // RFC 8259 section 8.1 requires UTF-8 for exchange, while RFC 7159/4627 allowed UTF-16 and UTF-32
        // (common practice: detected from the zero bytes of the first characters, or a byte order mark).
        String text = new String(readExample(), StandardCharsets.UTF_8);
        String reference = rewrite(new CircuitReader().readString(text, FILE));
        List<byte[]> inputs = new ArrayList<>();
        for (String cs : List.of("UTF-16BE", "UTF-16LE", "UTF-32BE", "UTF-32LE")) {
            byte[] plain = text.getBytes(Charset.forName(cs));
            inputs.add(plain);
            inputs.add(concat(bom(cs), plain));
        }
        inputs.add(concat(new byte[] {(byte) 0xEF, (byte) 0xBB, (byte) 0xBF}, utf8(text)));
        for (byte[] in : inputs) {
            CircuitDocument doc = new CircuitReader().read(new ByteArrayInputStream(in), FILE);
            assertEquals(reference, rewrite(doc));
        }
    }

    @Test
    void read_utf16WithNaN_samePositionAsUtf8() {
        String text = HEAD + "{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": NaN, \"sd\": 1}" + TAIL;
        FormatException a = rejected("utf-8", utf8(text), ReadLimits.DEFAULT);
        FormatException b = rejected("utf-16", text.getBytes(StandardCharsets.UTF_16LE), ReadLimits.DEFAULT);
        assertEquals(a.getMessage(), b.getMessage());
    }

    @Test
    void read_wrongTypeOrNullInEveryNodeField_locatedAtTheValue() {
        List<List<String[]>> templates = List.of(
                fields("id", "0", "label", "\"a\"", "input", "\"normal\"", "var", "0", "mean", "1", "sd", "1"),
                fields("id", "0", "input", "\"categorical\"", "var", "0", "probs", "[0.5, 0.5]"),
                fields("id", "0", "input", "\"categorical\"", "var", "0", "logProbs", "[-0.6931471805599453, -0.6931471805599453]"),
                fields("id", "0", "input", "\"binomial\"", "var", "0", "trials", "3", "p", "0.5"),
                fields("id", "0", "input", "\"mvnormal\"", "vars", "[0, 1]", "mean", "[1, 2]", "cov", "[[1, 0], [0, 1]]"),
                fields("id", "0", "label", "\"p\"", "product", "[0]"),
                fields("id", "0", "sum", "[0]", "weights", "[1]"),
                fields("id", "0", "sum", "[0]", "logWeights", "[0]"));
        int cases = 0;
        for (List<String[]> template : templates) {
            for (int f = 0; f < template.size(); f++) {
                String key = template.get(f)[0];
                String original = template.get(f)[1];
                for (Object[] badValue : badValues(key, original)) {
                    String bad = (String) badValue[0];
                    int offset = (Integer) badValue[1];
                    StringBuilder sb = new StringBuilder("{");
                    int column = 0;
                    for (int g = 0; g < template.size(); g++) {
                        if (g > 0) {
                            sb.append(", ");
                        }
                        sb.append('"').append(template.get(g)[0]).append("\": ");
                        if (g == f) {
                            column = sb.length() + 1;
                        }
                        sb.append(g == f ? bad : template.get(g)[1]);
                    }
                    sb.append('}');
                    String what = sb.toString();
                    FormatException e = rejected(what, node(what), ReadLimits.DEFAULT);
                    assertLocated(what, e);
                    assertEquals(4, e.line(), what + ": " + e.getMessage());
                    assertEquals(column + offset, e.column(), what + ": " + e.getMessage());
                    assertNotNull(e.pointer(), what);
                    assertTrue(e.pointer().startsWith("/nodes/0/" + key), what + ": pointer " + e.pointer());
                    cases++;
                }
            }
        }
        assertTrue(cases > 150, cases + " cases");
    }

    private static List<String[]> fields(String... kv) {
        List<String[]> l = new ArrayList<>();
        for (int i = 0; i < kv.length; i += 2) {
            l.add(new String[] {kv[i], kv[i + 1]});
        }
        return l;
    }

    /**
     * Values of the wrong JSON type for a field whose valid value is {@code original}, each with the
     * offset of the offending token inside it (1 for the first element of an array, 2 inside a row).
     */
    private static List<Object[]> badValues(String key, String original) {
        List<Object[]> v = new ArrayList<>();
        for (String s : List.of("null", "true", "{}", "{\"k\": 1}")) {
            v.add(new Object[] {s, 0});
        }
        if (original.startsWith("\"")) {
            v.add(new Object[] {"5", 0});
            v.add(new Object[] {"[]", 0});
            v.add(new Object[] {"[\"a\"]", 0});
        } else if (original.startsWith("[[")) {
            v.add(new Object[] {"\"text\"", 0});
            v.add(new Object[] {"5", 0});
            v.add(new Object[] {"[1, 0]", 0});
            v.add(new Object[] {"[[\"a\", 0], [0, 1]]", 2});
            v.add(new Object[] {"[[null, 0], [0, 1]]", 2});
        } else if (original.startsWith("[")) {
            v.add(new Object[] {"\"text\"", 0});
            v.add(new Object[] {"5", 0});
            for (String s : List.of("[null]", "[\"a\"]", "[{}]", "[true]")) {
                v.add(new Object[] {s, 1});
            }
        } else if (key.equals("id") || key.equals("var")) {
            for (String s : List.of("\"text\"", "[\"a\"]", "[]", "1.5", "-1")) {
                v.add(new Object[] {s, 0});
            }
        } else {
            v.add(new Object[] {"\"text\"", 0});
            v.add(new Object[] {"[]", 0});
            v.add(new Object[] {"[\"a\"]", 1});
        }
        return v;
    }

    @Test
    void read_gzipExpandingPastMaxBytes_limitNamed() throws Exception {
        Path p = dir.resolve("bomb.json.gz");
        writeSpaceBomb(p, 16);
        ReadLimits small = ReadLimits.DEFAULT.withMaxBytes(1L << 20);
        try {
            new CircuitReader(small).read(p);
            fail("read without error");
        } catch (LimitExceededException e) {
            assertEquals(ReadLimits.MAX_BYTES, e.option());
            assertTrue(e.getMessage().startsWith(p + ":1:"), e.getMessage());
            assertTrue(e.column() > 1_000_000, e.getMessage());
            assertTrue(e.getMessage().contains("exceeds the limit of 1048576 set by --max-bytes"), e.getMessage());
        }
    }

    @Test
    void read_gzipExpandingToOneGigabyteOfText_stoppedByDefaultStringLimit() throws Exception {
        Path p = dir.resolve("label.json.gz");
        byte[] head = utf8("{\"format\": \"circa.circuit\", \"name\": \"");
        byte[] block = gzip(utf8("a".repeat(1 << 20)));
        try (OutputStream out = Files.newOutputStream(p)) {
            out.write(gzip(head));
            for (int i = 0; i < 1024; i++) {
                out.write(block);
            }
        }
        try {
            new CircuitReader().read(p);
            fail("read without error");
        } catch (LimitExceededException e) {
            assertEquals(ReadLimits.MAX_STRING, e.option(), e.getMessage());
        }
    }

    @Test
    void read_gzipExpandingToOneGigabyteOfSpaces_endsWithLocatedError() throws Exception {
        // Under the default --max-bytes (16 GiB) a gigabyte is read to its end and reported as truncated.
        Path p = dir.resolve("spaces.json.gz");
        writeSpaceBomb(p, 1024);
        try {
            new CircuitReader().read(p);
            fail("read without error");
        } catch (FormatException e) {
            assertTrue(e.getMessage().startsWith(p + ":"), e.getMessage());
            assertTrue(e.getMessage().contains("ends before the document is complete"), e.getMessage());
        }
    }

    @Test
    void read_gzNameButPlainText_saysNotGzip() throws Exception {
        Path p = dir.resolve("plain.json.gz");
        Files.write(p, readExample());
        Path empty = dir.resolve("empty.json.gz");
        Files.write(empty, new byte[0]);
        for (Path f : List.of(p, empty)) {
            try {
                new CircuitReader().read(f);
                fail("read without error");
            } catch (FormatException e) {
                assertEquals(f.toString() + ": the name ends in .gz but the file is not gzip-compressed", e.getMessage());
            }
        }
    }

    @Test
    void read_missingFileOrDirectory_formatExceptionNamingIt() {
        Path missing = dir.resolve("absent.json");
        for (Path p : List.of(missing, dir)) {
            try {
                new CircuitReader().read(p);
                fail("read without error");
            } catch (FormatException e) {
                assertTrue(e.getMessage().startsWith(p + ": "), e.getMessage());
            } catch (Throwable t) {
                throw new AssertionError(p + ": " + t, t);
            }
        }
    }

    @Test
    void read_gzippedExample_sameAsPlain() throws Exception {
        Path p = dir.resolve("pump-station.json.gz");
        Files.write(p, gzip(readExample()));
        assertEquals(rewrite(new CircuitReader().read(EXAMPLE)), rewrite(new CircuitReader().read(p)));
    }

    @Test
    void read_validCorpusCircuits_read() throws Exception {
        try (var s = Files.list(Path.of("..", "fixtures", "schema-corpus", "circuit", "valid"))) {
            for (Path p : s.toList()) {
                assertTrue(new CircuitReader().read(p).findings().isEmpty(), p.toString());
            }
        }
    }

    /**
     * "{" followed by {@code mebibytes} MiB of spaces, as that many concatenated gzip members
     * (RFC 1952 section 2.2 allows several members; GZIPInputStream reads them in sequence).
     */
    private static void writeSpaceBomb(Path p, int mebibytes) throws IOException {
        byte[] spaces = new byte[1 << 20];
        Arrays.fill(spaces, (byte) ' ');
        byte[] block = gzip(spaces);
        try (OutputStream out = Files.newOutputStream(p)) {
            out.write(gzip(utf8("{")));
            for (int i = 0; i < mebibytes; i++) {
                out.write(block);
            }
        }
    }

    private static String rewrite(CircuitDocument doc) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new CircuitWriter().write(doc, out);
        return out.toString(StandardCharsets.UTF_8);
    }

    static byte[] gzip(byte[] data) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (GZIPOutputStream gz = new GZIPOutputStream(out)) {
            gz.write(data);
        }
        return out.toByteArray();
    }

    private static byte[] bom(String charset) {
        return switch (charset) {
            case "UTF-16BE" -> new byte[] {(byte) 0xFE, (byte) 0xFF};
            case "UTF-16LE" -> new byte[] {(byte) 0xFF, (byte) 0xFE};
            case "UTF-32BE" -> new byte[] {0, 0, (byte) 0xFE, (byte) 0xFF};
            default -> new byte[] {(byte) 0xFF, (byte) 0xFE, 0, 0};
        };
    }

    private static byte[] concat(byte[] a, byte[] b) {
        byte[] c = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, c, a.length, b.length);
        return c;
    }
}
