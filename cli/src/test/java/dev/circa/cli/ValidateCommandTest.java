package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

class ValidateCommandTest {
    private static final String EXAMPLE = "../fixtures/circuits/pump-station.json";
    /** A product over one variable twice (not decomposable). */
    static final String OVERLAP = """
        {"format": "circa.circuit", "version": "1.0",
         "variables": [{"name": "inlet_pressure", "type": "real"}],
         "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                   {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                   {"id": 2, "product": [0, 1]}],
         "outputs": [{"name": "joint", "node": 2}]}
        """;

    @TempDir
    Path tmp;

    @Test
    void validate_formatExample_status0AndSummary() {
        Cli.Result r = Cli.run("validate", EXAMPLE);
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("smooth true, decomposable true"), r.out());
    }

    @Test
    void validate_binomialTrials1e19_schemaCheckNever_locatedDiagnosticNamingTrials() throws Exception {
        // IEEE 754: 2^53 = 9007199254740992 bounds the integers a double holds exactly; 1e19 is past it.
        Path f = tmp.resolve("trials.json");
        Files.writeString(f, """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "restarts", "type": "count"}],
             "nodes": [{"id": 0, "input": "binomial", "var": 0, "trials": 1e19, "p": 0.5}],
             "outputs": [{"name": "joint", "node": 0}]}
            """);
        for (String check : new String[] {"never", "always"}) {
            Cli.Result r = Cli.run("validate", f.toString(), "--schema-check", check);
            assertEquals(1, r.status(), r::describe);
            Cli.assertNoStackTrace(r);
            assertTrue(r.out().contains("/nodes/0/trials") && r.out().contains("(line 3, column 12)"), r::toString);
        }
        Cli.Result r = Cli.run("validate", f.toString(), "--schema-check", "never");
        assertTrue(r.out().contains("trials of binomial node 0 is 1e19; expected an integer from 0 to 2^53"), r::toString);
    }

    @Test
    void validate_overlappingProduct_status1WithWitnessPointer() throws Exception {
        Path f = tmp.resolve("overlap.json");
        Files.writeString(f, OVERLAP);
        Cli.Result r = Cli.run("validate", f.toString());
        assertEquals(1, r.status(), r.out() + r.err());
        assertTrue(r.out().contains("[ProductScopesOverlap]"), r.out());
        assertTrue(r.out().contains("at /nodes/2 (line 5, column 12)"), r.out());
    }

    @Test
    void validate_severalFilesJson_arrayAndHighestStatus() throws Exception {
        Path bad = tmp.resolve("overlap.json");
        Files.writeString(bad, OVERLAP);
        Cli.Result r = Cli.run("validate", "--format", "json", EXAMPLE, bad.toString());
        assertEquals(1, r.status());
        JsonNode arr = JsonMapper.builder().build().readTree(r.out());
        assertTrue(arr.isArray());
        assertEquals(2, arr.size());
        assertTrue(arr.get(0).get("valid").asBoolean());
        assertFalse(arr.get(1).get("valid").asBoolean());
        assertFalse(arr.get(1).get("properties").get("decomposable").asBoolean());
        assertTrue(arr.get(1).get("logPartition").isNull());
    }

    @Test
    void validate_syntaxError_status2WithLineAndColumn() throws Exception {
        Path f = tmp.resolve("broken.json");
        Files.writeString(f, "{\"format\": \"circa.circuit\",\n \"version\": 1.0.0}");
        Cli.Result r = Cli.run("validate", f.toString(), EXAMPLE);
        assertEquals(2, r.status());
        assertTrue(r.err().contains("broken.json:2:"), r.err());
        assertFalse(r.err().contains("at dev.circa"), "no stack trace: " + r.err());
    }

    @Test
    void validate_requireDeterministic_exampleNotDeterministic_status1() {
        Cli.Result r = Cli.run("validate", "--require", "smooth,decomposable,deterministic", EXAMPLE);
        assertEquals(1, r.status(), r.out());
        assertTrue(r.out().contains("SumNotDeterministic"), r.out());
    }

    @Test
    void validate_ruleOff_unknownCode_status2() {
        Cli.Result r = Cli.run("validate", "--rule", "NoSuchRule:off", EXAMPLE);
        assertEquals(2, r.status());
        assertTrue(r.err().contains("NoSuchRule"), r.err());
    }

    @Test
    void validate_sarif_hasVersionAndRules() throws Exception {
        Path bad = tmp.resolve("overlap.json");
        Files.writeString(bad, OVERLAP);
        Cli.Result r = Cli.run("validate", "--format", "sarif", bad.toString());
        JsonNode sarif = JsonMapper.builder().build().readTree(r.out());
        assertEquals("2.1.0", sarif.get("version").asString());
        assertTrue(sarif.get("runs").get(0).get("results").size() >= 1);
    }

    @Test
    void eval_nonDecomposableCircuit_status2WithDiagnostics() throws Exception {
        Path bad = tmp.resolve("overlap.json");
        Files.writeString(bad, OVERLAP);
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure\n3.0\n");
        Cli.Result r = Cli.run("eval", bad.toString(), "--data", data.toString());
        assertEquals(2, r.status());
        assertTrue(r.err().contains("ProductScopesOverlap"), r.err());
    }

    @Test
    void inspect_formatExample_listsSizesAndTree() {
        Cli.Result r = Cli.run("inspect", EXAMPLE);
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("nodes:     7 (4 inputs, 2 products, 1 sum)"), r.out());
        assertTrue(r.out().contains("variable tree: [0, 1]"), r.out());
    }
}
