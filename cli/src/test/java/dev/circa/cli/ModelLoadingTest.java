package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.model.Model;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every command that reads a circuit loads it through the model API: a circuit that is not decomposable
 * is refused by each with status 2 and the validator's diagnostic (CLI.md), except inspect, which
 * describes it; sample writes the rows the API draws for the same seed.
 */
class ModelLoadingTest {
    private static final Path NOT_DECOMPOSABLE = Path.of("..", "fixtures", "circuits", "not-decomposable.json");

    @Test
    void everyCircuitReader_notDecomposable_status2WithTheDiagnostic(@TempDir Path dir) throws Exception {
        Path bad = NOT_DECOMPOSABLE;
        Path data = dir.resolve("data.csv");
        Files.writeString(data, "inlet_pressure\n3.0\n");
        Path regions = Path.of("..", "fixtures", "regions", "random-n6-d2-r2-seed7.json");
        String b = bad.toString();
        List<String[]> runs = new ArrayList<>();
        runs.add(new String[] {"eval", b, "--data", data.toString()});
        runs.add(new String[] {"impute", b, "--data", data.toString()});
        runs.add(new String[] {"sample", b, "-n", "3"});
        runs.add(new String[] {"check", b});
        runs.add(new String[] {"compare", b, b});
        runs.add(new String[] {"normalize", b, "-o", dir.resolve("out.json").toString()});
        runs.add(new String[] {"render", b});
        runs.add(new String[] {"convert", b, "--to-params", dir.resolve("p.npz").toString(), "--regions", regions.toString()});
        for (String[] args : runs) {
            Cli.Result r = Cli.run(args);
            Cli.assertUnusable(r, b, "cannot be used: 1 error found by the validator");
            assertTrue(r.err().contains(b + ": [ProductScopesOverlap]"), r::describe);
        }
        assertTrue(Files.notExists(dir.resolve("out.json")) && Files.notExists(dir.resolve("p.npz")));
    }

    @Test
    void inspect_notDecomposable_describedNotRefused() {
        Cli.Result r = Cli.run("inspect", NOT_DECOMPOSABLE.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        assertTrue(r.out().matches("(?s).*\n    decomposable +false\n.*"), r.out());
    }

    @Test
    void sample_sameRowsAsTheModelApi(@TempDir Path dir) throws Exception {
        Path csv = dir.resolve("samples.csv");
        Cli.Result r = Cli.run("sample", Cli.EXAMPLE.toString(), "-n", "5000", "--seed", "9", "-o", csv.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        List<String> lines = Files.readAllLines(csv);
        assertEquals("inlet_pressure,valve", lines.get(0));
        List<Map<String, Object>> api = Model.load(Cli.EXAMPLE).sample(9, 5000);
        for (int i = 0; i < 5000; i++) {
            Map<String, Object> row = api.get(i);
            assertEquals(row.get("inlet_pressure") + "," + row.get("valve"), lines.get(i + 1), "row " + i);
        }
    }
}
