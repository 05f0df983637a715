package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.InputMutator;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * 1,200 mutated circuits and data files through the whole command line, reader, compiler and engine included
 * (issue 8): every run ends with status 0 or with status 2 and one message naming the file, never
 * an unexpected error or a stack trace, and a failed run writes no output. The message names the
 * input it is about ({@code --given} naming a column the mutated header lost is a usage error).
 */
class CliMutationTest {
    @TempDir
    Path dir;

    @Test
    void evalAndSample_sixHundredMutatedCircuits_doneOrOneMessageNamingTheFile() throws IOException {
        List<byte[]> corpus = new ArrayList<>();
        corpus.add(Files.readAllBytes(Cli.EXAMPLE));
        try (Stream<Path> s = Files.list(Path.of("..", "fixtures", "schema-corpus", "circuit", "valid"))) {
            for (Path p : s.sorted().toList()) {
                corpus.add(Files.readAllBytes(p));
            }
        }
        Path data = dir.resolve("readings.csv");
        Files.copy(Cli.READINGS, data);
        Path circuit = dir.resolve("mutated.json");
        Path out = dir.resolve("out.csv");
        InputMutator mutator = new InputMutator(20261209L, corpus);
        int[] status = new int[3];
        assertTimeoutPreemptively(Duration.ofSeconds(90), () -> {
            for (int i = 0; i < 600; i++) {
                Files.write(circuit, mutator.next());
                String[] args = i % 2 == 0
                        ? new String[] {"eval", circuit.toString(), "--data", data.toString(), "-o", out.toString()}
                        : new String[] {"sample", circuit.toString(), "-n", "5", "--seed", Integer.toString(i), "-o", out.toString()};
                String what = "mutation " + i + " (" + mutator.lastMutations() + ")";
                status[check(args, List.of(circuit.toString(), data.toString()), out, what)]++;
                Files.deleteIfExists(out);
            }
        });
        // commands validate first, so few mutants are usable; both outcomes must still occur
        assertTrue(status[0] > 0 && status[2] > 300, status[0] + " done, " + status[2] + " unusable");
    }

    @Test
    void eval_sixHundredMutatedDataFiles_doneOrOneMessageNamingTheFile() throws IOException {
        List<byte[]> corpus = List.of(Files.readAllBytes(Cli.READINGS),
                "valve,inlet_pressure\r\n\"open\",3.0\r\n,\r\nhalf,2.5\r\n# end\r\n".getBytes(java.nio.charset.StandardCharsets.UTF_8));
        Path data = dir.resolve("mutated.csv");
        Path out = dir.resolve("out.csv");
        InputMutator mutator = new InputMutator(20261210L, corpus);
        int[] status = new int[3];
        assertTimeoutPreemptively(Duration.ofSeconds(90), () -> {
            for (int i = 0; i < 600; i++) {
                Files.write(data, mutator.next());
                String command = i % 3 == 0 ? "impute" : "eval";
                String[] args = i % 3 == 1
                        ? new String[] {command, Cli.EXAMPLE.toString(), "--data", data.toString(), "--given", "valve", "-o", out.toString()}
                        : new String[] {command, Cli.EXAMPLE.toString(), "--data", data.toString(), "-o", out.toString()};
                status[check(args, List.of(data.toString(), Cli.EXAMPLE.toString()), out, "mutation " + i + " (" + mutator.lastMutations() + ")")]++;
                Files.deleteIfExists(out);
            }
        });
        assertTrue(status[0] > 30 && status[2] > 300, status[0] + " done, " + status[2] + " unusable");
    }

    /** Runs {@code args}; checks the outcome and returns the status (0 or 2; 1 is not expected of these commands). */
    private static int check(String[] args, List<String> files, Path out, String what) {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int s = Main.run(args, new PrintWriter(o, true), new PrintWriter(e, true));
        String err = e.toString();
        Cli.Result r = new Cli.Result(args, s, o.toString(), err);
        assertFalse(err.contains("unexpected error") || err.contains("internal error") || err.contains("\tat ") || err.contains("Exception"),
                () -> what + ": " + r.describe());
        if (s == ExitStatus.OK) {
            assertTrue(Files.exists(out), () -> what + ": done without output: " + r.describe());
            return s;
        }
        assertEquals(ExitStatus.UNUSABLE, s, () -> what + ": " + r.describe());
        assertEquals(1, r.messages(), () -> what + ": " + r.describe());
        assertTrue(files.stream().anyMatch(f -> r.message().startsWith("circa: " + f + ":")) || r.message().startsWith("circa: --given"),
                () -> what + ": message does not name an input: " + r.describe());
        assertFalse(Files.exists(out), () -> what + ": a failed run left an output: " + r.describe());
        return s;
    }
}
