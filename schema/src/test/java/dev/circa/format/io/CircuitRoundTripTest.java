package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.SumNode;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

class CircuitRoundTripTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");

    @Test
    void read_formatExample_buildsNodesOutputsChecks() throws Exception {
        CircuitDocument doc = new CircuitReader().read(EXAMPLE);
        assertEquals(7, doc.nodes().size());
        assertEquals("joint", doc.outputs().get(0).name());
        assertEquals(2, doc.checks().cases().size());
        assertEquals(0.18261296103078395, doc.checks().cases().get(0).logDensity());
        assertEquals(10, doc.nodeLocation(0).line());
        assertTrue(doc.findings().isEmpty());
    }

    @Test
    void writeThenRead_doublesComeBackBitForBit() throws Exception {
        double[] hard = {0.1, 1.0 / 3.0, 4.9e-324, 2.2250738585072014e-308, 1e300, -0.0};
        String json = """
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "x", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 0, "sd": 1},
                       {"id": 1, "sum": [0, 0, 0, 0, 0, 0], "logWeights": [%s]}],
             "outputs": [{"name": "joint", "node": 1}], "extensions": {"team": {"run": 7}}}
            """.formatted(String.join(", ", java.util.Arrays.stream(hard).mapToObj(Double::toString).toList()));
        CircuitDocument doc = new CircuitReader().readString(json, "inline");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new CircuitWriter().write(doc, out);
        CircuitDocument back = new CircuitReader().readString(out.toString(StandardCharsets.UTF_8), "written");
        double[] w = ((SumNode) back.nodes().get(1)).weights();
        for (int i = 0; i < hard.length; i++) {
            assertEquals(Double.doubleToRawLongBits(hard[i]), Double.doubleToRawLongBits(w[i]), "value " + hard[i]);
        }
        assertEquals(7, back.extensions().get("team").get("run").asInt());
        assertArrayEquals(((InputNode) doc.nodes().get(0)).params(), ((InputNode) back.nodes().get(0)).params());
    }

    @Test
    void read_duplicateKey_rejectedWithLocation() {
        FormatException e = assertThrows(FormatException.class, () -> new CircuitReader().readString(
                "{\"format\": \"circa.circuit\", \"format\": \"circa.circuit\"}", "dup.json"));
        assertTrue(e.getMessage().contains("duplicate key"), e.getMessage());
        assertEquals(1, e.line());
    }
}
