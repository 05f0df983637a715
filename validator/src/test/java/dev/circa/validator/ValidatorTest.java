package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.CircuitReader;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The validator end to end: the example circuit, options, report formats and exit status. */
class ValidatorTest {
    private static final Path PUMP = Path.of("../fixtures/circuits/pump-station.json");
    private static final String OVERLAP = """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "inlet_pressure", "type": "real"}],
             "nodes": [
              {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
              {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
              {"id": 9, "product": [0, 1]}
             ],
             "outputs": [{"name": "joint", "node": 9}]}""";

    @Test
    void validate_pumpStation_validAndNormalized() throws Exception {
        ValidationReport r = new Validator(ValidationOptions.defaults()).validate(PUMP);
        assertTrue(r.valid());
        assertEquals(0, r.exitStatus());
        // FORMAT.md example: weights 0.85 + 0.15 and normalised inputs, so log Z = 0 (common practice)
        assertEquals(0.0, r.logPartition().get("joint"), 1e-12);
        assertEquals(new CircuitStats(2, 7, 6, 2), r.stats());
        assertEquals(Verdict.FALSE, r.property(Property.DETERMINISTIC));
        assertEquals("[0, 1]", r.variableTree().toString());
        assertTrue(r.exactQueries().marginal());
        assertFalse(r.exactQueries().mpe());
    }

    @Test
    void json_oneAndSeveralFiles_objectThenArrayWithCliFields() throws Exception {
        Validator v = new Validator(ValidationOptions.defaults());
        ValidationReport pump = v.validate(PUMP);
        ValidationReport bad = v.validate(new CircuitReader().readString(OVERLAP, "model.json"));
        JsonMapper m = JsonMapper.builder().build();
        JsonNode one = m.readTree(ReportFormat.JSON.render(List.of(bad)));
        assertTrue(one.isObject());
        List<String> keys = List.of("file", "valid", "properties", "logPartition", "variableTree", "exactQueries",
                "stats", "diagnostics");
        assertEquals(keys, List.copyOf(one.propertyNames()));
        assertFalse(one.get("valid").asBoolean());
        assertEquals(false, one.get("properties").get("decomposable").asBoolean());
        assertEquals("unknown", one.get("properties").get("normalized").asString());
        assertTrue(one.get("logPartition").isNull());
        JsonNode d = one.get("diagnostics").get(0);
        assertEquals(List.of("code", "severity", "message", "pointer", "node", "line", "column"), List.copyOf(d.propertyNames()));
        assertEquals("ProductScopesOverlap", d.get("code").asString());
        assertEquals("/nodes/2", d.get("pointer").asString());
        assertEquals(9, d.get("node").asInt());
        assertEquals(6, d.get("line").asInt());
        JsonNode two = m.readTree(ReportFormat.JSON.render(List.of(pump, bad)));
        assertTrue(two.isArray());
        assertEquals(2, two.size());
        assertEquals(1, ValidationReport.exitStatus(List.of(pump, bad)));
    }

    @Test
    void text_invalidModel_linePerDiagnosticThenSummary() throws Exception {
        ValidationReport bad = new Validator(ValidationOptions.defaults()).validate(new CircuitReader().readString(OVERLAP, "model.json"));
        String text = ReportFormat.TEXT.render(List.of(bad));
        assertTrue(text.contains("[ProductScopesOverlap] product 9 is not decomposable: variable inlet_pressure is in the "
                + "scopes of both child 0 and child 1; expected the children of a product to have disjoint scopes at /nodes/2 "
                + "(line 6, column 3)"), text);
        assertTrue(text.contains("properties: smooth true, decomposable false"), text);
        assertTrue(text.contains("exact queries: density yes, marginal no"), text);
    }

    @Test
    void ruleSetting_offAndWarn_changeSeverity() throws Exception {
        ValidationOptions o = ValidationOptions.defaults().withRule("ProductScopesOverlap:warn")
                .withRule("RequiredPropertyUnknown:off");
        ValidationReport r = new Validator(o).validate(new CircuitReader().readString(OVERLAP, "model.json"));
        assertTrue(r.valid(), r.diagnostics().toString());
        assertEquals(2, r.diagnostics().size());
        assertEquals(Severity.WARNING, r.diagnostics().get(0).severity());
        assertEquals("ProductNotStructured", r.diagnostics().get(1).code());
    }

    @Test
    void options_badValues_rejectedWithOptionName() {
        ValidationOptions o = ValidationOptions.defaults();
        assertTrue(assertThrows(IllegalArgumentException.class, () -> o.withRule("NoSuchRule:off")).getMessage().contains("--rule"));
        assertThrows(IllegalArgumentException.class, () -> o.withRule("ProductScopesOverlap:loud"));
        assertThrows(IllegalArgumentException.class, () -> o.withRequire("smooth,tidy"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> o.withTolerance(-1)).getMessage().contains("--tolerance"));
        assertEquals(3, o.require().size());
        assertEquals(1e-9, o.tolerance());
        assertEquals(65_536, o.maxEnumeration());
        assertTrue(o.withRequire("").require().isEmpty());
    }

    @Test
    void diagnostic_unknownLocation_renderedAsSuch() {
        Diagnostic d = new Diagnostic("OutputsMissing", Severity.ERROR, "the circuit has no outputs", "/outputs", null, 0, 0);
        assertEquals("[OutputsMissing] the circuit has no outputs at /outputs (line and column unknown)", d.render());
        assertNull(d.node());
    }
}
