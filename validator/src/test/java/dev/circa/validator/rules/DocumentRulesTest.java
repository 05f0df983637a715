package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;

import dev.circa.validator.SchemaFinding;
import dev.circa.validator.Severity;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;

/** Document rules: schema conformance and unknown properties. */
class DocumentRulesTest {
    /** A stand-in for the bundled schema that only knows "sd must be > 0" (FORMAT.md's input table). */
    private static List<SchemaFinding> sdPositive(JsonNode doc) {
        List<SchemaFinding> out = new ArrayList<>();
        JsonNode nodes = doc.get("nodes");
        for (int i = 0; i < nodes.size(); i++) {
            JsonNode sd = nodes.get(i).get("sd");
            if (sd != null && !(sd.asDouble() > 0)) {
                out.add(new SchemaFinding("/nodes/" + i + "/sd", "exclusiveMinimum", "must be greater than 0"));
            }
        }
        return out;
    }

    @Test
    void schemaMismatch_violation_reportedAtNodeLine() {
        circuit(VARS, NODES.replace("\"sd\": 0.5", "\"sd\": 0"), OUT).schema(DocumentRulesTest::sdPositive)
                .expect("/nodes/3/sd", "SchemaMismatch").expect("/nodes/3/sd", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void schemaMismatch_conforming_clean() {
        circuit(VARS, NODES, OUT).schema(DocumentRulesTest::sdPositive).check();
    }

    @Test
    void unknownProperty_extraNodeMember_reported() {
        circuit(VARS, NODES.replace("{\"id\": 2,", "{\"id\": 2, \"colour\": \"red\","), OUT)
                .expect("/nodes/2/colour", "UnknownProperty").check();
    }

    @Test
    void unknownProperty_newerMinorVersion_warned() {
        String doc = "{\"format\": \"circa.circuit\", \"version\": \"1.7\", \"variables\": [" + VARS + "], \"nodes\": ["
                + NODES + "], \"outputs\": [" + OUT + "], \"colour\": \"red\"}";
        RuleTester.document(doc).expect("/colour", "UnknownProperty", Severity.WARNING).check();
    }

    @Test
    void unknownProperty_underExtensions_clean() {
        String doc = "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [" + VARS + "], \"nodes\": ["
                + NODES + "], \"outputs\": [" + OUT + "], \"extensions\": {\"colour\": \"red\"}}";
        RuleTester.document(doc).check();
    }
}
