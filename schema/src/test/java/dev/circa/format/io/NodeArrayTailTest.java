package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.NodeTable;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Random;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A file read in two halves on two threads ({@link NodeArrayTail}) gives exactly what the read by one
 * thread gives: the same nodes (numbers to the bit), locations, findings, and the same error at the same
 * line and column, whatever the layout (one line, a node per line, CRLF, tabs, several lines per node,
 * multi-byte text before the split) and wherever a problem sits (before the split, after it, after the
 * nodes). Each case also says whether the second half was taken, so that both ways are exercised.
 */
class NodeArrayTailTest {
    /** Reads every stored file in two halves. */
    private static final long ALWAYS = 0;

    @TempDir
    Path dir;

    /** The reference: every node read by the JSON parser. */
    private static CircuitReader parserOnly(ReadLimits limits) {
        return new CircuitReader(limits, Long.MAX_VALUE, Long.MAX_VALUE, t -> { });
    }

    /** The outcome of a read as text: every member of the document, or the error with its location. */
    private static String outcome(CircuitReader reader, Path file) {
        try {
            return describe(reader.read(file));
        } catch (FormatException e) {
            return e.getClass().getSimpleName() + " " + e.line() + ":" + e.column() + " " + e.pointer() + " " + e.getMessage();
        } catch (java.io.IOException | RuntimeException e) {
            return "unexpected " + e;
        }
    }

    private static String describe(CircuitDocument doc) throws java.io.IOException {
        StringBuilder sb = new StringBuilder();
        ByteArrayOutputStream text = new ByteArrayOutputStream();
        new CircuitWriter().write(doc, text);
        sb.append(text.toString(StandardCharsets.UTF_8)).append('\n');
        NodeTable t = doc.nodeTable();
        for (int i = 0; i < t.size(); i++) {
            SourceLocation at = doc.nodeLocation(i);
            sb.append(i).append('@').append(at.line()).append(':').append(at.column());
            // the numbers to the bit (the text above rounds nothing, but says so only through the writer)
            for (int k = t.valueStart(i); k < t.valueEnd(i); k++) {
                sb.append(' ').append(Long.toHexString(Double.doubleToRawLongBits(t.value(k))));
            }
            sb.append('\n');
        }
        for (String p : List.of("/format", "/version", "/variables", "/nodes", "/outputs", "/outputs/0", "/checks",
                "/extensions", "/name")) {
            SourceLocation at = doc.location(p);
            sb.append(p).append('@').append(at == null ? "-" : at.line() + ":" + at.column()).append('\n');
        }
        for (ReadFinding f : doc.findings()) {
            sb.append(f.kind()).append(' ').append(f.location().line()).append(':').append(f.location().column())
                    .append(' ').append(f.location().pointer()).append(' ').append(f.message()).append('\n');
        }
        return sb.toString();
    }

    /** Reads {@code text} from a file both ways; returns whether the second half was taken. */
    private boolean assertSameRead(String name, byte[] text, ReadLimits limits) throws Exception {
        Path file = dir.resolve(name);
        Files.write(file, text);
        AtomicInteger taken = new AtomicInteger();
        String split = outcome(new CircuitReader(limits, ALWAYS, ALWAYS, t -> taken.addAndGet(t ? 1 : 0)), file);
        String scanned = outcome(new CircuitReader(limits, ALWAYS, Long.MAX_VALUE, t -> { }), file);
        String parsed = outcome(parserOnly(limits), file);
        assertEquals(parsed, scanned, name + ": read straight from the bytes");
        assertEquals(parsed, split, name + ": read in two halves");
        // as a stream: in the stream's own reads, and a few bytes at a time (every buffer boundary)
        assertEquals(parsed, outcome(new CircuitReader(limits, ALWAYS, ALWAYS, t -> { }), file, Integer.MAX_VALUE),
                name + ": read from a stream");
        assertEquals(parsed, outcome(new CircuitReader(limits, ALWAYS, ALWAYS, t -> { }), file, 1 + name.length() % 7),
                name + ": read from a stream a few bytes at a time");
        AtomicInteger alongside = new AtomicInteger();
        assertEquals(parsed, alongside(new CircuitReader(limits, ALWAYS, ALWAYS, t -> alongside.addAndGet(t ? 1 : 0)), file,
                file), name + ": read from a stream, the second half from the file on a second thread");
        return taken.get() > 0 || alongside.get() > 0;
    }

    /** The outcome of {@link CircuitReader#readAlongside}: the stream of {@code file}, the second thread on {@code same}. */
    private static String alongside(CircuitReader reader, Path file, Path same) {
        try (java.io.InputStream in = Files.newInputStream(file)) {
            return describe(reader.readAlongside(in, file.toString(), same));
        } catch (FormatException e) {
            return e.getClass().getSimpleName() + " " + e.line() + ":" + e.column() + " " + e.pointer() + " " + e.getMessage();
        } catch (java.io.IOException | RuntimeException e) {
            return "unexpected " + e;
        }
    }

    @Test
    void streamBesideItsFile_secondHalfTakenWhenItsBytesHashTheSame_refusedWhenTheFileDiffers() throws Exception {
        Path file = dir.resolve("alongside.json");
        // every node plain (node 1's label in ASCII), so that the stream's scanner reads up to the second half
        String text = circuit(4000, ",\n", "", "").replace("vanne \u00e9t\u00e9 \u2014 ", "valve ");
        Files.writeString(file, text);
        AtomicInteger events = new AtomicInteger();
        String read = alongside(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> events.addAndGet(t ? 100 : 1)),
                file, file);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), file), read);
        assertEquals(100, events.get(), "the second half was read on the second thread and taken");
        // the same file with one weight changed in its last node: the stream reads one, the second thread the other
        int last = text.lastIndexOf("0.");
        String changed = text.substring(0, last) + (text.charAt(last + 2) == '9' ? "0.1" : "0.9") + text.substring(last + 3);
        assertEquals(text.length(), changed.length());
        Path other = dir.resolve("alongside-changed.json");
        Files.writeString(other, changed);
        String refused = alongside(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> { }), file, other);
        assertTrue(refused.startsWith("FormatException 0:0 null " + file + ": changed while it was read"), refused);
    }

    /** The outcome of reading {@code file} as a stream that gives at most {@code chunk} bytes per read. */
    private static String outcome(CircuitReader reader, Path file, int chunk) {
        try (java.io.InputStream in = new java.io.FilterInputStream(Files.newInputStream(file)) {
            @Override
            public int read(byte[] b, int off, int len) throws java.io.IOException {
                return super.read(b, off, Math.min(len, chunk));
            }
        }) {
            return describe(reader.read(in, file.toString()));
        } catch (FormatException e) {
            return e.getClass().getSimpleName() + " " + e.line() + ":" + e.column() + " " + e.pointer() + " " + e.getMessage();
        } catch (java.io.IOException | RuntimeException e) {
            return "unexpected " + e;
        }
    }

    /** A circuit of {@code n} nodes of every kind: a node per line, or as {@code layout} says. */
    private static String circuit(int n, String separator, String extraMember, String afterNodes) {
        StringBuilder sb = new StringBuilder("{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"name\": \"pump-station\",\n"
                + "\"variables\": [{\"name\": \"inlet_pressure\", \"type\": \"real\"}, {\"name\": \"valve\", \"type\": \"categorical\","
                + " \"states\": [\"closed\", \"half\", \"open\"]}],\n\"nodes\": [");
        Random rnd = new Random(n);
        for (int i = 0; i < n; i++) {
            sb.append(i == 0 ? separator.replace(",", "") : separator);
            switch (i < 2 ? i : rnd.nextInt(4)) {
                case 0 -> sb.append("{\"id\": ").append(i).append(", \"input\": \"normal\", \"var\": 0, \"mean\": ")
                        .append(rnd.nextGaussian()).append(", \"sd\": ").append(0.1 + rnd.nextDouble()).append('}');
                case 1 -> sb.append("{\"id\": ").append(i).append(i == 1 ? ", \"label\": \"vanne \u00e9t\u00e9 \u2014 " : ", \"label\": \"valve ").append(i)
                        .append("\", \"input\": \"categorical\", \"var\": 1, \"logProbs\": [-1.2, -0.5, -").append(rnd.nextDouble())
                        .append("]}");
                case 2 -> sb.append("{\"id\": ").append(i).append(",\n  \"product\": [").append(rnd.nextInt(i)).append(", ")
                        .append(rnd.nextInt(i)).append("]}");
                default -> {
                    sb.append("{\"id\": ").append(i).append(", \"sum\": [").append(rnd.nextInt(i)).append(", ").append(rnd.nextInt(i))
                            .append("], \"weights\": [").append(rnd.nextDouble()).append(", 1e-310]");
                    if (i == n * 3 / 4 && !extraMember.isEmpty()) {
                        sb.append(", ").append(extraMember);
                    }
                    sb.append('}');
                }
            }
        }
        sb.append("],\n\"outputs\": [{\"name\": \"joint\", \"node\": ").append(n - 1).append("}]").append(afterNodes).append("}\n");
        return sb.toString();
    }

    @Test
    void layouts_sameDocumentAndLocations_secondHalfTaken() throws Exception {
        String checks = ", \"checks\": {\"atol\": 1e-9, \"cases\": [{\"output\": \"joint\", \"values\": {\"inlet_pressure\": 3.0},"
                + " \"logDensity\": -1.5}]}, \"extensions\": {\"site\": {\"station\": \"north\"}}";
        for (String sep : List.of(",\n", ",", ", ", ",\r\n\t", ",\n\n  ")) {
            String text = circuit(3000, sep, "", checks);
            assertTrue(assertSameRead("layout.json", text.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT),
                    "second half taken with separator " + sep.replace("\n", "\\n").replace("\r", "\\r").replace("\t", "\\t"));
        }
    }

    @Test
    void filesLargerThanTheScanBuffer_sameDocument_secondHalfTaken() throws Exception {
        // a few MB: the scanners refill their 1 MiB buffers many times, with nodes across the refills
        for (String sep : List.of(",\n", ",")) {
            String text = circuit(45_000, sep, "", "");
            assertTrue(text.length() > 3_000_000, text.length() + " bytes");
            assertTrue(assertSameRead("large.json", text.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT),
                    "second half taken");
        }
    }

    @Test
    void numbersAndIdsOfEveryForm_sameValuesToTheBitOrSameError() throws Exception {
        // valid forms are read straight from the bytes; the others are left to the parser, whose error is the reference
        List<String> weights = List.of("0", "-0", "1", "0.5", "-0.0", "1e-310", "4.9e-324", "2.2250738585072014e-308",
                "1.7976931348623157e308", "1E5", "1e+5", "1.5E-5", "123456789012345678", "1234567890123456789",
                "0.30000000000000004", "9007199254740993", "1e400", "-1e400", "01", "1.", ".5", "+1", "1e", "--1",
                "0x10", "1.5.5", "NaN", "1e-400", "12345678901234567890123.5", "\"1\"", "true", "null");
        for (String w : weights) {
            String text = circuit(200, ",\n", "", "").replace("\"weights\": [", "\"weights\": [" + w + ", ");
            assertSameRead("weight.json", text.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT);
            String param = circuit(200, ",\n", "", "").replaceFirst("\"sd\": [0-9.]+", "\"sd\": " + w);
            assertSameRead("param.json", param.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT);
        }
        for (String id : List.of("0", "7", "2147483647", "2147483648", "-1", "1.0", "1e2", "007", "99999999999")) {
            String text = circuit(200, ",\n", "", "").replace("{\"id\": 150,", "{\"id\": " + id + ",")
                    .replace("[150, ", "[" + id + ", ");
            assertSameRead("id.json", text.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT);
        }
    }

    @Test
    void problemsAfterTheSplit_sameErrorOrFindingAtTheSameLineAndColumn() throws Exception {
        // each problem sits in the second half (or after the nodes): the tail must not change what is reported
        List<String[]> cases = List.of(
                new String[] {"\"pressure_note\": 1", ""},
                new String[] {"\"weights\": [1]", ""},
                new String[] {"\"label\": 7", ""},
                new String[] {"\"logWeights\": [0, 0]", ""},
                new String[] {"", ", \"format\": \"circa.circuit\""},
                new String[] {"", ", \"outputs\": []"},
                new String[] {"", ", \"checks\": {\"cases\": [{\"output\": \"joint\"}]}"},
                new String[] {"", ", \"unknown_member\": {\"a\": [1, 2]}"},
                new String[] {"", ", \"checks\": {\"atol\": 1e999}"});
        for (String sep : List.of(",\n", ",")) {
            for (String[] c : cases) {
                String text = circuit(2000, sep, c[0], c[1]);
                assertSameRead("problem.json", text.getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT);
            }
            // a syntax error and a bad number late in the file; the nodes limit crossed in the second half
            String text = circuit(2000, sep, "", "");
            int late = text.length() * 7 / 8;
            assertSameRead("syntax.json", (text.substring(0, late) + "]" + text.substring(late)).getBytes(StandardCharsets.UTF_8),
                    ReadLimits.DEFAULT);
            assertSameRead("number.json", text.replace("1e-310]}]", "1e-310, 1e999]}]").getBytes(StandardCharsets.UTF_8),
                    ReadLimits.DEFAULT);
            assertSameRead("limit.json", text.getBytes(StandardCharsets.UTF_8),
                    new ReadLimits(ReadLimits.DEFAULT.maxBytes(), 1500, ReadLimits.DEFAULT.maxDepth(),
                            ReadLimits.DEFAULT.maxString(), ReadLimits.DEFAULT.maxNumber()));
        }
    }

    @Test
    void problemsBeforeTheSplit_reportedAsByOneThread_noThreadLeft() throws Exception {
        String text = circuit(2000, ",\n", "", "");
        int early = text.indexOf("\"nodes\"") + 200;
        for (String bad : List.of("}", "\"x\"", "[", "-")) {
            byte[] b = (text.substring(0, early) + bad + text.substring(early)).getBytes(StandardCharsets.UTF_8);
            assertSameRead("early.json", b, ReadLimits.DEFAULT);
        }
        Thread.getAllStackTraces().keySet().forEach(t -> assertTrue(!t.getName().equals("circa-read-tail") || !t.isAlive()
                || t.getState() == Thread.State.TERMINATED, "a tail thread is left: " + t));
    }

    @Test
    void splitInsideAStringOrAfterTheNodes_dropped_sameDocument() throws Exception {
        // labels full of "},{" around the middle: the guess may land inside a string, which the reader never meets
        StringBuilder sb = new StringBuilder(circuit(50, ",\n", "", ""));
        String label = "\"label\": \"" + "},{\\\"id\\\": 1},{".repeat(3000) + "\", ";
        int at = sb.indexOf("{\"id\": 25,") + 1;
        sb.insert(at, label);
        assertSameRead("string.json", sb.toString().getBytes(StandardCharsets.UTF_8), ReadLimits.DEFAULT);
        // a few nodes, then a large extension made of objects in an array: the middle is past the nodes
        String ext = ", \"extensions\": {\"log\": [" + "{\"id\": 1, \"sum\": [0]},".repeat(5000) + "{}]}";
        AtomicInteger events = new AtomicInteger();
        Path file = dir.resolve("ext.json");
        Files.writeString(file, circuit(20, ",\n", "", ext));
        String split = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> events.addAndGet(t ? 100 : 1)), file);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), file), split);
        assertEquals(1, events.get(), "the tail started and was dropped");
    }

    @Test
    void firstHalfStartedWhenTheFileIsOpened_takenWhereTheNodesAre_droppedUnheardWhenItGuessedAnotherArray() throws Exception {
        // both halves start before the parser is set up: the first from the first "nodes": [ in the file
        AtomicInteger tails = new AtomicInteger();
        AtomicInteger heads = new AtomicInteger();
        Path file = dir.resolve("heads.json");
        Files.writeString(file, circuit(400, ",\n", "", ""));
        String read = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> tails.addAndGet(t ? 100 : 1),
                h -> heads.addAndGet(h ? 100 : 1)), file);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), file), read);
        assertEquals(100, heads.get(), "the first half was taken");
        assertEquals(100, tails.get(), "the second half was taken");
        // an extension read first holds a "nodes" array of node-like objects: the first half guesses it, is
        // dropped unheard when the parser finds the circuit's own nodes elsewhere, and the read is the same
        String ext = "{\"extensions\": {\"pump_log\": {\"nodes\": [{\"id\": 0, \"sum\": [0], \"weights\": [1]}]}},\n";
        Path first = dir.resolve("ext-first.json");
        Files.writeString(first, circuit(400, ",\n", "", "").replaceFirst("\\{", java.util.regex.Matcher.quoteReplacement(ext)));
        heads.set(0);
        tails.set(0);
        read = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> tails.addAndGet(t ? 100 : 1),
                h -> heads.addAndGet(h ? 100 : 1)), first);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), first), read);
        assertTrue(Files.readString(first).startsWith("{\"extensions\": {\"pump_log\": {\"nodes\": ["), "the extension comes first");
        assertEquals(1, heads.get(), "the first half guessed the extension's array and was dropped");
        assertEquals(100, tails.get(), "the second half was taken");
        // a node the scanner leaves to the parser early in the first half: the head's nodes before it are
        // taken, the parser reads on from it and meets the second half as before
        Path early = dir.resolve("head-left.json");
        Files.writeString(early, circuit(400, ",\n", "", "").replaceFirst("\"id\": 3,", "\"id\": 3, \"note\": \"checked\","));
        heads.set(0);
        tails.set(0);
        read = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> tails.addAndGet(t ? 100 : 1),
                h -> heads.addAndGet(h ? 100 : 1)), early);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), early), read);
        assertTrue(read.contains("UNKNOWN_PROPERTY"), "the unknown property is found: " + read.substring(0, 200));
        assertEquals(100, heads.get(), "the first half's nodes before the left node were taken");
        assertEquals(100, tails.get(), "the second half was taken");
    }

    @Test
    void startedBeforeTheHeader_keptInsideTheNodes_droppedUnheardAndStartedAgainWhenInTheVariables() throws Exception {
        // the second half's reader starts before the first member, at a node near the middle of the whole file
        String plain = circuit(400, ",\n", "", "");
        AtomicInteger events = new AtomicInteger();
        Path file = dir.resolve("plain.json");
        Files.writeString(file, plain);
        String read = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> events.addAndGet(t ? 100 : 1)), file);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), file), read);
        assertEquals(100, events.get(), "the half started early was taken");
        // 3,000 variables before the nodes: the file's middle is in "variables", where the early start finds an
        // object after a comma the reader never meets; it is dropped unheard and one from the nodes' middle taken
        StringBuilder vars = new StringBuilder();
        for (int v = 0; v < 3000; v++) {
            vars.append(", {\"name\": \"bearing_temperature_").append(v).append("\", \"type\": \"real\"}");
        }
        String wide = plain.replace("\"states\": [\"closed\", \"half\", \"open\"]}", "\"states\": [\"closed\", \"half\", \"open\"]}" + vars);
        assertTrue(wide.indexOf("\"nodes\"") > wide.length() / 2, "the middle lies in the variables");
        events.set(0);
        Path wideFile = dir.resolve("wide.json");
        Files.writeString(wideFile, wide);
        read = outcome(new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> events.addAndGet(t ? 100 : 1)), wideFile);
        assertEquals(outcome(parserOnly(ReadLimits.DEFAULT), wideFile), read);
        assertEquals(100, events.get(), "one half heard of, from the nodes' middle, and taken");
    }

    @Test
    void mutatedFixturesAndLargerCircuits_splitReadSameAsSingleRead() throws Exception {
        List<byte[]> corpus = new java.util.ArrayList<>(CircuitReaderFuzzTest.fixtures());
        int fixtures = corpus.size();
        for (int k = 0; k < fixtures / 2; k++) {
            // as many larger circuits as fixtures: most of their mutations leave the middle intact
            corpus.add(circuit(100 + 37 * k, k % 2 == 0 ? ",\n" : ",", "", "").getBytes(StandardCharsets.UTF_8));
        }
        InputMutator mutator = new InputMutator(20261203L, corpus);
        int taken = 0;
        for (int i = 0; i < 1500; i++) {
            byte[] input = mutator.next();
            try {
                taken += assertSameRead("mutated.json", input, ReadLimits.DEFAULT) ? 1 : 0;
            } catch (AssertionError e) {
                throw new AssertionError("mutation " + i + " (" + mutator.lastMutations() + "): " + e.getMessage(), e);
            }
        }
        // most mutations break the text somewhere, so that the tail is dropped or never met; some leave it whole
        assertTrue(taken > 20, taken + " reads took the second half");
    }

    @Test
    void smallFileOrStream_readByOneThread() throws Exception {
        Path file = dir.resolve("small.json");
        Files.writeString(file, circuit(100, ",\n", "", ""));
        AtomicInteger events = new AtomicInteger();
        new CircuitReader(ReadLimits.DEFAULT, ALWAYS, Files.size(file) + 1, t -> events.incrementAndGet()).read(file);
        try (var in = Files.newInputStream(file)) {
            new CircuitReader(ReadLimits.DEFAULT, ALWAYS, ALWAYS, t -> events.incrementAndGet()).read(in, "small.json");
        }
        assertEquals(0, events.get(), "no second thread for a small file or a stream");
    }
}
