package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CompareCommandTest {
    /** FORMAT.md's example circuit with other ids, another node order and children swapped. */
    static final String REORDERED = """
        {"format": "circa.circuit", "version": "1.0",
         "variables": [{"name": "inlet_pressure", "type": "real", "unit": "bar"},
                       {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]}],
         "nodes": [{"id": 10, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                   {"id": 11, "input": "categorical", "var": 1, "probs": [0.6, 0.3, 0.1]},
                   {"id": 12, "product": [11, 10]},
                   {"id": 13, "input": "categorical", "var": 1, "probs": [0.05, 0.15, 0.80]},
                   {"id": 14, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                   {"id": 15, "product": [14, 13]},
                   {"id": 16, "sum": [12, 15], "weights": [0.15, 0.85]}],
         "outputs": [{"name": "joint", "node": 16}]}
        """;

    @TempDir
    Path dir;

    @Test
    void compare_reorderedExample_saysStructurallyIdenticalStatus0() throws Exception {
        // common practice: node order, ids and child order do not change a circuit's function
        Path b = dir.resolve("reordered.json");
        Files.writeString(b, REORDERED);
        Cli.Result r = Cli.run("compare", CheckCommandTest.EXAMPLE.toString(), b.toString(), "--samples", "300", "--seed", "4");
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        assertTrue(r.out().startsWith("the circuits are structurally identical (up to node order)\nAGREE: 1200 points, 0 disagreeing"),
                r::toString);
    }

    @Test
    void compare_changedWeight_status1WithLargestDisagreements() throws Exception {
        Path b = dir.resolve("changed.json");
        Files.writeString(b, REORDERED.replace("[0.15, 0.85]", "[0.16, 0.84]"));
        Cli.Result r = Cli.run("compare", CheckCommandTest.EXAMPLE.toString(), b.toString());
        assertEquals(ExitStatus.FAILED, r.status(), r::toString);
        assertFalse(r.out().contains("structurally identical"), r::toString);
        assertTrue(r.out().contains("DISAGREE: 4000 points"), r::toString);
        assertTrue(r.out().contains("largest disagreements:\n  DIFF output joint, point "), r::toString);
        Cli.Result json = Cli.run("compare", CheckCommandTest.EXAMPLE.toString(), b.toString(), "--format", "json", "--atol", "0.1");
        assertEquals(ExitStatus.OK, json.status(), json::toString);
        assertTrue(json.out().startsWith("{\"structurallyIdentical\": false, \"passed\": true, \"points\": 4000"), json::toString);
    }

    @Test
    void compare_otherVariables_status2WithClearMessage() throws Exception {
        Path b = dir.resolve("renamed.json");
        Files.writeString(b, REORDERED.replace("\"inlet_pressure\"", "\"outlet_pressure\""));
        Cli.Result r = Cli.run("compare", CheckCommandTest.EXAMPLE.toString(), b.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.err().contains("variable \"inlet_pressure\" of the first circuit is not a variable of the second"), r::toString);
    }
}
