package dev.circa.format.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.io.InputMutator;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.OwnErrors;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Fuzzing the mixture reader (issue 8), as JSON, as YAML and by content: any bytes yield a mixture
 * document or our own located {@code FormatException}, under the default limits and tight ones.
 * {@link #json} and {@link #yaml} are Jazzer fuzz tests (seed corpora in
 * {@code src/test/resources/dev/circa/format/mixture/MixtureReaderFuzzTestInputs/}); the mutation
 * loop runs the property over 10,000 mutations of the mixture documents of {@code fixtures/}.
 */
class MixtureReaderFuzzTest {
    private static final String FILE = "fuzz.mixture";
    private static final ReadLimits TIGHT = new ReadLimits(1500, 6, 5, 40, 12);

    @FuzzTest(maxDuration = "10m")
    void json(byte[] input) {
        check(input, MixtureReader.Syntax.JSON);
    }

    @FuzzTest(maxDuration = "10m")
    void yaml(byte[] input) {
        check(input, MixtureReader.Syntax.YAML);
    }

    @Test
    void read_tenThousandMutationsOfFixtures_documentOrLocatedError() {
        InputMutator mutator = new InputMutator(20261205L, fixtures());
        MixtureReader.Syntax[] syntaxes = {MixtureReader.Syntax.JSON, MixtureReader.Syntax.YAML, null};
        int[] i = {0};
        int[] outcome = mutator.run(10_000, input -> check(input, syntaxes[i[0]++ % 3]));
        assertTrue(outcome[0] > 50 && outcome[1] > 1000, outcome[0] + " documents, " + outcome[1] + " errors");
    }

    /**
     * Expressions nest by recursive descent, bounded by {@code --max-depth}: with the limit raised
     * far beyond the default (64), 20,000 nested mixtures end in a located limit error naming the
     * option, as JSON and as YAML, instead of a StackOverflowError.
     */
    @Test
    void read_deepMixturesUnderRaisedDepthLimit_locatedErrorNamingMaxDepth() {
        StringBuilder yaml = new StringBuilder("format: circa.mixture\nversion: \"1.0\"\nvariables:\n  - {name: x, type: real}\nmodel: {");
        StringBuilder json = new StringBuilder("{\"format\": \"circa.mixture\", \"version\": \"1.0\", "
                + "\"variables\": [{\"name\": \"x\", \"type\": \"real\"}], \"model\": {");
        for (int i = 0; i < 20_000; i++) {
            yaml.append("mixture: [{weight: 1, ");
            json.append("\"mixture\": [{\"weight\": 1, ");
        }
        yaml.append("var: x, normal: {mean: 0, sd: 1}");
        json.append("\"var\": \"x\", \"normal\": {\"mean\": 0, \"sd\": 1}");
        for (int i = 0; i < 20_000; i++) {
            yaml.append("}]");
            json.append("}]");
        }
        yaml.append("}\n");
        json.append("}}");
        ReadLimits raised = ReadLimits.DEFAULT.withMaxDepth(1_000_000);
        for (String text : new String[] {yaml.toString(), json.toString()}) {
            byte[] b = text.getBytes(java.nio.charset.StandardCharsets.UTF_8);
            assertTimeoutPreemptively(Duration.ofSeconds(30), () -> {
                try {
                    // a thread stack large enough to follow the whole depth reads the document
                    MixtureReader.read(new ByteArrayInputStream(b), FILE, null, raised);
                } catch (LimitExceededException e) {
                    OwnErrors.assertLocated(FILE, true, e, b);
                    assertEquals(ReadLimits.MAX_DEPTH, e.option(), e.getMessage());
                }
            });
        }
    }

    /** The property; returns whether the input was read under the default limits. */
    static boolean check(byte[] input, MixtureReader.Syntax syntax) {
        OwnErrors.modelOrLocatedError(FILE, true, input,
                b -> MixtureReader.read(new ByteArrayInputStream(b), FILE, syntax, TIGHT));
        return OwnErrors.modelOrLocatedError(FILE, true, input,
                b -> MixtureReader.read(new ByteArrayInputStream(b), FILE, syntax, ReadLimits.DEFAULT)) != null;
    }

    /** The mixture documents of {@code fixtures/}, JSON and YAML. */
    static List<byte[]> fixtures() {
        List<byte[]> l = new ArrayList<>();
        try (Stream<Path> s = Files.walk(Path.of("..", "fixtures"))) {
            for (Path p : s.filter(f -> f.toString().matches(".*\\.(json|yaml|yml)")).sorted().toList()) {
                byte[] b = Files.readAllBytes(p);
                if (new String(b, java.nio.charset.StandardCharsets.UTF_8).contains("circa.mixture")) {
                    l.add(b);
                }
            }
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
        assertTrue(l.size() >= 3, l.size() + " mixture fixtures");
        return l;
    }
}
