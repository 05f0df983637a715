package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** Machine-readable validation reports keep an entry for every file given, unreadable ones included. */
class ValidateUnreadableFilesTest {
    // source: /work/shared/standards/sarif-schema-2.1.0.json (OASIS SARIF 2.1.0), the copy the validator's tests keep
    private static final Schema SARIF = sarifSchema();
    /** A syntax error on line 3: a comma where an array element is expected. */
    private static final String BROKEN = "{\"format\": \"circa.circuit\",\n \"version\": \"1.0\",\n \"variables\": [,]}\n";

    @TempDir
    Path tmp;

    private static Schema sarifSchema() {
        try {
            return SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_4).getSchema(
                    Files.readString(Path.of("..", "validator", "src", "test", "resources", "sarif-schema-2.1.0.json")));
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void json_missingAndBrokenFiles_oneEntryPerFileInOrder_status2EntriesLocated() throws Exception {
        Path broken = tmp.resolve("broken.json");
        Files.writeString(broken, BROKEN);
        Path missing = tmp.resolve("missing.json");
        Cli.Result r = Cli.run("validate", "--format", "json", Cli.EXAMPLE.toString(), missing.toString(), broken.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        JsonNode arr = JsonMapper.builder().build().readTree(r.out());
        assertEquals(3, arr.size(), r::toString);
        assertTrue(arr.get(0).get("valid").asBoolean());
        assertFalse(arr.get(0).has("status"));
        JsonNode gone = arr.get(1);
        assertEquals(missing.toString(), gone.get("file").asString());
        assertFalse(gone.get("valid").asBoolean());
        assertEquals(2, gone.get("status").asInt());
        assertTrue(gone.get("error").get("message").asString().startsWith(missing + ": "), gone::toString);
        assertTrue(gone.get("error").get("line").isNull());
        JsonNode bad = arr.get(2);
        assertEquals(2, bad.get("status").asInt());
        assertEquals(3, bad.get("error").get("line").asInt(), bad::toString);
        assertTrue(bad.get("error").get("column").asInt() > 0, bad::toString);
        assertTrue(bad.get("error").get("message").asString().startsWith(broken + ":3:"), bad::toString);
        assertFalse(bad.get("error").get("problem").asString().isBlank());
        assertEquals(2, r.messages(), "each unreadable file still gets its message on standard error: " + r.err());
    }

    @Test
    void json_oneUnreadableFile_loneStatus2Object() throws Exception {
        Cli.Result r = Cli.run("validate", "--format", "json", tmp.resolve("missing.json").toString());
        assertEquals(ExitStatus.UNUSABLE, r.status());
        JsonNode o = JsonMapper.builder().build().readTree(r.out());
        assertTrue(o.isObject(), r::toString);
        assertEquals(2, o.get("status").asInt());
    }

    @Test
    void sarif_brokenFile_invocationNotSuccessfulWithLocatedNotification_conformsToOasisSchema() throws Exception {
        Path broken = tmp.resolve("bad.json");
        Files.writeString(broken, BROKEN);
        Cli.Result r = Cli.run("validate", "--format", "sarif", broken.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        JsonNode log = JsonMapper.builder().build().readTree(r.out());
        List<com.networknt.schema.Error> errors = SARIF.validate(log);
        assertTrue(errors.isEmpty(), errors + "\n" + r.out());
        JsonNode invocation = log.get("runs").get(0).get("invocations").get(0);
        assertFalse(invocation.get("executionSuccessful").asBoolean(), r::toString);
        assertEquals(2, invocation.get("exitCode").asInt());
        JsonNode note = invocation.get("toolExecutionNotifications").get(0);
        assertEquals("error", note.get("level").asString());
        assertTrue(note.get("message").get("text").asString().startsWith(broken + ":3:"), note::toString);
        JsonNode phys = note.get("locations").get(0).get("physicalLocation");
        assertTrue(phys.get("artifactLocation").get("uri").asString().endsWith("bad.json"), note::toString);
        assertEquals(3, phys.get("region").get("startLine").asInt());
        assertTrue(phys.get("region").get("startColumn").asInt() > 0);
        assertEquals(0, log.get("runs").get(0).get("results").size());
        // the schema is live: an invocation without executionSuccessful (required by SARIF 2.1.0) is refused
        ((tools.jackson.databind.node.ObjectNode) invocation).remove("executionSuccessful");
        assertFalse(SARIF.validate(log).isEmpty());
    }

    @Test
    void sarif_validAndMissingFiles_bothListed_conformsToOasisSchema() throws Exception {
        Path missing = tmp.resolve("missing.json");
        Cli.Result r = Cli.run("validate", "--format", "sarif", Cli.EXAMPLE.toString(), missing.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status());
        JsonNode log = JsonMapper.builder().build().readTree(r.out());
        assertTrue(SARIF.validate(log).isEmpty(), r::toString);
        JsonNode run = log.get("runs").get(0);
        assertEquals(2, run.get("artifacts").size());
        assertEquals(1, run.get("invocations").get(0).get("toolExecutionNotifications").size());
        assertFalse(run.get("invocations").get(0).get("executionSuccessful").asBoolean());
    }
}
