package dev.circa.converter.npz;

import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.io.InputMutator;
import dev.circa.format.io.OwnErrors;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import java.util.zip.ZipEntry;
import java.util.zip.ZipInputStream;
import org.junit.jupiter.api.Test;

/**
 * Fuzzing the {@code .npz} reader (issue 8): any bytes yield an archive of arrays or our own
 * {@code FormatException} naming the file (binary input has no lines), read as a stream and
 * through the zip central directory of a file, under a generous and a tight byte budget. The
 * {@code .npy} entries alone are fuzzed too, since mutations of a whole archive mostly break its
 * CRC-32 before the array header is parsed. {@link #archive} and {@link #npy} are Jazzer fuzz tests
 * (seed corpora in {@code src/test/resources/dev/circa/converter/npz/NpzArchiveFuzzTestInputs/});
 * the mutation loops run the same properties over 10,000 mutations each of the NumPy-written
 * files of {@code fixtures/npz/}.
 */
class NpzArchiveFuzzTest {
    private static final String FILE = "fuzz.npz";
    private static final long BUDGET = 1 << 20;
    private static final long TIGHT = 600;

    @FuzzTest(maxDuration = "10m")
    void archive(byte[] input) {
        checkArchive(input);
    }

    @FuzzTest(maxDuration = "10m")
    void npy(byte[] input) {
        checkNpy(input);
    }

    @Test
    void archive_tenThousandMutationsOfFixtures_arraysOrFormatException() throws IOException {
        Path file = Files.createTempFile("fuzz", ".npz");
        try {
            InputMutator mutator = new InputMutator(20261206L, archives());
            int[] outcome = new int[2];
            assertTimeoutPreemptively(Duration.ofSeconds(60), () -> {
                for (int i = 0; i < 10_000; i++) {
                    byte[] input = mutator.next();
                    try {
                        outcome[checkArchive(input) ? 0 : 1]++;
                        // every tenth through a file, which reads the central directory
                        if (i % 10 == 0) {
                            Files.write(file, input);
                            OwnErrors.modelOrLocatedError(file.toString(), false, input, b -> NpzArchive.read(file, BUDGET));
                        }
                    } catch (AssertionError e) {
                        throw new AssertionError("mutation " + i + " (" + mutator.lastMutations() + "): " + e.getMessage(), e);
                    }
                }
            });
            assertTrue(outcome[0] > 10 && outcome[1] > 1000, outcome[0] + " archives, " + outcome[1] + " errors");
        } finally {
            Files.deleteIfExists(file);
        }
    }

    @Test
    void npy_tenThousandMutationsOfFixtureEntries_arrayOrFormatException() throws IOException {
        InputMutator mutator = new InputMutator(20261207L, entries());
        int[] outcome = mutator.run(10_000, input -> checkNpy(input));
        assertTrue(outcome[0] > 100 && outcome[1] > 1000, outcome[0] + " arrays, " + outcome[1] + " errors");
    }

    static boolean checkArchive(byte[] input) {
        OwnErrors.modelOrLocatedError(FILE, false, input, b -> NpzArchive.read(new ByteArrayInputStream(b), FILE, TIGHT));
        return OwnErrors.modelOrLocatedError(FILE, false, input,
                b -> NpzArchive.read(new ByteArrayInputStream(b), FILE, BUDGET)) != null;
    }

    static boolean checkNpy(byte[] input) {
        OwnErrors.modelOrLocatedError(FILE, false, input, b -> NpyFormat.read(new ByteArrayInputStream(b), "a", FILE, TIGHT));
        return OwnErrors.modelOrLocatedError(FILE, false, input,
                b -> NpyFormat.read(new ByteArrayInputStream(b), "a", FILE, BUDGET)) != null;
    }

    /** The NumPy-written archives of {@code fixtures/npz/}. */
    static List<byte[]> archives() throws IOException {
        List<byte[]> l = new ArrayList<>();
        try (Stream<Path> s = Files.list(Path.of("..", "fixtures", "npz"))) {
            for (Path p : s.filter(f -> f.toString().endsWith(".npz")).sorted().toList()) {
                l.add(Files.readAllBytes(p));
            }
        }
        assertTrue(l.size() >= 2, l.size() + " archives");
        return l;
    }

    /** The {@code .npy} entries of those archives. */
    static List<byte[]> entries() throws IOException {
        List<byte[]> l = new ArrayList<>();
        for (byte[] a : archives()) {
            try (ZipInputStream z = new ZipInputStream(new ByteArrayInputStream(a))) {
                ZipEntry e;
                while ((e = z.getNextEntry()) != null) {
                    l.add(((InputStream) z).readAllBytes());
                }
            }
        }
        return l;
    }
}
