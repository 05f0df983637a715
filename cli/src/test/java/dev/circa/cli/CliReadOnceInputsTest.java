package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.CompletableFuture;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Inputs that can be read only once (standard input, FIFOs, the pipes of {@code <(cat f)}) are read
 * like files, their kind told from the content, and a second {@code -} is refused (issue 15). The
 * documents are the bundled fixtures; a run on the same fixture by file name is the reference.
 */
class CliReadOnceInputsTest {
    private static final Path FIXTURES = Path.of("..", "fixtures");
    private static final Path CIRCUIT = FIXTURES.resolve("circuits/pump-station.json");
    private static final Path MIXTURE = FIXTURES.resolve("mixtures/pump-station-regimes.yaml");
    private static final Path REGIONS = FIXTURES.resolve("npz/example-regions.json");
    private static final Path PARAMS = FIXTURES.resolve("npz/example-params.npz");
    private static final Path READINGS = FIXTURES.resolve("data/pump-station-readings.csv");

    @TempDir
    Path dir;
    private final InputStream stdin = System.in;

    @AfterEach
    void restore() {
        System.setIn(stdin);
    }

    private record Run(int status, String out, String err) {
    }

    private static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(status, out.toString(), err.toString());
    }

    private static Run withStdin(byte[] bytes, String... args) {
        System.setIn(new ByteArrayInputStream(bytes));
        return run(args);
    }

    /** A FIFO fed with {@code content} by another thread (the writer blocks until the reader opens it). */
    private Path fifo(String name, Path content) throws Exception {
        Path fifo = dir.resolve(name);
        assertEquals(0, new ProcessBuilder("mkfifo", fifo.toString()).inheritIO().start().waitFor());
        CompletableFuture.runAsync(() -> {
            try (OutputStream o = Files.newOutputStream(fifo)) {
                o.write(Files.readAllBytes(content));
            } catch (IOException e) {
                // the reader saw the end of the input; the test's assertions say what went wrong
            }
        });
        return fifo;
    }

    @Test
    void validate_fifo_readsLikeTheFile() throws Exception {
        Run byName = run("validate", CIRCUIT.toString());
        Run r = run("validate", fifo("circuit.pipe", CIRCUIT).toString());
        assertEquals(0, r.status(), r::toString);
        assertEquals(byName.out().lines().skip(1).toList(), r.out().lines().skip(1).toList());
        assertFalse(r.err().contains("seek"), r::err);
    }

    @Test
    void validate_standardInput_jsonAndGzip() throws Exception {
        byte[] json = Files.readAllBytes(CIRCUIT);
        Run plain = withStdin(json, "validate", "--format", "json", "-");
        assertEquals(0, plain.status(), plain::toString);
        assertTrue(plain.out().contains("\"valid\" : true"), plain::out);
        ByteArrayOutputStream gz = new ByteArrayOutputStream();
        try (GZIPOutputStream g = new GZIPOutputStream(gz)) {
            g.write(json);
        }
        Run zipped = withStdin(gz.toByteArray(), "validate", "-");
        assertEquals(0, zipped.status(), zipped::toString);
    }

    @Test
    void convert_yamlAndJsonFromStandardInput_toldByContent() throws Exception {
        Path fromFile = dir.resolve("from-file.json");
        Path fromStdin = dir.resolve("from-stdin.json");
        assertEquals(0, run("convert", MIXTURE.toString(), "-o", fromFile.toString()).status());
        Run yaml = withStdin(Files.readAllBytes(MIXTURE), "convert", "-", "-o", fromStdin.toString());
        assertEquals(0, yaml.status(), yaml::toString);
        // the same circuit, apart from the provenance's time and source
        assertEquals(Files.readString(fromFile).replaceAll("\"provenance\"[^}]*}", ""),
                Files.readString(fromStdin).replaceAll("\"provenance\"[^}]*}", ""));
        Run regions = withStdin(Files.readAllBytes(REGIONS), "convert", "-", "--params", fifo("params.pipe", PARAMS).toString(),
                "--sums", "3", "--inputs", "2", "--outputs", "1", "-o", dir.resolve("st.json").toString());
        assertEquals(0, regions.status(), regions::toString);
    }

    @Test
    void evalData_fromAFifo_sameRowsAsFromTheFile() throws Exception {
        Run byName = run("eval", CIRCUIT.toString(), "--data", READINGS.toString());
        Run r = run("eval", CIRCUIT.toString(), "--data", fifo("data.pipe", READINGS).toString());
        assertEquals(0, r.status(), r::toString);
        assertEquals(byName.out(), r.out());
    }

    @Test
    void secondDash_isRefusedNamingBothUses_beforeAnyWork() {
        Run compare = withStdin(new byte[0], "compare", "-", "-");
        assertEquals(ExitStatus.UNUSABLE, compare.status(), compare::toString);
        assertTrue(compare.err().startsWith("circa: standard input (-) can be read only once, but 2 inputs name it (A, B)"),
                compare::err);
        Run check = withStdin(new byte[0], "check", CIRCUIT.toString(), "--reference", "-", "--reference", "-");
        assertEquals(ExitStatus.UNUSABLE, check.status(), check::toString);
        assertTrue(check.err().contains("2 inputs name it (--reference, --reference)"), check::err);
        Run validate = withStdin(new byte[0], "validate", "-", CIRCUIT.toString(), "-");
        assertEquals(ExitStatus.UNUSABLE, validate.status(), validate::toString);
        // one input and standard output: allowed
        Run one = withStdin(("inlet_pressure,valve\n3.0,open\n").getBytes(java.nio.charset.StandardCharsets.UTF_8),
                "eval", CIRCUIT.toString(), "--data", "-", "-o", "-");
        assertEquals(0, one.status(), one::toString);
    }

    @Test
    void fifo_readTwice_byTheReaderAndTheSchemaCheck() throws Exception {
        // the circuit reader and the JSON Schema check each open the input: one writer of the FIFO suffices
        Run r = run("validate", "--schema-check", "always", "--format", "json", fifo("twice.pipe", CIRCUIT).toString());
        assertEquals(0, r.status(), r::toString);
        assertTrue(r.out().contains("\"valid\" : true"), r::out);
    }
}
