package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Shapes that defeat naive recursion: a diamond ladder (2^60 paths) and a 100,000-deep chain. */
class ScaleTest {
    @TempDir
    Path dir;

    @Test
    void validate_diamondLadder60_linearAndNormalized() {
        List<Node> nodes = new ArrayList<>();
        nodes.add(new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {3.1, 0.2}, false));
        nodes.add(new InputNode(1, null, Family.NORMAL, new int[] {0}, new double[] {2.2, 0.5}, false));
        for (int level = 1; level <= 60; level++) {
            int a = 2 * level - 2;
            int b = 2 * level - 1;
            nodes.add(new SumNode(2 * level, null, new int[] {a, b}, new double[] {0.25, 0.75}, false));
            nodes.add(new SumNode(2 * level + 1, null, new int[] {a, b}, new double[] {0.6, 0.4}, false));
        }
        CircuitDocument doc = CircuitDocument.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL)))
                .nodes(nodes).outputs(List.of(new Output("joint", 120))).build();
        ValidationReport r = new Validator(ValidationOptions.defaults()).validate(doc);
        assertTrue(r.valid(), r.diagnostics().toString());
        assertEquals(60, r.stats().depth());
        assertEquals(0.0, r.logPartition().get("joint"), 1e-12);
        // node 121 is not an output's descendant: the one warning
        assertEquals(1, r.count(Severity.WARNING));
    }

    @Test
    void validate_chain100000Deep_noStackOverflow() throws Exception {
        int depth = 100_000;
        List<Node> nodes = new ArrayList<>();
        nodes.add(new InputNode(0, null, Family.CATEGORICAL, new int[] {0}, new double[] {0.2, 0.3, 0.5}, false));
        nodes.add(new InputNode(1, null, Family.INDICATOR, new int[] {0}, new double[] {2}, false));
        for (int k = 2; k < depth; k++) {
            nodes.add(k % 2 == 0 ? new SumNode(k, null, new int[] {k - 1, 0}, new double[] {0.5, 0.5}, false)
                    : new ProductNode(k, null, new int[] {k - 1}));
        }
        CircuitDocument built = CircuitDocument.builder()
                .variables(List.of(new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null)))
                .nodes(nodes).outputs(List.of(new Output("joint", depth - 1))).build();
        Path file = dir.resolve("chain.json");
        new CircuitWriter().write(built, file);
        ValidationReport r = new Validator(ValidationOptions.defaults()).validate(file);
        assertTrue(r.valid(), r.diagnostics().toString());
        assertEquals(depth - 2, r.stats().depth());
        assertEquals(Verdict.TRUE, r.property(Property.STRUCTURED_DECOMPOSABLE));
        assertEquals("0", r.variableTree().toString());
        assertEquals(0.0, r.logPartition().get("joint"), 1e-9);
        // every sum is decided by enumerating its 3 assignments: valve=open is positive in both children
        assertEquals(Verdict.FALSE, r.property(Property.DETERMINISTIC));
        // 49,999 witnesses of a property not required: three kept, then one line counting the rest
        List<Diagnostic> det = r.diagnostics().stream().filter(d -> d.code().equals("SumNotDeterministic")).toList();
        assertEquals(4, det.size());
        assertTrue(det.get(3).message().startsWith("49996 more diagnostics of this rule not shown (49999 in all)"),
                det.get(3).message());
        String json = ReportFormat.JSON.render(List.of(r));
        assertTrue(json.contains("\"variableTree\" : 0"), json.substring(0, 400));
    }
}
