package dev.circa.validator.rules;

import static dev.circa.validator.rules.Models.NODES;
import static dev.circa.validator.rules.Models.OUT;
import static dev.circa.validator.rules.Models.VARS;
import static dev.circa.validator.rules.RuleTester.circuit;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Parameter rules: FORMAT.md's input table, finiteness, covariances, weight signs. */
class ParameterRulesTest {
    private static final String VALVE = """
            {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]}""";
    private static final String TWO_REAL = """
            {"name": "inlet_pressure", "type": "real"}, {"name": "outlet_pressure", "type": "real"}""";

    private static String mv(String cov) {
        return "{\"id\": 0, \"input\": \"mvnormal\", \"vars\": [0, 1], \"mean\": [3.1, 5.0], \"cov\": " + cov + "}";
    }

    private static CircuitDocument normal(double mean, double sd) {
        return CircuitDocument.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL)))
                .nodes(List.of(new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {mean, sd}, false)))
                .outputs(List.of(new Output("joint", 0))).build();
    }

    @Test
    void numberNotFinite_nanMean_reported() {
        RuleTester.built(normal(Double.NaN, 1)).expect("/nodes/0/mean", "NumberNotFinite")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void numberNotFinite_finiteNumbers_clean() {
        RuleTester.built(normal(3.1, 0.2)).check();
    }

    @Test
    void parameterOutOfRange_negativeSd_reported() {
        circuit(VARS, NODES.replace("\"sd\": 0.2", "\"sd\": -0.2"), OUT).expect("/nodes/2/sd", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void parameterOutOfRange_bernoulliAboveOne_reported() {
        circuit("{\"name\": \"alarm\", \"type\": \"binary\"}", "{\"id\": 0, \"input\": \"bernoulli\", \"var\": 0, \"p\": 1.5}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/p", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void parameterOutOfRange_uniformLowAboveHigh_reported() {
        circuit("{\"name\": \"inlet_pressure\", \"type\": \"real\"}",
                "{\"id\": 0, \"input\": \"uniform\", \"var\": 0, \"low\": 4, \"high\": 2}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/low", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void parameterOutOfRange_binomialFractionalTrials_reported() {
        circuit("{\"name\": \"restarts\", \"type\": \"count\"}",
                "{\"id\": 0, \"input\": \"binomial\", \"var\": 0, \"trials\": 2.5, \"p\": 0.1}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/trials", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void parameterOutOfRange_binomialTrialsPastTwoToThe53_reported() {
        // IEEE 754: 2^53 = 9007199254740992 is the last of the integers a double holds exactly;
        // 1e19 and 2^53 + 2 are past it, 2^53 itself is within the limit.
        for (String trials : new String[] {"1e19", "10000000000000000000", "9007199254740994"}) {
            circuit("{\"name\": \"restarts\", \"type\": \"count\"}",
                    "{\"id\": 0, \"input\": \"binomial\", \"var\": 0, \"trials\": " + trials + ", \"p\": 0.1}",
                    "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/trials", "ParameterOutOfRange")
                    .expect("", "RequiredPropertyUnknown").check();
        }
        circuit("{\"name\": \"restarts\", \"type\": \"count\"}",
                "{\"id\": 0, \"input\": \"binomial\", \"var\": 0, \"trials\": 9007199254740992, \"p\": 0.1}",
                "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void parameterOutOfRange_indicatorStateMissing_reported() {
        circuit(VALVE, "{\"id\": 0, \"input\": \"indicator\", \"var\": 0, \"value\": 3}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/value", "ParameterOutOfRange")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void parameterOutOfRange_validParameters_clean() {
        circuit(VARS, NODES, OUT).check();
    }

    @Test
    void categoricalLengthMismatch_twoProbsThreeStates_reported() {
        circuit(VALVE, "{\"id\": 0, \"input\": \"categorical\", \"var\": 0, \"probs\": [0.5, 0.5]}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/probs", "CategoricalLengthMismatch")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void categoricalLengthMismatch_onePerState_clean() {
        circuit(VALVE, "{\"id\": 0, \"input\": \"categorical\", \"var\": 0, \"probs\": [0.05, 0.15, 0.8]}",
                "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void probabilitiesNotNormalized_sumPoint9_reported() {
        circuit(VALVE, "{\"id\": 0, \"input\": \"categorical\", \"var\": 0, \"probs\": [0.05, 0.15, 0.7]}",
                "{\"name\": \"joint\", \"node\": 0}").expect("/nodes/0/probs", "ProbabilitiesNotNormalized")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void probabilitiesNotNormalized_logProbsOfOneThird_clean() {
        double l = Math.log(1.0 / 3);
        circuit(VALVE, "{\"id\": 0, \"input\": \"categorical\", \"var\": 0, \"logProbs\": [" + l + ", " + l + ", " + l + "]}",
                "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void covarianceNotSymmetric_offDiagonalDiffers_reported() {
        circuit(TWO_REAL, mv("[[0.04, 0.01], [0.02, 0.09]]"), "{\"name\": \"joint\", \"node\": 0}")
                .expect("/nodes/0/cov/0/1", "CovarianceNotSymmetric").expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void covarianceNotSymmetric_differenceWithinTolerance_clean() {
        // |0.01 - (0.01 + 5e-11)| = 5e-11 <= 1e-9 * max|cov| = 9e-11 (CLI.md's bound)
        circuit(TWO_REAL, mv("[[0.04, 0.01], [0.01000000005, 0.09]]"), "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void covarianceNotPositiveDefinite_indefinite_reported() {
        // eigenvalues of [[1, 2], [2, 1]] are 3 and -1 (hand computation)
        circuit(TWO_REAL, mv("[[1, 2], [2, 1]]"), "{\"name\": \"joint\", \"node\": 0}")
                .expect("/nodes/0/cov", "CovarianceNotPositiveDefinite").expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void covarianceNotPositiveDefinite_definite_clean() {
        circuit(TWO_REAL, mv("[[0.04, 0.01], [0.01, 0.09]]"), "{\"name\": \"joint\", \"node\": 0}").check();
    }

    @Test
    void weightNegative_flippedSign_reported() {
        circuit(VARS, NODES.replace("[0.3, 0.7]", "[1.3, -0.3]"), OUT).expect("/nodes/6/weights/1", "WeightNegative")
                .expect("", "RequiredPropertyUnknown").check();
    }

    @Test
    void weightNegative_nonNegativeWeights_clean() {
        circuit(VARS, NODES.replace("[0.3, 0.7]", "[1.0, 0.0]"), OUT).check();
    }
}
