package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import dev.circa.format.io.CircuitReader;
import dev.circa.validator.rules.Rules;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** SARIF output checked against the official OASIS SARIF 2.1.0 schema (draft-04, via networknt). */
class SarifReportTest {
    // source: /work/shared/standards/sarif-schema-2.1.0.json (OASIS), copied to test resources
    private static final Schema SARIF = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_4)
            .getSchema(SchemaLocation.of("classpath:sarif-schema-2.1.0.json"));

    private static List<com.networknt.schema.Error> violations(String sarif) {
        JsonNode tree = JsonMapper.builder().build().readTree(sarif);
        return SARIF.validate(tree);
    }

    @Test
    void sarif_reportsWithDiagnostics_conformToOasisSchema() throws Exception {
        Validator v = new Validator(ValidationOptions.defaults());
        ValidationReport pump = v.validate(Path.of("../fixtures/circuits/pump-station.json"));
        String broken = """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [{"name": "inlet_pressure", "type": "real"}, {"name": "alarm", "type": "binary"}],
                 "nodes": [
                  {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": -1},
                  {"id": 1, "input": "bernoulli", "var": 1, "p": 0.2},
                  {"id": 2, "product": [0, 1, 0]},
                  {"id": 3, "sum": [2, 7], "weights": [0.5, 0.6]}
                 ],
                 "outputs": [{"name": "joint", "node": 3}]}""";
        ValidationReport bad = v.validate(new CircuitReader().readString(broken, "models/broken model.json"));
        ValidationReport noFile = v.validate(new CircuitReader().readString(broken, null));
        String sarif = ReportFormat.SARIF.render(List.of(pump, bad, noFile));
        List<com.networknt.schema.Error> errors = violations(sarif);
        assertTrue(errors.isEmpty(), errors + "\n" + sarif);
        JsonNode log = JsonMapper.builder().build().readTree(sarif);
        JsonNode run = log.get("runs").get(0);
        assertEquals(Rules.all().size(), run.get("tool").get("driver").get("rules").size());
        int diags = pump.diagnostics().size() + bad.diagnostics().size() + noFile.diagnostics().size();
        assertEquals(diags, run.get("results").size());
        assertTrue(sarif.contains("models/broken%20model.json"), sarif);
    }

    @Test
    void sarif_noReports_conformToOasisSchema() {
        List<com.networknt.schema.Error> errors = violations(ReportFormat.SARIF.render(List.of()));
        assertTrue(errors.isEmpty(), errors.toString());
    }
}
