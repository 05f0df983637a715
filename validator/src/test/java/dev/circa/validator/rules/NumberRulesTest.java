package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/** Normalisation, log-partition, required properties and embedded checks. */
class NumberRulesTest {
    @Test
    void weightsNotNormalized_sumOf1point1_error() {
        ValidationReport r = circuit(VARS, NODES.replace("[0.3, 0.7]", "[0.3, 0.8]"), OUT)
                .expect("/nodes/6/weights", "WeightsNotNormalized").expect("/outputs/0", "OutputNotNormalized").check();
        // log Z = log(0.3 + 0.8): every input integrates to 1 (FORMAT.md semantics)
        assertEquals(Math.log(1.1), r.logPartition().get("joint"), 1e-15);
        assertEquals(Verdict.FALSE, r.property(Property.NORMALIZED));
    }

    @Test
    void weightsNotNormalized_compensatedByParent_warned() {
        // inner sum 7 has weights adding to 2 and its parent 8 a weight of 0.5: Z = 0.5 * 2 = 1
        String nodes = """
                {"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                {"id": 7, "sum": [0, 1], "weights": [1.0, 1.0]},
                {"id": 8, "sum": [7], "weights": [0.5]}""";
        ValidationReport r = circuit("{\"name\": \"inlet_pressure\", \"type\": \"real\"}", nodes, "{\"name\": \"joint\", \"node\": 8}")
                .expect("/nodes/2/weights", "WeightsNotNormalized", Severity.WARNING)
                .expect("/nodes/3/weights", "WeightsNotNormalized", Severity.WARNING)
                .expect("/nodes/2", "SumNotDeterministic", Severity.INFO).check();
        assertEquals(Verdict.TRUE, r.property(Property.NORMALIZED));
    }

    @Test
    void weightsNotNormalized_logWeightsOfOneHalf_clean() {
        double l = Math.log(0.5);
        circuit(VARS, Models.withTop("{\"id\": 6, \"sum\": [4, 5], \"logWeights\": [" + l + ", " + l + "]}"), OUT).check();
    }

    @Test
    void outputNotNormalized_notRequired_info() {
        circuit(VARS, NODES.replace("[0.3, 0.7]", "[0.3, 0.8]"), OUT)
                .options(ValidationOptions.defaults().withRequire("smooth,decomposable"))
                .expect("/nodes/6/weights", "WeightsNotNormalized").expect("/outputs/0", "OutputNotNormalized", Severity.INFO)
                .check();
    }

    @Test
    void outputNotNormalized_logZZero_clean() {
        ValidationReport r = circuit(VARS, NODES, OUT).check();
        assertEquals(0.0, r.logPartition().get("joint"), 1e-15);
    }

    @Test
    void requiredPropertyUnknown_determinismOverRealsUndecided_reported() {
        // two checkerboards of uniforms: disjoint, but no single variable separates them and reals cannot be enumerated
        String vars = "{\"name\": \"inlet_pressure\", \"type\": \"real\"}, {\"name\": \"outlet_pressure\", \"type\": \"real\"}";
        String nodes = """
                {"id": 0, "input": "uniform", "var": 0, "low": 0, "high": 1},
                {"id": 1, "input": "uniform", "var": 0, "low": 2, "high": 3},
                {"id": 2, "input": "uniform", "var": 1, "low": 0, "high": 1},
                {"id": 3, "input": "uniform", "var": 1, "low": 2, "high": 3},
                {"id": 4, "product": [0, 2]},
                {"id": 5, "product": [1, 3]},
                {"id": 6, "product": [0, 3]},
                {"id": 7, "product": [1, 2]},
                {"id": 8, "sum": [4, 5], "weights": [0.5, 0.5]},
                {"id": 9, "sum": [6, 7], "weights": [0.5, 0.5]},
                {"id": 10, "sum": [8, 9], "weights": [0.5, 0.5]}""";
        ValidationReport r = circuit(vars, nodes, "{\"name\": \"joint\", \"node\": 10}")
                .options(ValidationOptions.defaults().withRequire("deterministic"))
                .expect("", "RequiredPropertyUnknown").check();
        assertEquals(Verdict.UNKNOWN, r.property(Property.DETERMINISTIC));
    }

    @Test
    void requiredPropertyUnknown_everyRequiredDecided_clean() {
        circuit(VARS, NODES, OUT).options(ValidationOptions.defaults()
                .withRequire("smooth,decomposable,deterministic,structured-decomposable,normalized")).check();
    }

    @Test
    void checkCaseInvalid_unknownStateLabel_reported() {
        String doc = """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [%s],
                 "nodes": [%s],
                 "outputs": [%s],
                 "checks": {"cases": [{"values": {"alarm": "maybe"}, "logDensity": 0.0}]}}""".formatted(VARS, NODES, OUT);
        RuleTester.document(doc).expect("/checks/cases/0", "CheckCaseInvalid").check();
    }

    @Test
    void checkCaseInvalid_unknownOutput_reported() {
        String doc = """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [%s],
                 "nodes": [%s],
                 "outputs": [%s],
                 "checks": {"cases": [{"output": "other", "values": {}, "logDensity": 0.0}]}}""".formatted(VARS, NODES, OUT);
        RuleTester.document(doc).expect("/checks/cases/0", "CheckCaseInvalid").check();
    }

    @Test
    void checkCaseInvalid_validCase_clean() {
        String doc = """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [%s],
                 "nodes": [%s],
                 "outputs": [%s],
                 "checks": {"cases": [{"output": "joint", "values": {"alarm": 1}, "logDensity": %s}]}}"""
                .formatted(VARS, NODES, OUT, Math.log(0.7));
        RuleTester.document(doc).check();
    }

    private static String pump(String density) throws Exception {
        String text = Files.readString(Path.of("../fixtures/circuits/pump-station.json"));
        return text.replace("0.18261296103078395", density);
    }

    @Test
    void checkCaseFailed_scipyReferences_clean() throws Exception {
        // FORMAT.md section 5: both references computed independently with SciPy 1.10 (norm.pdf, weighted sum, log)
        RuleTester.document(pump("0.18261296103078395"))
                .expect("/nodes/6", "SumNotDeterministic", Severity.INFO).check();
    }

    @Test
    void checkCaseFailed_referenceOffBy1e6_reported() throws Exception {
        RuleTester.document(pump("0.18261396103078395")).expect("/checks/cases/0", "CheckCaseFailed")
                .expect("/nodes/6", "SumNotDeterministic", Severity.INFO).check();
    }

    @Test
    void checkCaseFailed_minusInfinityExpectedButFinite_reported() throws Exception {
        RuleTester.document(pump("null")).expect("/checks/cases/0", "CheckCaseFailed")
                .expect("/nodes/6", "SumNotDeterministic", Severity.INFO).check();
    }
}
