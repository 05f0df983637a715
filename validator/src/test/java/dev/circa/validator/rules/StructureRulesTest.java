package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.RuleSetting;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Structural properties: smoothness, decomposability, determinism, structured decomposability. */
class StructureRulesTest {
    private static final String AB = """
            {"name": "alarm", "type": "binary"}, {"name": "pump_on", "type": "binary"}""";
    /** {@link #AB} and two more binary variables, for the structured-decomposability cases. */
    private static final String FOUR_VARS = AB
            + ", {\"name\": \"valve_open\", \"type\": \"binary\"}, {\"name\": \"drain_open\", \"type\": \"binary\"}";
    /** Over {@link #FOUR_VARS}: indicators of variable 0, a bernoulli of each other variable, two products over 0 and 1. */
    private static final String FOUR_VAR_LEAVES = """
            {"id": 0, "input": "indicator", "var": 0, "value": 0},
            {"id": 1, "input": "indicator", "var": 0, "value": 1},
            {"id": 2, "input": "bernoulli", "var": 1, "p": 0.5},
            {"id": 3, "input": "bernoulli", "var": 2, "p": 0.5},
            {"id": 4, "input": "bernoulli", "var": 3, "p": 0.5},
            {"id": 5, "product": [0, 2]},
            {"id": 6, "product": [1, 2]},
            """;
    /** Inputs 0..3: alarm=0, alarm=1, pump_on=0, pump_on=1; 4..7 the four products; 8 = equal, 9 = different. */
    private static final String XOR = """
            {"id": 0, "input": "indicator", "var": 0, "value": 0},
            {"id": 1, "input": "indicator", "var": 0, "value": 1},
            {"id": 2, "input": "indicator", "var": 1, "value": 0},
            {"id": 3, "input": "indicator", "var": 1, "value": 1},
            {"id": 4, "product": [0, 2]},
            {"id": 5, "product": [1, 3]},
            {"id": 6, "product": [0, 3]},
            {"id": 7, "product": [1, 2]},
            {"id": 8, "sum": [4, 5], "weights": [0.5, 0.5]},
            {"id": 9, "sum": [6, 7], "weights": [0.5, 0.5]},""";

    @Test
    void sumScopesDiffer_childMissingVariable_reported() {
        ValidationReport r = circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 1], \"weights\": [0.3, 0.7]}"), OUT)
                .expect("/nodes/6", "SumScopesDiffer").expect("", "RequiredPropertyUnknown")
                .expect("/nodes/5", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/3", "NodeUnreachable", Severity.WARNING).check();
        assertEquals(Verdict.FALSE, r.property(Property.SMOOTH));
        assertTrue(message(r, "SumScopesDiffer").contains("inlet_pressure"), message(r, "SumScopesDiffer"));
        assertNull(r.logPartition());
    }

    @Test
    void sumScopesDiffer_notRequired_info() {
        circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 1], \"weights\": [0.3, 0.7]}"), OUT)
                .options(ValidationOptions.defaults().withRequire("decomposable"))
                .expect("/nodes/6", "SumScopesDiffer", Severity.INFO)
                .expect("/nodes/5", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/3", "NodeUnreachable", Severity.WARNING).check();
    }

    @Test
    void sumScopesDiffer_sameScopes_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void productScopesOverlap_twoInputsOnOneVariable_reported() {
        ValidationReport r = circuit(VARS, NODES.replace("\"product\": [1, 3]", "\"product\": [1, 3, 2]"), OUT)
                .expect("/nodes/5", "ProductScopesOverlap").expect("/nodes/5", "ProductNotStructured", Severity.INFO)
                .expect("", "RequiredPropertyUnknown").check();
        assertEquals(Verdict.FALSE, r.property(Property.DECOMPOSABLE));
        assertTrue(message(r, "ProductScopesOverlap").contains("inlet_pressure"));
    }

    @Test
    void productScopesOverlap_disjointChildren_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void sumNotDeterministic_gaussianMixtureRequired_reported() {
        String nodes = """
                {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                {"id": 2, "sum": [0, 1], "weights": [0.85, 0.15]}""";
        ValidationReport r = circuit("{\"name\": \"inlet_pressure\", \"type\": \"real\"}", nodes, "{\"name\": \"joint\", \"node\": 2}")
                .options(ValidationOptions.defaults().withRequire("deterministic"))
                .expect("/nodes/2", "SumNotDeterministic").check();
        assertEquals(Verdict.FALSE, r.property(Property.DETERMINISTIC));
        assertTrue(message(r, "SumNotDeterministic").contains("inlet_pressure="), message(r, "SumNotDeterministic"));
    }

    @Test
    void sumNotDeterministic_zeroWeightChildrenLeftOut_clean() {
        // FORMAT.md: at most one positive child at every assignment; a child of weight 0 is never positive
        ValidationReport r = pressureSum("[0.0, 1.0, 0.0]").check();
        assertEquals(Verdict.TRUE, r.property(Property.DETERMINISTIC));
    }

    @Test
    void sumNotDeterministic_zeroWeightBetweenOverlappingChildren_reported() {
        // the middle child of weight 0 is left out; the first and the last overlap on the whole line
        ValidationReport r = pressureSum("[0.5, 0.0, 0.5]").expect("/nodes/3", "SumNotDeterministic").check();
        assertEquals(Verdict.FALSE, r.property(Property.DETERMINISTIC));
        assertTrue(message(r, "SumNotDeterministic").contains("children 0 and 2"), message(r, "SumNotDeterministic"));
    }

    @Test
    void sumNotDeterministic_manyRequired_hundredKeptRestCounted() throws Exception {
        // 150 sums over the same two overlapping inputs and one sum over them all: 151 findings, errors as required
        StringBuilder nodes = new StringBuilder("""
                {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5}""");
        StringBuilder top = new StringBuilder();
        StringBuilder weights = new StringBuilder();
        for (int k = 2; k < 152; k++) {
            nodes.append(",\n{\"id\": ").append(k).append(", \"sum\": [0, 1], \"weights\": [0.5, 0.5]}");
            top.append(k == 2 ? "" : ", ").append(k);
            weights.append(k == 2 ? "" : ", ").append(1.0 / 150);
        }
        nodes.append(",\n{\"id\": 152, \"sum\": [").append(top).append("], \"weights\": [").append(weights).append("]}");
        String json = "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [{\"name\": \"inlet_pressure\", "
                + "\"type\": \"real\"}], \"nodes\": [" + nodes + "], \"outputs\": [{\"name\": \"joint\", \"node\": 152}]}";
        CircuitDocument doc = new CircuitReader().readString(json, "many.json");
        for (String setting : new String[] {null, "warn", "off"}) {
            ValidationOptions o = ValidationOptions.defaults().withRequire("deterministic");
            if (setting != null) {
                o = o.withRule("SumNotDeterministic", RuleSetting.valueOf(setting.toUpperCase(java.util.Locale.ROOT)));
            }
            List<Diagnostic> det = new Validator(o).validate(doc).diagnostics().stream()
                    .filter(d -> d.code().equals("SumNotDeterministic")).toList();
            if ("off".equals(setting)) {
                assertEquals(0, det.size());
                continue;
            }
            // RuleContext.MAX_PER_RULE kept, then one line counting the rest (CLI.md)
            Severity sev = setting == null ? Severity.ERROR : Severity.WARNING;
            assertEquals(101, det.size());
            assertEquals("51 more diagnostics of this rule not shown (151 in all)", det.get(100).message());
            assertEquals(sev, det.get(100).severity());
            assertEquals("/nodes/2", det.get(0).pointer());
            assertEquals("/nodes/101", det.get(99).pointer());
        }
    }

    /** Three normal inputs of one real variable under sum 3 with {@code weights}; determinism required. */
    private static RuleTester pressureSum(String weights) {
        String nodes = """
                {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                {"id": 2, "input": "normal", "var": 0, "mean": 1.4, "sd": 0.3},
                {"id": 3, "sum": [0, 1, 2], "weights": %s}""".formatted(weights);
        return circuit("{\"name\": \"inlet_pressure\", \"type\": \"real\"}", nodes, "{\"name\": \"joint\", \"node\": 3}")
                .options(ValidationOptions.defaults().withRequire("deterministic"));
    }

    @Test
    void sumNotDeterministic_enumerationFindsOverlap_infoWithWitness() {
        // child 8 (alarm == pump_on) and child 11 (alarm = 0, pump_on free) are both positive at alarm=0, pump_on=0
        String nodes = XOR + """

                {"id": 10, "input": "bernoulli", "var": 1, "p": 0.5},
                {"id": 11, "product": [0, 10]},
                {"id": 12, "sum": [8, 11], "weights": [0.5, 0.5]}""";
        ValidationReport r = circuit(AB, nodes, "{\"name\": \"joint\", \"node\": 12}")
                .expect("/nodes/12", "SumNotDeterministic", Severity.INFO)
                .expect("/nodes/9", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/6", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/7", "NodeUnreachable", Severity.WARNING).check();
        assertTrue(message(r, "SumNotDeterministic").contains("{alarm=0, pump_on=0}"), message(r, "SumNotDeterministic"));
    }

    @Test
    void sumNotDeterministic_enumerationProvesDisjoint_clean() {
        // equal and different states of two binary variables: no single variable separates them
        ValidationReport r = circuit(AB, XOR + "\n{\"id\": 10, \"sum\": [8, 9], \"weights\": [0.5, 0.5]}",
                "{\"name\": \"joint\", \"node\": 10}").check();
        assertEquals(Verdict.TRUE, r.property(Property.DETERMINISTIC));
        assertTrue(r.exactQueries().mpe());
    }

    @Test
    void sumNotDeterministic_indicatorSeparated_clean() {
        circuit(VARS, NODES, OUT).options(ValidationOptions.defaults().withRequire("deterministic")).check();
    }

    @Test
    void productNotStructured_crossingScopes_info() {
        String vars = AB + ", {\"name\": \"valve_open\", \"type\": \"binary\"}";
        String nodes = """
                {"id": 0, "input": "bernoulli", "var": 0, "p": 0.5},
                {"id": 1, "input": "bernoulli", "var": 1, "p": 0.5},
                {"id": 2, "input": "bernoulli", "var": 2, "p": 0.5},
                {"id": 3, "product": [0, 1]},
                {"id": 4, "product": [1, 2]},
                {"id": 5, "product": [3, 2]},
                {"id": 6, "product": [0, 4]},
                {"id": 7, "sum": [5, 6], "weights": [0.5, 0.5]}""";
        ValidationReport r = circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 7}")
                .expect("/nodes/4", "ProductNotStructured", Severity.INFO)
                .expect("/nodes/7", "SumNotDeterministic", Severity.INFO).check();
        assertEquals(Verdict.FALSE, r.property(Property.STRUCTURED_DECOMPOSABLE));
        assertNull(r.variableTree());
    }

    @Test
    void productNotStructured_splitCutsChild_reported() {
        // product 5 keeps {0, 1} together; product 6 splits {0, 1, 2} as {0, 2} (an mvnormal) + {1}
        String vars = "{\"name\": \"inlet_pressure\", \"type\": \"real\"}, {\"name\": \"outlet_pressure\", \"type\": \"real\"}, "
                + "{\"name\": \"motor_current\", \"type\": \"real\"}";
        String nodes = """
                {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                {"id": 1, "input": "normal", "var": 1, "mean": 5.0, "sd": 0.3},
                {"id": 2, "input": "normal", "var": 2, "mean": 12.0, "sd": 1.0},
                {"id": 3, "input": "mvnormal", "vars": [0, 2], "mean": [3.0, 11.0], "cov": [[0.04, 0.01], [0.01, 0.5]]},
                {"id": 4, "product": [0, 1]},
                {"id": 5, "product": [4, 2]},
                {"id": 6, "product": [3, 1]},
                {"id": 7, "sum": [5, 6], "weights": [0.5, 0.5]}""";
        circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 7}")
                .options(ValidationOptions.defaults().withRequire("smooth,decomposable,normalized,structured-decomposable"))
                .expect("/nodes/6", "ProductNotStructured")
                .expect("/nodes/7", "SumNotDeterministic", Severity.INFO).check();
    }

    @Test
    void productNotStructured_ternaryProductsOneTree_clean() {
        // products of arity 3 and 2 over the tree [[0, 1], 2, 3]
        String vars = FOUR_VARS;
        String nodes = FOUR_VAR_LEAVES + """
                {"id": 7, "sum": [5, 6], "weights": [0.5, 0.5]},
                {"id": 8, "product": [7, 3, 4]},
                {"id": 9, "product": [5, 3, 4]},
                {"id": 10, "product": [6, 3, 4]},
                {"id": 11, "product": [1, 2, 3, 4]},
                {"id": 12, "sum": [8, 9], "weights": [0.5, 0.5]}""";
        ValidationReport r = circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 12}")
                .expect("/nodes/10", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/11", "NodeUnreachable", Severity.WARNING)
                .expect("/nodes/12", "SumNotDeterministic", Severity.INFO)
                .expect("/nodes/11", "ProductNotStructured", Severity.INFO).check();
        assertEquals(Verdict.FALSE, r.property(Property.STRUCTURED_DECOMPOSABLE));
    }

    @Test
    void productNotStructured_oneTree_clean() {
        String vars = FOUR_VARS;
        String nodes = FOUR_VAR_LEAVES + """
                {"id": 7, "product": [5, 3, 4]},
                {"id": 8, "product": [6, 4, 3]},
                {"id": 9, "sum": [7, 8], "weights": [0.5, 0.5]}""";
        ValidationReport r = circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 9}").check();
        assertEquals(Verdict.TRUE, r.property(Property.STRUCTURED_DECOMPOSABLE));
        assertEquals("[[0, 1], 2, 3]", r.variableTree().toString());
    }

    private static String message(ValidationReport r, String code) {
        return r.diagnostics().stream().filter(d -> d.code().equals(code)).findFirst().orElseThrow().message();
    }
}
