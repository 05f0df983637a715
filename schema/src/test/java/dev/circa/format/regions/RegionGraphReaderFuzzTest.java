package dev.circa.format.regions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.io.InputMutator;
import dev.circa.format.io.OwnErrors;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Fuzzing the region graph reader (issue 8): any bytes yield a region graph or our own located
 * {@code FormatException}, under the default limits and tight ones; a graph that is read rewrites
 * to bytes that read back and rewrite the same. {@link #read} is a Jazzer fuzz test (seed corpus in
 * {@code src/test/resources/dev/circa/format/regions/RegionGraphReaderFuzzTestInputs/read/}); the
 * mutation loop runs the same property over 10,000 mutations of the region graphs of {@code fixtures/}.
 */
class RegionGraphReaderFuzzTest {
    private static final String FILE = "fuzz.json";
    private static final ReadLimits TIGHT = new ReadLimits(1500, 6, 5, 40, 12);

    @FuzzTest(maxDuration = "10m")
    void read(byte[] input) {
        check(input);
    }

    @Test
    void read_tenThousandMutationsOfFixtures_graphOrLocatedError() {
        InputMutator mutator = new InputMutator(20261204L, fixtures());
        int[] outcome = new int[2];
        assertTimeoutPreemptively(Duration.ofSeconds(60), () -> {
            for (int i = 0; i < 10_000; i++) {
                byte[] input = mutator.next();
                try {
                    outcome[check(input) ? 0 : 1]++;
                } catch (AssertionError e) {
                    throw new AssertionError("mutation " + i + " (" + mutator.lastMutations() + "): " + e.getMessage(), e);
                }
            }
        });
        assertTrue(outcome[0] > 50 && outcome[1] > 1000, outcome[0] + " graphs, " + outcome[1] + " errors");
    }

    static boolean check(byte[] input) {
        RegionGraph g = OwnErrors.modelOrLocatedError(FILE, true, input,
                b -> new RegionGraphReader().read(new ByteArrayInputStream(b), FILE));
        OwnErrors.modelOrLocatedError(FILE, true, input, b -> new RegionGraphReader(TIGHT).read(new ByteArrayInputStream(b), FILE));
        if (g == null) {
            return false;
        }
        byte[] once = rewrite(g, input);
        RegionGraph again = OwnErrors.modelOrLocatedError("rewritten.json", true, once,
                b -> new RegionGraphReader().read(new ByteArrayInputStream(b), "rewritten.json"));
        if (again == null) {
            throw new AssertionError("the rewrite of a graph that was read is rejected: " + OwnErrors.show(once)
                    + " from input " + OwnErrors.show(input));
        }
        assertArrayEquals(once, rewrite(again, input), () -> "rewrite is not stable for input " + OwnErrors.show(input));
        return true;
    }

    private static byte[] rewrite(RegionGraph g, byte[] input) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            new RegionGraphWriter().write(g, out);
        } catch (IOException | RuntimeException e) {
            throw new AssertionError("writing a graph that was read failed: " + e + " for input " + OwnErrors.show(input), e);
        }
        return out.toByteArray();
    }

    /** The region graph documents of {@code fixtures/}. */
    static List<byte[]> fixtures() {
        List<byte[]> l = new ArrayList<>();
        try (Stream<Path> s = Files.walk(Path.of("..", "fixtures"))) {
            for (Path p : s.filter(f -> f.toString().endsWith(".json")).sorted().toList()) {
                byte[] b = Files.readAllBytes(p);
                if (new String(b, java.nio.charset.StandardCharsets.UTF_8).contains("\"circa.regions\"")) {
                    l.add(b);
                }
            }
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
        assertTrue(l.size() >= 2, l.size() + " region graph fixtures");
        return l;
    }
}
