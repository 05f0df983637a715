package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.CircuitDocument;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Fuzzing the circuit reader (issue 8): any bytes yield a document or our own located
 * {@link FormatException}, under the default limits and under tight ones. A document that is read
 * must survive a rewrite: the rewritten bytes read back and rewrite to the same bytes.
 *
 * <p>{@link #read} is a Jazzer fuzz test: in the normal test run it replays its seed corpus in
 * {@code src/test/resources/dev/circa/format/io/CircuitReaderFuzzTestInputs/read/} (copies of
 * {@code fixtures/} documents and cases that once failed); with {@code JAZZER_FUZZ=1} it fuzzes.
 * {@link #read_tenThousandMutationsOfFixtures_documentOrLocatedError} is the seeded mutation loop.
 */
class CircuitReaderFuzzTest {
    /** Small enough that mutated fixtures hit every limit now and then. */
    private static final ReadLimits TIGHT = new ReadLimits(1500, 6, 5, 40, 12);

    @FuzzTest(maxDuration = "10m")
    void read(byte[] input) {
        check(input);
    }

    @Test
    void read_tenThousandMutationsOfFixtures_documentOrLocatedError() {
        List<byte[]> corpus = fixtures();
        InputMutator mutator = new InputMutator(20261201L, corpus);
        int[] outcome = mutator.run(10_000, input -> check(input));
        // Both outcomes occur, so the loop exercises the reader past its first token.
        assertTrue(outcome[0] > 50 && outcome[1] > 1000, outcome[0] + " documents, " + outcome[1] + " errors");
    }

    /** RFC 1952: a damaged gzip member (header, deflate data, CRC-32 or length) is reported, never thrown otherwise. */
    @Test
    void read_twoThousandMutatedGzipFiles_documentOrFormatExceptionNamingTheFile(@TempDir Path dir) throws IOException {
        List<byte[]> corpus = new ArrayList<>();
        for (byte[] b : fixtures().subList(0, 4)) {
            corpus.add(CircuitReaderHardeningTest.gzip(b));
        }
        Path file = dir.resolve("mutated.json.gz");
        InputMutator mutator = new InputMutator(20261211L, corpus);
        int[] outcome = new int[2];
        assertTimeoutPreemptively(Duration.ofSeconds(60), () -> {
            for (int i = 0; i < 2000; i++) {
                byte[] input = mutator.next();
                Files.write(file, input);
                try {
                    // no line for a file that is not gzip at all; the JSON inside has lines
                    CircuitDocument doc = OwnErrors.modelOrLocatedError(file.toString(), false, input, b -> new CircuitReader().read(file));
                    outcome[doc != null ? 0 : 1]++;
                } catch (AssertionError e) {
                    throw new AssertionError("mutation " + i + " (" + mutator.lastMutations() + "): " + e.getMessage(), e);
                }
            }
        });
        assertTrue(outcome[1] > 1000, outcome[0] + " documents, " + outcome[1] + " errors");
    }

    /** The property; returns whether the input was read as a document under the default limits. */
    static boolean check(byte[] input) {
        return OwnErrors.readsAndRewritesStably(input, TIGHT, (limits, in, file) -> new CircuitReader(limits).read(in, file),
                (doc, out) -> new CircuitWriter().write(doc, out));
    }

    /** The circuit documents of {@code fixtures/}: the example and the schema corpus, valid and invalid. */
    static List<byte[]> fixtures() {
        List<byte[]> l = new ArrayList<>();
        Path root = Path.of("..", "fixtures");
        try (Stream<Path> s = Files.walk(root)) {
            for (Path p : s.filter(f -> f.toString().endsWith(".json") && isCircuit(f)).sorted().toList()) {
                l.add(Files.readAllBytes(p));
            }
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
        assertTrue(l.size() > 10, l.size() + " circuit fixtures");
        return l;
    }

    private static boolean isCircuit(Path p) {
        try {
            return Files.readString(p).contains("\"circa.circuit\"");
        } catch (IOException e) {
            return false;
        }
    }
}
