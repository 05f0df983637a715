package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.ReadLimits;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import java.io.ByteArrayInputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.util.Map;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Loading: sources, read limits, the requirement, the one exception and the read hook. */
class ModelLoaderTest {
    /** Two normal components whose weights add to 2: smooth, decomposable, log Z = log 2. */
    private static final String WEIGHTS_ADD_TO_TWO = """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "inlet_pressure", "type": "real"}],
             "nodes": [
               {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
               {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
               {"id": 2, "sum": [0, 1], "weights": [1.5, 0.5]}
             ],
             "outputs": [{"name": "joint", "node": 2}]}
            """;

    @Test
    void load_path_keepsDocumentReportAndCircuit() throws Exception {
        Model m = Model.load(Fixtures.PUMP_STATION);
        assertEquals("pump-station-health", m.document().name());
        assertTrue(m.report().valid());
        assertEquals(7, m.circuit().nodeCount());
        assertEquals(Fixtures.PUMP_STATION.toString(), m.source());
        assertEquals(Requirement.DEFAULT, m.requirement());
        assertEquals(java.util.List.of("joint"), m.outputNames());
        assertEquals(1, m.variableIndex("valve"));
    }

    @Test
    void load_gzipFileAndStream_scoreAsThePlainFile(@TempDir Path dir) throws Exception {
        // source: FORMAT.md, SciPy 1.10
        Path gz = dir.resolve("pump-station.json.gz");
        try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(gz))) {
            out.write(Files.readAllBytes(Fixtures.PUMP_STATION));
        }
        Map<String, Object> row = Map.of("inlet_pressure", 3.0, "valve", "open");
        assertEquals(Fixtures.SCIPY_FULL, Model.load(gz).logDensity(row), 1e-12);
        try (InputStream in = Files.newInputStream(gz)) {
            assertEquals(Fixtures.SCIPY_FULL, Model.loader().load(in, "pump.json.gz").logDensity(row), 1e-12);
        }
        try (InputStream in = Files.newInputStream(Fixtures.PUMP_STATION)) {
            assertEquals(Fixtures.SCIPY_FULL, Model.loader().load(in, "pump.json").logDensity(row), 1e-12);
        }
    }

    @Test
    void load_documentInMemory_proven() throws Exception {
        Model fromFile = Model.load(Fixtures.PUMP_STATION);
        Model fromDoc = Model.loader().load(fromFile.document());
        assertEquals(fromFile.logDensity(Map.of("inlet_pressure", 2.5)), fromDoc.logDensity(Map.of("inlet_pressure", 2.5)));
    }

    @Test
    void load_missingFile_unreadableWithoutReport() {
        ModelException e = assertThrows(ModelException.class, () -> Model.load(Path.of("no-such-model.json")));
        assertTrue(e.unreadable());
        assertNull(e.report());
        assertTrue(e.diagnostics().isEmpty());
        assertTrue(e.getMessage().startsWith("no-such-model.json: no such file"), e.getMessage());
    }

    @Test
    void load_syntaxError_locatedMessage() {
        ModelException e = assertThrows(ModelException.class,
                () -> Fixtures.load(Model.loader(), "{\"format\": \"circa.circuit\",\n  \"version\": 1.0,,}"));
        assertTrue(e.unreadable());
        assertEquals("inline.json", e.file());
        assertEquals(2, e.line());
        assertTrue(e.column() > 0);
    }

    @Test
    void load_overMaxNodes_messageNamesTheLimit() {
        ModelException e = assertThrows(ModelException.class,
                () -> Model.loader().withLimits(ReadLimits.DEFAULT.withMaxNodes(3)).load(Fixtures.PUMP_STATION));
        assertTrue(e.unreadable());
        assertTrue(e.getMessage().contains(ReadLimits.MAX_NODES), e.getMessage());
    }

    @Test
    void load_overMaxBytes_messageNamesTheLimit() {
        ModelException e = assertThrows(ModelException.class,
                () -> Model.loader().withLimits(ReadLimits.DEFAULT.withMaxBytes(100)).load(Fixtures.PUMP_STATION));
        assertTrue(e.getMessage().contains(ReadLimits.MAX_BYTES), e.getMessage());
    }

    @Test
    void load_notDecomposable_oneExceptionWithTheValidatorsDiagnostics() {
        ModelException e = assertThrows(ModelException.class, () -> Model.load(Fixtures.NOT_DECOMPOSABLE));
        assertFalse(e.unreadable());
        assertFalse(e.report().valid());
        assertTrue(e.diagnostics().stream().map(Diagnostic::code).anyMatch("ProductScopesOverlap"::equals),
                e.diagnostics().toString());
        assertTrue(e.getMessage().contains("[ProductScopesOverlap]"), e.getMessage());
    }

    @Test
    void check_notDecomposable_reportWithoutRefusal() throws Exception {
        CheckedCircuit c = Model.loader().check(Fixtures.NOT_DECOMPOSABLE);
        assertFalse(c.fit());
        assertEquals(Fixtures.NOT_DECOMPOSABLE.toString(), c.source());
        assertEquals(3, c.document().nodes().size());
        assertTrue(c.report().diagnostics().stream().map(Diagnostic::code).anyMatch("ProductScopesOverlap"::equals));
        assertTrue(Model.loader().check(Fixtures.PUMP_STATION).fit());
    }

    @Test
    void load_noPropertyRequired_acceptsNotDecomposable() throws Exception {
        Model m = Model.loader().withRequirement(Requirement.parse("")).load(Fixtures.NOT_DECOMPOSABLE);
        assertTrue(m.requirement().properties().isEmpty());
    }

    @Test
    void load_deterministicRequiredOfTheExample_refused() throws Exception {
        ModelException e = assertThrows(ModelException.class, () -> Model.loader()
                .withRequirement(Requirement.also(Property.DETERMINISTIC)).load(Fixtures.PUMP_STATION));
        assertFalse(e.diagnostics().isEmpty());
        assertTrue(e.getMessage().contains("deterministic"), e.getMessage());
    }

    @Test
    void load_deterministicRequiredOfDeterministicCircuit_mpeExact() throws Exception {
        Model m = Fixtures.load(Model.loader().withRequirement(Requirement.also(Property.DETERMINISTIC)),
                Fixtures.DETERMINISTIC);
        assertTrue(m.mpeExact());
    }

    @Test
    void load_weightsAddToTwo_warnsByDefaultRefusedWhenNormalizedRequired() throws Exception {
        // log Z = log(1.5 + 0.5): each input integrates to 1 (common practice)
        Model m = Fixtures.load(Model.loader(), WEIGHTS_ADD_TO_TWO);
        assertFalse(m.normalized());
        assertEquals(Math.log(2), m.logPartition(), 1e-15);
        assertThrows(ModelException.class, () -> Fixtures.load(
                Model.loader().withRequirement(Requirement.also(Property.NORMALIZED)), WEIGHTS_ADD_TO_TWO));
    }

    @Test
    void load_failingEmbeddedCheck_refusedOnlyWhenChecksRequired() throws Exception {
        String json = new String(Files.readAllBytes(Fixtures.PUMP_STATION), StandardCharsets.UTF_8)
                .replace("0.18261296103078395", "0.5");
        Fixtures.load(Model.loader(), json);
        ModelException e = assertThrows(ModelException.class,
                () -> Fixtures.load(Model.loader().withRequirement(Requirement.DEFAULT.withEmbeddedChecks(true)), json));
        assertTrue(e.diagnostics().stream().map(Diagnostic::code).anyMatch("CheckCaseFailed"::equals));
    }

    @Test
    void readHook_seesStoredBytes_digestEqualsMessageDigestOfTheFile(@TempDir Path dir) throws Exception {
        // source: java.security.MessageDigest SHA-256 of the file's bytes, read independently of the loader
        Path gz = dir.resolve("pump-station.json.gz");
        try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(gz))) {
            out.write(Files.readAllBytes(Fixtures.PUMP_STATION));
        }
        for (Path file : new Path[] {Fixtures.PUMP_STATION, gz}) {
            MessageDigest seen = MessageDigest.getInstance("SHA-256");
            Model.loader().withReadHook((stored, source) -> new DigestInputStream(stored, seen)).load(file);
            byte[] expected = MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(file));
            assertArrayEquals(expected, seen.digest(), file.toString());
        }
    }

    @Test
    void readHook_streamClosedAfterFailure() {
        boolean[] closed = {false};
        InputStream in = new ByteArrayInputStream("{\"format\": 1".getBytes(StandardCharsets.UTF_8)) {
            @Override
            public void close() {
                closed[0] = true;
            }
        };
        assertThrows(ModelException.class, () -> Model.loader().load(in, "broken.json"));
        assertTrue(closed[0]);
    }

    @Test
    void requirement_defaultsListedOnce() {
        Requirement r = Requirement.DEFAULT;
        assertEquals(java.util.EnumSet.of(Property.SMOOTH, Property.DECOMPOSABLE), r.properties());
        assertEquals(1e-9, r.tolerance());
        assertEquals(65_536, r.maxEnumeration());
        assertFalse(r.embeddedChecks());
        assertEquals(Requirement.also(Property.DETERMINISTIC), Requirement.parse("smooth, decomposable,deterministic"));
        assertThrows(IllegalArgumentException.class, () -> Requirement.parse("smoth"));
        assertThrows(IllegalArgumentException.class, () -> r.withTolerance(-1));
        assertThrows(IllegalArgumentException.class, () -> r.withMaxEnumeration(0));
    }
}
