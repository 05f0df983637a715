package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Reference rules: ids, order, dangling references, weight counts, variables, reachability. */
class ReferenceRulesTest {
    @Test
    void duplicateNodeId_repeatedId_reported() {
        circuit(VARS, NODES.replace("{\"id\": 5,", "{\"id\": 4,").replace("[4, 5]", "[4, 4]"), OUT)
                .expect("/nodes/5/id", "DuplicateNodeId")
                // the second node 4 is unreferenced: the id resolves to the first, which drops nodes 1 and 3
                .expect("/nodes/5", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/1", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/3", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void duplicateNodeId_uniqueIds_clean() {
        ValidationReport r = circuit(VARS, NODES, OUT).check();
        assertTrue(r.valid());
        // the base model is built to have every property (FORMAT.md definitions)
        for (Property p : Property.values()) {
            assertEquals(Verdict.TRUE, r.property(p), p.jsonName());
        }
        assertEquals("[0, 1]", r.variableTree().toString());
    }

    @Test
    void childNotEarlier_forwardReference_reported() {
        String nodes = """
                {"id": 0, "input": "indicator", "var": 0, "value": 0},
                {"id": 1, "input": "indicator", "var": 0, "value": 1},
                {"id": 2, "input": "normal", "var": 1, "mean": 3.1, "sd": 0.2},
                {"id": 3, "input": "normal", "var": 1, "mean": 2.2, "sd": 0.5},
                {"id": 4, "product": [0, 5]},
                {"id": 5, "product": [1, 3]},
                {"id": 6, "sum": [4, 5], "weights": [0.3, 0.7]}""";
        circuit(VARS, nodes, OUT).expect("/nodes/4/product/1", "ChildNotEarlier")
                .expect("/nodes/2", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void childNotEarlier_selfReference_reported() {
        circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 6], \"weights\": [0.3, 0.7]}"), OUT)
                .expect("/nodes/6/sum/1", "ChildNotEarlier").expect("/nodes/5", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/1", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/3", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void childNotEarlier_childrenFirst_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void childMissing_unknownId_reported() {
        circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 99], \"weights\": [0.3, 0.7]}"), OUT)
                .expect("/nodes/6/sum/1", "ChildMissing").expect("/nodes/5", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/1", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/3", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void childMissing_allIdsKnown_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void nodeWithoutChildren_emptyProduct_reported() {
        circuit(VARS, NODES + ",\n{\"id\": 7, \"product\": []}", "{\"name\": \"joint\", \"node\": 6}, {\"name\": \"empty\", \"node\": 7}")
                .expect("/nodes/7/product", "NodeWithoutChildren").check();
    }

    @Test
    void nodeWithoutChildren_everyNodeHasChildren_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void weightCountMismatch_missingWeight_reported() {
        circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 5], \"weights\": [1.0]}"), OUT)
                .expect("/nodes/6/weights", "WeightCountMismatch").check();
    }

    @Test
    void weightCountMismatch_oneWeightPerChild_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void variableIndexOutOfRange_index2Of2_reported() {
        circuit(VARS, NODES.replace("\"normal\", \"var\": 1, \"mean\": 3.1", "\"normal\", \"var\": 2, \"mean\": 3.1"), OUT)
                .expect("/nodes/2/var", "VariableIndexOutOfRange").check();
    }

    @Test
    void variableIndexOutOfRange_indicesInRange_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void familyTypeMismatch_normalOverBinary_reported() {
        ValidationReport r = circuit(VARS, NODES.replace("{\"id\": 1, \"input\": \"indicator\", \"var\": 0, \"value\": 1}",
                        "{\"id\": 1, \"input\": \"normal\", \"var\": 0, \"mean\": 0, \"sd\": 1}"), OUT)
                .expect("/nodes/1/input", "FamilyTypeMismatch")
                .expect("", "RequiredPropertyUnknown").check();
        assertEquals(Verdict.UNKNOWN, r.property(Property.NORMALIZED));
    }

    @Test
    void familyTypeMismatch_familiesMatchTypes_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void inputVariablesRepeated_mvnormalSameVarTwice_reported() {
        String vars = "{\"name\": \"inlet_pressure\", \"type\": \"real\"}, {\"name\": \"outlet_pressure\", \"type\": \"real\"}";
        String nodes = """
                {"id": 0, "input": "mvnormal", "vars": [0, 0], "mean": [3.1, 5.0], "cov": [[0.04, 0.01], [0.01, 0.09]]},
                {"id": 1, "input": "normal", "var": 1, "mean": 5.0, "sd": 0.3},
                {"id": 2, "product": [0, 1]}""";
        circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 2}")
                .expect("/nodes/0/vars", "InputVariablesRepeated")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void inputVariablesRepeated_distinctVars_clean() {
        String vars = "{\"name\": \"inlet_pressure\", \"type\": \"real\"}, {\"name\": \"outlet_pressure\", \"type\": \"real\"}";
        String nodes = """
                {"id": 0, "input": "mvnormal", "vars": [0, 1], "mean": [3.1, 5.0], "cov": [[0.04, 0.01], [0.01, 0.09]]}""";
        circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void outputNodeMissing_unknownNode_reported() {
        circuit(VARS, NODES, "{\"name\": \"joint\", \"node\": 6}, {\"name\": \"other\", \"node\": 42}")
                .expect("/outputs/1", "OutputNodeMissing").check();
    }

    @Test
    void outputNodeMissing_knownNode_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void outputNameDuplicate_sameNameTwice_reported() {
        circuit(VARS, NODES, "{\"name\": \"joint\", \"node\": 6}, {\"name\": \"joint\", \"node\": 6}")
                .expect("/outputs/1", "OutputNameDuplicate").check();
    }

    @Test
    void outputNameDuplicate_uniqueNames_clean() {
        circuit(VARS, NODES, "{\"name\": \"joint\", \"node\": 6}, {\"name\": \"again\", \"node\": 6}").check();
    }

    @Test
    void outputsMissing_noOutputs_reported() {
        circuit(VARS, NODES, "").expect("/outputs", "OutputsMissing").check();
    }

    @Test
    void outputsMissing_oneOutput_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void nodeUnreachable_leftoverInput_warned() {
        circuit(VARS, NODES + ",\n{\"id\": 7, \"input\": \"normal\", \"var\": 1, \"mean\": 0, \"sd\": 1}", OUT)
                .expect("/nodes/7", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void nodeUnreachable_everyNodeUsed_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void outputScopeIncomplete_outputOverOneOfTwo_warned() {
        circuit(VARS, NODES, "{\"name\": \"joint\", \"node\": 6}, {\"name\": \"pressure\", \"node\": 2}")
                .expect("/outputs/1", "OutputScopeIncomplete", Severity.WARNING).check();
    }

    @Test
    void outputScopeIncomplete_fullScope_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void inputVariablesRepeated_mvnormalWithoutVariables_reported() {
        // JSON cannot say this (the reader wants a d x d cov); a document built in code can
        CircuitDocument doc = CircuitDocument.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL)))
                .nodes(List.of(new InputNode(0, null, Family.MVNORMAL, new int[0], new double[0], false)))
                .outputs(List.of(new Output("joint", 0))).build();
        RuleTester.built(doc).expect("/nodes/0/vars", "InputVariablesRepeated")
                .expect("/outputs/0", "OutputScopeIncomplete", Severity.WARNING)
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void variableNameDuplicate_sameNameTwice_reported() {
        circuit(VARS + ", {\"name\": \"alarm\", \"type\": \"binary\"}", NODES, OUT)
                .expect("/variables/2", "VariableNameDuplicate")
                .expect("/outputs/0", "OutputScopeIncomplete", Severity.WARNING).check();
    }

    @Test
    void variableNameDuplicate_uniqueNames_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void variableNameReserved_logDensity_reported() {
        circuit(VARS.replace("\"alarm\"", "\"log_density\""), NODES, OUT)
                .expect("/variables/0/name", "VariableNameReserved").check();
    }

    @Test
    void variableNameReserved_ordinaryNames_clean() {
        circuit(VARS, NODES, OUT).check();
    }
}
