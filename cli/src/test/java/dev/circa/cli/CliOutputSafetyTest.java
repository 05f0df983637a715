package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Outputs are written whole or not at all, inputs are never modified, and {@code -o} naming an input
 * is refused however it is spelled (CLI.md, exit status; issue 8).
 */
class CliOutputSafetyTest {
    private static final byte[] OLD = "the old content of the output, kept byte for byte\n".getBytes(java.nio.charset.StandardCharsets.UTF_8);

    @TempDir
    Path dir;
    private Path circuit;
    private Path data;

    @BeforeEach
    void setUp() throws IOException {
        circuit = dir.resolve("x.json");
        Files.copy(Cli.EXAMPLE, circuit);
        data = dir.resolve("readings.csv");
        Files.copy(Cli.READINGS, data);
    }

    @Test
    void evalAndImpute_badCellInRow5000_existingOutputUntouchedAndNoTemporaryFile() throws IOException {
        StringBuilder sb = new StringBuilder("inlet_pressure,valve\n");
        for (int row = 1; row < 5000; row++) {
            sb.append(row % 7 == 0 ? "" : String.format(java.util.Locale.ROOT, "%.3f", 2 + row % 13 * 0.1))
                    .append(',').append(row % 3 == 0 ? "" : row % 3 == 1 ? "open" : "half").append('\n');
        }
        sb.append("3.0,wide\n");
        Path big = dir.resolve("big.csv");
        Files.writeString(big, sb);
        Path existing = dir.resolve("existing.csv");
        for (String command : List.of("eval", "impute")) {
            Files.write(existing, OLD);
            String[] before = Cli.listing(dir);
            Cli.Result r = Cli.run(command, circuit.toString(), "--data", big.toString(), "-o", existing.toString());
            // row 5000 is line 5001 of the file, after the header
            Cli.assertUnusable(r, big + ":5001:", "wide");
            assertArrayEquals(OLD, Files.readAllBytes(existing), command + ": the old output changed");
            assertArrayEquals(before, Cli.listing(dir), command + ": a file was left behind");
        }
        // the same file without the bad row goes through and replaces the output
        Files.writeString(big, sb.substring(0, sb.length() - "3.0,wide\n".length()));
        Cli.Result ok = Cli.run("eval", circuit.toString(), "--data", big.toString(), "-o", existing.toString());
        assertEquals(ExitStatus.OK, ok.status(), ok::describe);
        assertEquals(5000, Files.readAllLines(existing).size(), "header and 4,999 rows");
    }

    @Test
    void sample_failingCircuit_existingOutputUntouched() throws IOException {
        Path bad = dir.resolve("bad.json");
        Files.writeString(bad, Files.readString(circuit).replace("\"sd\": 0.2", "\"sd\": NaN"));
        Path existing = dir.resolve("existing.csv");
        Files.write(existing, OLD);
        String[] before = Cli.listing(dir);
        Cli.assertUnusable(Cli.run("sample", bad.toString(), "-n", "10", "-o", existing.toString()), bad.toString(), "NaN");
        assertArrayEquals(OLD, Files.readAllBytes(existing));
        assertArrayEquals(before, Cli.listing(dir));
    }

    @Test
    void normalizeAndRender_failingCircuit_existingOutputUntouched() throws IOException {
        Path bad = dir.resolve("bad.json");
        Files.writeString(bad, Files.readString(circuit).replace("\"product\": [0, 1]", "\"product\": [0, 0]"));
        Path existing = dir.resolve("existing.out");
        for (String command : List.of("normalize", "render")) {
            Files.write(existing, OLD);
            String[] before = Cli.listing(dir);
            Cli.Result r = Cli.run(command, bad.toString(), "-o", existing.toString());
            assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
            Cli.assertNoStackTrace(r);
            assertArrayEquals(OLD, Files.readAllBytes(existing), command);
            assertArrayEquals(before, Cli.listing(dir), command);
        }
    }

    @Test
    void everyCommand_inputsChecksummedBeforeAndAfter_unchanged() throws IOException {
        Path gz = dir.resolve("x.json.gz");
        Files.write(gz, CliMalformedInputTest.gzip(Files.readAllBytes(circuit)));
        Map<Path, String> sums = new LinkedHashMap<>();
        for (Path p : List.of(circuit, data, gz)) {
            sums.put(p, Cli.sha256(p));
        }
        List<String[]> runs = new ArrayList<>();
        runs.add(new String[] {"eval", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("e.csv").toString()});
        runs.add(new String[] {"eval", gz.toString(), "--data", data.toString(), "--given", "valve", "-o", dir.resolve("g.csv").toString()});
        runs.add(new String[] {"impute", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("i.csv").toString()});
        runs.add(new String[] {"sample", gz.toString(), "-n", "50", "--seed", "3", "-o", dir.resolve("s.csv.gz").toString()});
        runs.add(new String[] {"validate", circuit.toString(), gz.toString(), "--format", "sarif"});
        runs.add(new String[] {"inspect", gz.toString()});
        runs.add(new String[] {"check", circuit.toString()});
        runs.add(new String[] {"compare", circuit.toString(), gz.toString(), "--samples", "50"});
        runs.add(new String[] {"normalize", gz.toString(), "-o", dir.resolve("n.json").toString()});
        runs.add(new String[] {"render", circuit.toString(), "-o", dir.resolve("r.dot").toString()});
        for (String[] args : runs) {
            Cli.Result r = Cli.run(args);
            assertEquals(ExitStatus.OK, r.status(), r::describe);
            for (Map.Entry<Path, String> e : sums.entrySet()) {
                assertEquals(e.getValue(), Cli.sha256(e.getKey()), String.join(" ", args) + " changed " + e.getKey());
            }
        }
    }

    @Test
    void outputNamingAnInput_refusedHoweverSpelled() throws IOException {
        Path sub = Files.createDirectory(dir.resolve("sub"));
        Path link = dir.resolve("link.json");
        Files.createSymbolicLink(link, circuit);
        Path dataLink = sub.resolve("data-link.csv");
        Files.createSymbolicLink(dataLink, data);
        Path hard = dir.resolve("hard.csv");
        Files.createLink(hard, data);
        List<String> spellings = List.of(circuit.toString(), dir + "/./x.json", sub + "/../x.json", link.toString());
        Map<Path, String> sums = Map.of(circuit, Cli.sha256(circuit), data, Cli.sha256(data));
        for (String target : spellings) {
            for (String command : List.of("eval", "impute")) {
                Cli.Result r = Cli.run(command, circuit.toString(), "--data", data.toString(), "-o", target);
                Cli.assertUnusable(r, target, "refusing to write over an input file");
            }
            Cli.assertUnusable(Cli.run("sample", circuit.toString(), "-n", "5", "-o", target), target,
                    "refusing to write over an input file");
            for (String command : List.of("normalize", "render")) {
                Cli.assertUnusable(Cli.run(command, circuit.toString(), "-o", target), target, "refusing to write over an input file");
            }
        }
        for (String target : List.of(data.toString(), sub + "/../readings.csv", dataLink.toString(), hard.toString())) {
            Cli.Result r = Cli.run("eval", circuit.toString(), "--data", data.toString(), "-o", target);
            Cli.assertUnusable(r, target, "refusing to write over an input file");
        }
        // relative spellings, resolved against the working directory
        Path cwd = Path.of("").toAbsolutePath();
        Path relative = cwd.relativize(circuit);
        Cli.assertUnusable(Cli.run("sample", relative.toString(), "-n", "5", "-o", "./" + relative), "./" + relative,
                "refusing to write over an input file");
        for (Map.Entry<Path, String> e : sums.entrySet()) {
            assertEquals(e.getValue(), Cli.sha256(e.getKey()), e.getKey() + " changed");
        }
        assertTrue(Files.isSymbolicLink(link) && Files.isSymbolicLink(dataLink));
        assertArrayEquals(new String[] {"hard.csv", "link.json", "readings.csv", "sub", "x.json"}, Cli.listing(dir));
    }

    @Test
    void output_folderOrMissingFolder_status2NamingIt() throws IOException {
        Path folder = Files.createDirectory(dir.resolve("out"));
        Files.writeString(folder.resolve("keep.txt"), "keep");
        Cli.assertUnusable(Cli.run("sample", circuit.toString(), "-n", "5", "-o", folder.toString()), folder.toString(), "folder");
        Path missing = dir.resolve("nowhere").resolve("s.csv");
        Cli.assertUnusable(Cli.run("sample", circuit.toString(), "-n", "5", "-o", missing.toString()), missing.toString(),
                "does not exist");
        assertArrayEquals(new String[] {"keep.txt"}, Cli.listing(folder));
    }
}
