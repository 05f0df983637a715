package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.validator.compare.CompareOptions;
import dev.circa.validator.compare.ComparisonReport;
import dev.circa.validator.compare.Disagreement;
import dev.circa.validator.compare.OutputComparison;
import dev.circa.validator.regression.CaseResult;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.OutputSummary;
import dev.circa.validator.regression.Tolerance;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The JSON of the check and comparison reports, byte for byte as the reports wrote it before they were
 * written with Jackson (the expected texts were captured from the hand-written form), and parseable by an
 * independent JSON reader (RFC 8259 escaping, common practice).
 */
class ReportJsonTest {
    private static final String ODD = "a\"b\\c\nd\te\rf\u0001g\u001fh/\u00e9";

    static CheckReport checkReport(boolean withCases) {
        List<CaseResult> worst = withCases ? List.of(
                new CaseResult(ODD, 3, 7, null, "out", -1.5, -1.25, false, 2.0),
                new CaseResult("checks.csv", 0, 12, "/checks/cases/0", ODD, Double.NEGATIVE_INFINITY,
                        Double.NaN, false, Double.POSITIVE_INFINITY)) : List.of();
        List<OutputSummary> outputs = withCases ? List.of(new OutputSummary("out", 2, 1, 0.25, 1e-9),
                new OutputSummary(ODD, 1, 1, Double.POSITIVE_INFINITY, 0)) : List.of();
        return new CheckReport(new Tolerance(1e-9, 2.5e-7), withCases ? 3 : 0, withCases ? 2 : 0,
                withCases ? Double.POSITIVE_INFINITY : 0, withCases ? 0.125 : 0, worst, outputs);
    }

    static ComparisonReport comparisonReport(boolean withPoints) {
        List<Variable> variables = List.of(Variable.of("flow", VariableType.REAL),
                new Variable(ODD, VariableType.CATEGORICAL, List.of("off", "o\"n"), null, null),
                Variable.of("hidden", VariableType.BINARY));
        List<Disagreement> worst = withPoints ? List.of(
                new Disagreement("out", "A", 4, new double[] {1.5, 1, Double.NaN}, -2.0, Double.NEGATIVE_INFINITY,
                        false, Double.POSITIVE_INFINITY),
                new Disagreement(ODD, "B", 9, new double[] {Double.NaN, 0, 1}, -1.0, -1.0 + 1e-12, true, 0))
                : List.of();
        List<OutputComparison> outputs = List.of(new OutputComparison("out", ODD, 10, withPoints ? 1 : 0, 0.5,
                Double.NEGATIVE_INFINITY, -0.0));
        return new ComparisonReport(new CompareOptions(10, 42, 1e-9, 1e-6), variables, !withPoints, 10,
                withPoints ? 1 : 0, withPoints ? 0.5 : 0, withPoints ? Double.NaN : 0, outputs, worst);
    }

    @Test
    void checkReport_bytesAsBefore() {
        assertEquals(CHECK_FULL, checkReport(true).toJson());
        assertEquals(CHECK_EMPTY, checkReport(false).toJson());
    }

    @Test
    void comparisonReport_bytesAsBefore() {
        assertEquals(COMPARE_FULL, comparisonReport(true).toJson());
        assertEquals(COMPARE_EMPTY, comparisonReport(false).toJson());
    }

    @Test
    void reports_parseBackWithTheirStrings() {
        JsonMapper mapper = new JsonMapper();
        JsonNode check = mapper.readTree(checkReport(true).toJson());
        assertEquals(ODD, check.get("worst").get(0).get("source").asString());
        assertEquals(ODD, check.get("outputs").get(1).get("output").asString());
        JsonNode compare = mapper.readTree(comparisonReport(true).toJson());
        assertEquals(ODD, compare.get("outputs").get(0).get("outputB").asString());
        assertEquals("o\"n", compare.get("worst").get(0).get("values").get(ODD).asString());
    }

    // Captured from the hand-written JSON of both reports before they moved to Jackson.
    static final String CHECK_FULL = "{\"cases\": 3, \"failures\": 2, \"maxAbsError\": null, \"maxRelError\": 0.125, \"worst\": [\n"
            + "  {\"source\": \"a\\\"b\\\\c\\nd\\te\\rf\\u0001g\\u001fh/\u00e9\", \"row\": 3, \"line\": 7, \"output\": \"out\", \"expected\": -1.5, \"computed\": -1.25, \"absError\": 0.25, \"relError\": 0.16666666666666666, \"margin\": 2.0, \"passed\": false},\n"
            + "  {\"source\": \"checks.csv\", \"row\": 0, \"line\": 12, \"pointer\": \"/checks/cases/0\", \"output\": \"a\\\"b\\\\c\\nd\\te\\rf\\u0001g\\u001fh/\u00e9\", \"expected\": null, \"computed\": null, \"absError\": null, \"relError\": null, \"margin\": null, \"passed\": false}\n"
            + "], \"passed\": false, \"atol\": 1.0E-9, \"rtol\": 2.5E-7, \"outputs\": [{\"output\": \"out\", \"cases\": 2, \"failures\": 1, \"maxAbsError\": 0.25, \"maxRelError\": 1.0E-9}, {\"output\": \"a\\\"b\\\\c\\nd\\te\\rf\\u0001g\\u001fh/\u00e9\", \"cases\": 1, \"failures\": 1, \"maxAbsError\": null, \"maxRelError\": 0.0}]}\n";
    static final String CHECK_EMPTY = "{\"cases\": 0, \"failures\": 0, \"maxAbsError\": 0.0, \"maxRelError\": 0.0, \"worst\": [], \"passed\": true, \"atol\": 1.0E-9, \"rtol\": 2.5E-7, \"outputs\": []}\n";
    static final String COMPARE_FULL = "{\"structurallyIdentical\": false, \"passed\": false, \"points\": 10, \"failures\": 1, \"maxAbsError\": 0.5, \"maxRelError\": null, \"samples\": 10, \"seed\": 42, \"atol\": 1.0E-9, \"rtol\": 1.0E-6, \"outputs\": [{\"outputA\": \"out\", \"outputB\": \"a\\\"b\\\\c\\u000ad\\u0009e\\u000df\\u0001g\\u001fh/\u00e9\", \"points\": 10, \"failures\": 1, \"maxAbsError\": 0.5, \"logPartitionA\": null, \"logPartitionB\": -0.0}], \"worst\": [\n"
            + "  {\"output\": \"out\", \"sampledFrom\": \"A\", \"point\": 4, \"logA\": -2.0, \"logB\": null, \"absError\": null, \"agree\": false, \"values\": {\"flow\": 1.5, \"a\\\"b\\\\c\\u000ad\\u0009e\\u000df\\u0001g\\u001fh/\u00e9\": \"o\\\"n\"}},\n"
            + "  {\"output\": \"a\\\"b\\\\c\\u000ad\\u0009e\\u000df\\u0001g\\u001fh/\u00e9\", \"sampledFrom\": \"B\", \"point\": 9, \"logA\": -1.0, \"logB\": -0.999999999999, \"absError\": 9.999778782798785E-13, \"agree\": true, \"values\": {\"a\\\"b\\\\c\\u000ad\\u0009e\\u000df\\u0001g\\u001fh/\u00e9\": \"off\", \"hidden\": 1.0}}\n"
            + "]}\n";
    static final String COMPARE_EMPTY = "{\"structurallyIdentical\": true, \"passed\": true, \"points\": 10, \"failures\": 0, \"maxAbsError\": 0.0, \"maxRelError\": 0.0, \"samples\": 10, \"seed\": 42, \"atol\": 1.0E-9, \"rtol\": 1.0E-6, \"outputs\": [{\"outputA\": \"out\", \"outputB\": \"a\\\"b\\\\c\\u000ad\\u0009e\\u000df\\u0001g\\u001fh/\u00e9\", \"points\": 10, \"failures\": 0, \"maxAbsError\": 0.5, \"logPartitionA\": null, \"logPartitionB\": -0.0}], \"worst\": []}\n";
}
