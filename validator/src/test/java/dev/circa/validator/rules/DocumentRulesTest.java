package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;

import dev.circa.validator.SchemaCheck;
import dev.circa.validator.Severity;
import org.junit.jupiter.api.Test;

/** Document rules: conformance to the bundled schema (schema module) and unknown properties. */
class DocumentRulesTest {
    @Test
    void schemaMismatch_emptyVariableName_reported() {
        // no specific rule covers an empty name: the schema's minLength does
        circuit(VARS.replace("\"alarm\"", "\"\""), NODES, OUT).schema(SchemaCheck.BUNDLED)
                .expect("/variables/0/name", "SchemaMismatch").check();
    }

    @Test
    void schemaMismatch_sameFindingAsSpecificRule_leftToThatRule() {
        circuit(VARS, NODES.replace("\"sd\": 0.5", "\"sd\": 0"), OUT).schema(SchemaCheck.BUNDLED)
                .expect("/nodes/3/sd", "ParameterOutOfRange").expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void schemaMismatch_conforming_clean() {
        circuit(VARS, NODES, OUT).schema(SchemaCheck.BUNDLED).check();
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
