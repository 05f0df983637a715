package dev.circa.format;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The flat node columns: the records they show are the nodes they were made from, member for member,
 * whether built from records in code or read from text; and what they hold in memory is bounded by
 * what the document contains: its content plus at most one partly filled block per column.
 */
class NodeTableTest {
    /** Random nodes of every kind and family, with labels, log forms and any lengths (validity not required). */
    private static List<Node> randomNodes(Random rnd, int n) {
        List<Node> nodes = new ArrayList<>();
        Family[] families = Family.values();
        for (int i = 0; i < n; i++) {
            String label = rnd.nextInt(4) == 0 ? "pump_" + i : null;
            int k = rnd.nextInt(3);
            if (k == 0 || i == 0) {
                Family f = families[rnd.nextInt(families.length)];
                int[] vars = new int[f == Family.MVNORMAL ? 2 + rnd.nextInt(2) : 1];
                for (int j = 0; j < vars.length; j++) {
                    vars[j] = rnd.nextInt(7);
                }
                // as many parameters as the family has (so that the writer can write them), any values
                int d = vars.length;
                double[] params = new double[f == Family.MVNORMAL ? d + d * d
                        : f == Family.CATEGORICAL ? 2 + rnd.nextInt(4) : f.parameters().size()];
                for (int j = 0; j < params.length; j++) {
                    params[j] = rnd.nextGaussian();
                }
                nodes.add(new InputNode(2 * i, label, f, vars, params, f == Family.CATEGORICAL && rnd.nextBoolean()));
                continue;
            }
            int[] children = new int[1 + rnd.nextInt(5)];
            for (int j = 0; j < children.length; j++) {
                children[j] = 2 * rnd.nextInt(i);
            }
            if (k == 1) {
                nodes.add(new ProductNode(2 * i, label, children));
            } else {
                double[] w = new double[children.length + (rnd.nextInt(5) == 0 ? 1 : 0)];
                for (int j = 0; j < w.length; j++) {
                    w[j] = rnd.nextDouble();
                }
                nodes.add(new SumNode(2 * i, label, children, w, rnd.nextBoolean()));
            }
        }
        return nodes;
    }

    private static void assertSameNode(Node want, Node got) {
        assertEquals(want.getClass(), got.getClass());
        assertEquals(want.id(), got.id());
        assertEquals(want.label(), got.label());
        assertArrayEquals(want.children(), got.children());
        if (want instanceof SumNode s) {
            assertArrayEquals(s.weights(), ((SumNode) got).weights());
            assertEquals(s.logWeights(), ((SumNode) got).logWeights());
        } else if (want instanceof InputNode in) {
            InputNode g = (InputNode) got;
            assertEquals(in.family(), g.family());
            assertArrayEquals(in.vars(), g.vars());
            assertArrayEquals(in.params(), g.params());
            assertEquals(in.logForm(), g.logForm());
        }
    }

    @Test
    void recordsInRecordsOut() {
        Random rnd = new Random(14);
        for (int round = 0; round < 20; round++) {
            List<Node> nodes = randomNodes(rnd, 1 + rnd.nextInt(3000));
            NodeTable t = NodeTable.of(nodes);
            assertEquals(nodes.size(), t.size());
            long edges = 0;
            for (int i = 0; i < nodes.size(); i++) {
                assertSameNode(nodes.get(i), t.node(i));
                assertEquals(nodes.get(i).id(), t.id(i));
                edges += nodes.get(i).children().length;
            }
            assertEquals(edges, t.edgeCount());
        }
    }

    @Test
    void builder_pastSeveralFullBlocksOfEveryColumn_everyEntryAsAppended() {
        // more nodes than a byte column's block holds, so every column crosses block boundaries and its
        // first block grows to full size on the way; the expected entries are the ones appended
        int n = 1_100_000;
        NodeTable.Builder b = new NodeTable.Builder();
        Family[] families = Family.values();
        for (int i = 0; i < n; i++) {
            b.appendChild(3 * i);
            b.appendValue(i + 0.25);
            b.appendVar(i % 11);
            byte kind = (byte) (i % 3);
            b.close(kind, 2 * i, i % 100_000 == 0 ? "valve_" + i : null,
                    kind == NodeTable.INPUT ? families[i % families.length] : null, i % 5 == 0);
        }
        NodeTable t = b.build();
        assertEquals(n, t.size());
        assertEquals(n, t.edgeCount());
        assertEquals(n, t.valueCount());
        for (int i = 0; i < n; i++) {
            assertEquals((byte) (i % 3), t.kind(i));
            assertEquals(2 * i, t.id(i));
            assertEquals(i % 100_000 == 0 ? "valve_" + i : null, t.label(i));
            assertEquals(t.kind(i) == NodeTable.INPUT ? families[i % families.length] : null, t.family(i));
            assertEquals(i % 5 == 0, t.logForm(i));
            assertEquals(i, t.childStart(i));
            assertEquals(3 * i, t.childId(t.childStart(i)));
            assertEquals(i + 0.25, t.value(t.valueStart(i)));
            assertEquals(i % 11, t.var(t.varStart(i)));
            assertEquals(i + 1, t.varEnd(i));
        }
    }

    @Test
    void withNumbers_everyNumberRewrittenInPlace_restSharedAndTheOriginalUntouched() {
        // across block boundaries of the number column (more than one block of doubles); each number becomes a
        // function of its node, its position in the node and its old value, so a slip of one position shows
        Random rnd = new Random(16);
        List<Node> nodes = randomNodes(rnd, 150_000);
        NodeTable t = NodeTable.of(nodes);
        assertTrue(t.valueCount() > (1 << 17), "more numbers than one block holds: " + t.valueCount());
        NodeTable u = t.withNumbers((i, j, v) -> v * 3 + i + j / 8.0);
        assertEquals(t.size(), u.size());
        assertEquals(t.valueCount(), u.valueCount());
        for (int i = 0; i < t.size(); i++) {
            Node was = nodes.get(i);
            Node now = u.node(i);
            double[] want = was instanceof SumNode s ? s.weights().clone()
                    : was instanceof InputNode in ? in.params().clone() : new double[0];
            for (int j = 0; j < want.length; j++) {
                want[j] = want[j] * 3 + i + j / 8.0;
            }
            assertEquals(was.getClass(), now.getClass());
            assertEquals(was.id(), now.id());
            assertEquals(was.label(), now.label());
            assertArrayEquals(was.children(), now.children());
            assertArrayEquals(want, now instanceof SumNode s ? s.weights() : now instanceof InputNode in ? in.params()
                    : new double[0]);
            assertSameNode(was, t.node(i));
        }
    }

    /** Node {@code i} of the two-halves test: i % 3 children, one or two numbers, one variable. */
    private static void appendNode(NodeTable.Builder b, int i, String label) {
        Family[] families = Family.values();
        for (int c = 0; c < i % 3; c++) {
            b.appendChild(3 * i + c);
        }
        b.appendValue(i + 0.25);
        if (i % 2 == 0) {
            b.appendValue(-i);
        }
        b.appendVar(i % 11);
        byte kind = (byte) (i % 3);
        b.close(kind, 2 * i, label, kind == NodeTable.INPUT ? families[i % families.length] : null, i % 5 == 0);
    }

    @Test
    void appendAll_twoHalvesAcrossBlocks_sameEntriesAsOneBuilder() {
        // the halves meet at odd places in every column (a partly filled block on both sides), labels in both
        int n = 1_100_000;
        for (int split : new int[] {0, 1, 300_000, 777_777, n}) {
            NodeTable.Builder first = new NodeTable.Builder();
            NodeTable.Builder second = new NodeTable.Builder();
            Family[] families = Family.values();
            for (int i = 0; i < n; i++) {
                appendNode(i < split ? first : second, i, i % 100_000 == 7 ? "valve_" + i : null);
            }
            first.appendAll(second);
            // nodes appended after the halves met go on where the last one ended
            for (int i = n; i < n + 3; i++) {
                appendNode(first, i, null);
            }
            NodeTable t = first.build();
            assertEquals(n + 3, t.size());
            for (int i = 0; i < n + 3; i++) {
                assertEquals((byte) (i % 3), t.kind(i));
                assertEquals(2 * i, t.id(i));
                assertEquals(i % 100_000 == 7 && i < n ? "valve_" + i : null, t.label(i));
                assertEquals(t.kind(i) == NodeTable.INPUT ? families[i % families.length] : null, t.family(i));
                assertEquals(i % 5 == 0, t.logForm(i));
                assertEquals(i % 3, t.childEnd(i) - t.childStart(i));
                for (int c = 0; c < i % 3; c++) {
                    assertEquals(3 * i + c, t.childId(t.childStart(i) + c));
                }
                assertEquals(i % 2 == 0 ? 2 : 1, t.valueEnd(i) - t.valueStart(i));
                assertEquals(i + 0.25, t.value(t.valueStart(i)));
                assertEquals(i % 11, t.var(t.varStart(i)));
                assertEquals(i + 1, t.varEnd(i));
            }
        }
    }

    @Test
    void readFromTextShowsTheNodesWritten() throws Exception {
        Random rnd = new Random(15);
        List<Node> nodes = randomNodes(rnd, 2000);
        CircuitDocument doc = CircuitDocument.builder().variables(List.of(Variable.of("inlet_pressure", VariableType.REAL)))
                .nodes(nodes).outputs(List.of(new Output("joint", nodes.get(nodes.size() - 1).id()))).build();
        ByteArrayOutputStream text = new ByteArrayOutputStream();
        new CircuitWriter().write(doc, text);
        CircuitDocument read = new CircuitReader().read(new ByteArrayInputStream(text.toByteArray()), "nodes.json");
        assertEquals(nodes.size(), read.nodes().size());
        for (int i = 0; i < nodes.size(); i++) {
            assertSameNode(nodes.get(i), read.nodes().get(i));
        }
    }

    @Test
    void memoryBoundedByWhatTheDocumentHolds() throws Exception {
        // a chain of sums with 300,000 edges read from text: the columns hold the child ids (4 bytes), the
        // weights (8 bytes) and 19 bytes per node, plus at most one partly filled block in each of 12 columns
        StringBuilder json = new StringBuilder("{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\":"
                + " [{\"name\": \"inlet_pressure\", \"type\": \"real\"}], \"nodes\": [\n");
        json.append("{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1.5, \"sd\": 0.25}");
        int nodes = 1;
        long edges = 0;
        long values = 2;
        Random rnd = new Random(16);
        while (edges < 300_000) {
            int k = 1 + rnd.nextInt(40);
            json.append(",\n{\"id\": ").append(nodes).append(", \"sum\": [");
            for (int j = 0; j < k; j++) {
                json.append(j == 0 ? "" : ", ").append(rnd.nextInt(nodes));
            }
            json.append("], \"weights\": [");
            for (int j = 0; j < k; j++) {
                json.append(j == 0 ? "" : ", ").append(1.0 / k);
            }
            json.append("]}");
            nodes++;
            edges += k;
            values += k;
        }
        json.append("], \"outputs\": [{\"name\": \"joint\", \"node\": ").append(nodes - 1).append("}]}");
        CircuitDocument doc = new CircuitReader().read(new ByteArrayInputStream(json.toString().getBytes(
                java.nio.charset.StandardCharsets.UTF_8)), "chain.json");
        NodeTable t = doc.nodeTable();
        assertEquals(nodes, t.size());
        assertEquals(edges, t.edgeCount());
        assertEquals(values, t.valueCount());
        long content = 4 * edges + 8 * values + 4 + 19L * nodes;
        assertTrue(t.retainedBytes() <= content + 12L * NodeTable.BLOCK_BYTES,
                "the columns hold " + t.retainedBytes() + " bytes for " + content + " bytes of content");
    }
}
