package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.io.CircuitReader;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

class CompiledCircuitTest {
    private static final String VARIABLES = """
        "variables": [{"name": "inlet_pressure", "type": "real"},
                      {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]},
                      {"name": "outlet_pressure", "type": "real"}]""";

    private static CircuitDocument doc(String nodes, String outputs) throws Exception {
        String json = "{\"format\": \"circa.circuit\", \"version\": \"1.0\", " + VARIABLES + ", \"nodes\": [" + nodes
                + "], \"outputs\": [" + outputs + "]}";
        return new CircuitReader().readString(json, "inline.json");
    }

    private static final String JOINT = "{\"name\": \"joint\", \"node\": 2}";

    /** Broken documents: nodes, outputs, the node index the error names, a fragment of the message. */
    static Stream<Arguments> broken() {
        String n0 = "{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 3.1, \"sd\": 0.2}";
        String n1 = "{\"id\": 1, \"input\": \"categorical\", \"var\": 1, \"probs\": [0.2, 0.3, 0.5]}";
        return Stream.of(
                Arguments.of(n0 + "," + n1 + ", {\"id\": 2, \"product\": [0, 7]}", JOINT, 2, "child id 7, which no node has"),
                Arguments.of(n0 + ", {\"id\": 2, \"product\": [0, 1]}," + n1, "{\"name\": \"joint\", \"node\": 2}", 1,
                        "does not come earlier"),
                Arguments.of(n0 + ", {\"id\": 0, \"input\": \"normal\", \"var\": 2, \"mean\": 0, \"sd\": 1}, {\"id\": 2, \"product\": [0]}",
                        JOINT, 1, "repeats the id"),
                Arguments.of(n0 + ", {\"id\": 1, \"input\": \"normal\", \"var\": 5, \"mean\": 0, \"sd\": 1}, {\"id\": 2, \"product\": [0, 1]}",
                        JOINT, 1, "variable 5 (expected an index 0..2)"),
                Arguments.of(n0 + ", {\"id\": 1, \"input\": \"poisson\", \"var\": 1, \"rate\": 2}, {\"id\": 2, \"product\": [0, 1]}",
                        JOINT, 1, "expected a variable of type count"),
                Arguments.of(n0 + "," + n1 + ", {\"id\": 2, \"sum\": [0, 1], \"weights\": [1]}", JOINT, 2, "1 weights for 2 children"),
                Arguments.of(n0 + "," + n1 + ", {\"id\": 2, \"product\": [0, 1]}", "{\"name\": \"joint\", \"node\": 9}", -1,
                        "output \"joint\" names node id 9"),
                Arguments.of(n1 + ", {\"id\": 0, \"input\": \"mvnormal\", \"vars\": [0, 0], \"mean\": [0, 0], \"cov\": [[1, 0], [0, 1]]},"
                        + " {\"id\": 2, \"product\": [0, 1]}", JOINT, 1, "twice"),
                Arguments.of(n1 + ", {\"id\": 0, \"input\": \"mvnormal\", \"vars\": [0, 1], \"mean\": [0, 0], \"cov\": [[1, 0], [0, 1]]},"
                        + " {\"id\": 2, \"product\": [0, 1]}", JOINT, 1, "type categorical"),
                Arguments.of(n1 + ", {\"id\": 0, \"input\": \"mvnormal\", \"vars\": [0, 2], \"mean\": [0, 0], \"cov\": [[1, 2], [2, 1]]},"
                        + " {\"id\": 2, \"product\": [0, 1]}", JOINT, 1, "not positive definite"),
                Arguments.of(n0 + ", {\"id\": 1, \"input\": \"categorical\", \"var\": 1, \"probs\": [0.5, 0.5]}, {\"id\": 2, \"product\": [0, 1]}",
                        JOINT, 1, "2 parameter values (expected 3)"),
                Arguments.of(n0 + ", {\"id\": 1, \"input\": \"normal\", \"var\": 2, \"mean\": 0, \"sd\": 0}, {\"id\": 2, \"product\": [0, 1]}",
                        JOINT, 1, "sd = 0.0 (expected > 0)"),
                Arguments.of(n0 + "," + n1 + ", {\"id\": 2, \"sum\": [0, 1], \"weights\": [1, -0.5]}", JOINT, 2, "expected a finite number >= 0"),
                Arguments.of(n0 + ", {\"id\": 1, \"input\": \"indicator\", \"var\": 1, \"value\": 3}, {\"id\": 2, \"product\": [0, 1]}",
                        JOINT, 1, "expected a state index"));
    }

    @ParameterizedTest
    @MethodSource("broken")
    void compile_brokenDocument_throwsNamingTheNode(String nodes, String outputs, int index, String fragment) throws Exception {
        CircuitDocument d = doc(nodes, outputs);
        CompileException e = assertThrows(CompileException.class, () -> CompiledCircuit.compile(d));
        assertTrue(e.getMessage().contains(fragment), e.getMessage());
        assertEquals(index, e.nodeIndex(), e.getMessage());
        if (index >= 0) {
            assertTrue(e.getMessage().contains("/nodes/" + index), e.getMessage());
        }
    }

    @Test
    void compile_pumpStation_flatArraysInDocumentOrder() throws Exception {
        CompiledCircuit c = CompiledCircuit.compile(new CircuitReader().read(EvaluatorContractTest.PUMP_STATION));
        assertEquals(7, c.nodeCount());
        assertEquals(6, c.edgeCount());
        assertEquals(2, c.variableCount());
        assertEquals(1, c.outputCount());
        assertEquals(0, c.outputIndex("joint"));
        assertEquals(-1, c.outputIndex("other"));
        assertEquals(6, c.outputNode(0));
        assertEquals(NodeKind.SUM, c.kind(6));
        assertEquals(NodeKind.PRODUCT, c.kind(2));
        assertEquals(NodeKind.INPUT, c.kind(0));
        assertArrayEquals(new int[] {0, 0, 0, 2, 2, 2, 4, 6}, c.childStart());
        assertArrayEquals(new int[] {0, 1, 3, 4, 2, 5}, c.childIndex());
        assertEquals(Math.log(0.85), c.logWeight()[4]);
        assertEquals(Math.log(0.15), c.logWeight()[5]);
        assertEquals(Family.NORMAL, c.inputFamily(0));
        assertArrayEquals(new double[] {3.1, 0.2}, c.inputParams(0));
        assertArrayEquals(new int[] {1}, c.inputVars(1));
        assertEquals(5, c.nodeIndexOfId(5));
        assertThrows(IllegalArgumentException.class, () -> c.inputFamily(2));
    }

    @Test
    void compile_sparseIds_mappedToIndices() throws Exception {
        CompiledCircuit c = CompiledCircuit.compile(doc(
                "{\"id\": 40, \"input\": \"normal\", \"var\": 0, \"mean\": 3.1, \"sd\": 0.2},"
                + "{\"id\": 7, \"input\": \"categorical\", \"var\": 1, \"logProbs\": [-1.0, -2.0, -0.5]},"
                + "{\"id\": 1000000, \"product\": [40, 7]}", "{\"name\": \"joint\", \"node\": 1000000}"));
        assertEquals(2, c.nodeIndexOfId(1000000));
        assertEquals(0, c.nodeIndexOfId(40));
        assertEquals(-1, c.nodeIndexOfId(3));
        assertEquals(1000000, c.nodeId(2));
        assertEquals(2, c.outputNode(0));
        assertTrue(c.inputLogForm(1));
        assertArrayEquals(new int[] {0, 1}, java.util.Arrays.copyOfRange(c.childIndex(), 0, 2));
    }
}
