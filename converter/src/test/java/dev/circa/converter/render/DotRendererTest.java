package dev.circa.converter.render;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
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
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

class DotRendererTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    private static final Pattern EDGE = Pattern.compile("^\\s*(\\w+)\\s*->\\s*(\\w+)\\s*(\\[.*\\])?;$");
    private static final Pattern DECL = Pattern.compile("^\\s*(\\w+)\\s*\\[.*\\];$");

    /** What a minimal DOT reader checks: the graph header, balanced braces outside strings, edges between declared nodes. */
    private record Parsed(Set<String> nodes, List<String[]> edges) {
    }

    private static Parsed parse(String dot) {
        // Graphviz DOT language (common practice): "digraph ID { stmt; ... }", strings in double quotes with \" escapes
        assertTrue(dot.startsWith("digraph "), dot);
        int depth = 0;
        boolean inString = false;
        for (int i = 0; i < dot.length(); i++) {
            char ch = dot.charAt(i);
            if (inString) {
                if (ch == '\\') {
                    i++;
                } else if (ch == '"') {
                    inString = false;
                }
            } else if (ch == '"') {
                inString = true;
            } else if (ch == '{') {
                depth++;
            } else if (ch == '}') {
                depth--;
                assertTrue(depth >= 0, "a '}' without its '{'");
            }
        }
        assertFalse(inString, "an unterminated string");
        assertEquals(0, depth, "unbalanced braces");
        Set<String> nodes = new HashSet<>();
        List<String[]> edges = new ArrayList<>();
        String[] lines = dot.split("\n");
        for (int i = 1; i < lines.length - 1; i++) {
            String line = lines[i];
            Matcher e = EDGE.matcher(line);
            Matcher d = DECL.matcher(line);
            if (e.matches()) {
                edges.add(new String[] {e.group(1), e.group(2)});
            } else if (d.matches()) {
                if (!d.group(1).equals("node") && !d.group(1).equals("edge")) {
                    nodes.add(d.group(1));
                }
            } else {
                assertTrue(line.strip().startsWith("label="), "unexpected statement: " + line);
            }
        }
        for (String[] e : edges) {
            assertTrue(nodes.contains(e[0]) && nodes.contains(e[1]), "edge " + e[0] + " -> " + e[1] + " between undeclared nodes");
        }
        return new Parsed(nodes, edges);
    }

    @Test
    void render_formatExample_nodeByNodeWithWeightsAndFamilies() throws Exception {
        CompiledCircuit c = CompiledCircuit.compile(new CircuitReader().read(EXAMPLE));
        String dot = DotRenderer.render(c, RenderOptions.DEFAULT);
        Parsed p = parse(dot);
        assertEquals(7 + 1, p.nodes().size());
        assertEquals(6 + 1, p.edges().size());
        assertTrue(dot.contains("n6 -> n2 [label=\"0.850\"];"), dot);
        assertTrue(dot.contains("n6 -> n5 [label=\"0.150\"];"), dot);
        assertTrue(dot.contains("#0 normal\\ninlet_pressure\\nmean=3.10 sd=0.200"), dot);
        assertTrue(dot.contains("o0 -> n6;"), dot);
        assertFalse(dot.contains("{inlet_pressure, valve}"));
        assertFalse(DotRenderer.isSummary(c, RenderOptions.DEFAULT));
    }

    @Test
    void render_withScopes_labelsInnerNodesWithTheirScope() throws Exception {
        CompiledCircuit c = CompiledCircuit.compile(new CircuitReader().read(EXAMPLE));
        String dot = DotRenderer.render(c, new RenderOptions(true, 500));
        parse(dot);
        assertTrue(dot.contains("#6 sum\\n{inlet_pressure, valve}"), dot);
    }

    @Test
    void render_aboveLimit_summaryByScopeWithAggregatedEdges() throws Exception {
        int k = 200;
        List<Node> nodes = new ArrayList<>();
        int[] products = new int[k];
        double[] w = new double[k];
        for (int i = 0; i < k; i++) {
            nodes.add(new InputNode(3 * i, null, Family.NORMAL, new int[] {0}, new double[] {i * 0.01, 1}, false));
            nodes.add(new InputNode(3 * i + 1, null, Family.CATEGORICAL, new int[] {1}, new double[] {0.2, 0.3, 0.5}, false));
            nodes.add(new ProductNode(3 * i + 2, null, new int[] {3 * i, 3 * i + 1}));
            products[i] = 3 * i + 2;
            w[i] = 1.0 / k;
        }
        nodes.add(new SumNode(3 * k, null, products, w, false));
        CircuitDocument doc = CircuitDocument.builder()
                .variables(List.of(Variable.of("inlet_pressure", VariableType.REAL),
                        new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null)))
                .nodes(nodes).outputs(List.of(new Output("joint", 3 * k))).build();
        CompiledCircuit c = CompiledCircuit.compile(doc);
        assertTrue(DotRenderer.isSummary(c, RenderOptions.DEFAULT));
        String dot = DotRenderer.render(c, RenderOptions.DEFAULT);
        Parsed p = parse(dot);
        // groups: inputs over inlet_pressure, inputs over valve, products and the sum over both; plus the output
        assertEquals(4 + 1, p.nodes().size(), dot);
        assertEquals(3 + 1, p.edges().size(), dot);
        assertTrue(dot.contains("summary by scope: 601 nodes, 600 edges in 4 groups (more than 500 nodes)"), dot);
        assertTrue(dot.contains("200 products\\n{inlet_pressure, valve}"), dot);
        assertTrue(dot.contains("[label=\"200 edges\"]"), dot);
        assertTrue(dot.contains("1 sum\\n{inlet_pressure, valve}"), dot);

        String detailed = DotRenderer.render(c, new RenderOptions(false, 1000));
        Parsed q = parse(detailed);
        assertEquals(601 + 1, q.nodes().size());
        assertEquals(600 + 1, q.edges().size());
    }

    @Test
    void quote_labelWithQuotesAndBackslashes_escaped() {
        assertEquals("\"a \\\"b\\\" \\\\ c\\nd\"", DotRenderer.quote("a \"b\" \\ c\nd"));
    }

    @Test
    void render_keepsNodeLabels_underIdAndKind() throws Exception {
        String json = """
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "flow", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 1, "sd": 1, "label": "steady flow"},
                       {"id": 1, "input": "normal", "var": 0, "mean": 4, "sd": 2},
                       {"id": 2, "sum": [0, 1], "weights": [0.5, 0.5], "label": "pump \\"A\\" regimes"}],
             "outputs": [{"name": "joint", "node": 2}]}
            """;
        CircuitDocument doc = new CircuitReader().readString(json, "labels.json");
        String dot = DotRenderer.render(CompiledCircuit.compile(doc), RenderOptions.DEFAULT);
        String labelled = sb(doc);
        assertEquals(dot, DotRenderer.render(CompiledCircuit.compile(doc), RenderOptions.DEFAULT), "the label-free form is unchanged");
        assertTrue(labelled.contains("label=\"#0 normal\\nsteady flow\\nflow"), labelled);
        assertTrue(labelled.contains("label=\"#2 sum\\npump \\\"A\\\" regimes\""), labelled);
        assertTrue(labelled.contains("label=\"#1 normal\\nflow"), labelled);
    }

    private static String sb(CircuitDocument doc) throws Exception {
        StringBuilder out = new StringBuilder();
        DotRenderer.render(CompiledCircuit.compile(doc), RenderOptions.DEFAULT, out, DotRenderer.labelsOf(doc));
        return out.toString();
    }

    @Test
    void render_wholeNumberParameters_printAsIntegers() throws Exception {
        String json = """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "c", "type": "count"}, {"name": "v", "type": "categorical", "states": ["a", "b", "c"]}],
             "nodes": [{"id": 0, "input": "binomial", "var": 0, "trials": 12, "p": 0.5},
                       {"id": 1, "input": "indicator", "var": 1, "value": 2}, {"id": 2, "product": [0, 1]}],
             "outputs": [{"name": "joint", "node": 2}]}
            """;
        String dot = DotRenderer.render(CompiledCircuit.compile(new CircuitReader().readString(json, "ints.json")), RenderOptions.DEFAULT);
        assertTrue(dot.contains("trials=12 p=0.500"), dot);
        assertTrue(dot.contains("value=2\""), dot);
    }
}
