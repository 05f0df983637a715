package dev.circa.format.regions;

import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.io.InputMutator;
import dev.circa.format.io.OwnErrors;
import dev.circa.format.io.ReadLimits;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
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
    private static final ReadLimits TIGHT = new ReadLimits(1500, 6, 5, 40, 12);

    @FuzzTest(maxDuration = "10m")
    void read(byte[] input) {
        check(input);
    }

    @Test
    void read_tenThousandMutationsOfFixtures_graphOrLocatedError() {
        InputMutator mutator = new InputMutator(20261204L, fixtures());
        int[] outcome = mutator.run(10_000, input -> check(input));
        assertTrue(outcome[0] > 50 && outcome[1] > 1000, outcome[0] + " graphs, " + outcome[1] + " errors");
    }

    /** The property; returns whether the input was read as a document under the default limits. */
    static boolean check(byte[] input) {
        return OwnErrors.readsAndRewritesStably(input, TIGHT, (limits, in, file) -> new RegionGraphReader(limits).read(in, file),
                (doc, out) -> new RegionGraphWriter().write(doc, out));
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
