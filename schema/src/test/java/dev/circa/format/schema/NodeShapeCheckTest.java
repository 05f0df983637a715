package dev.circa.format.schema;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * The tree-less first look at a node ({@link NodeShapeCheck}) against the JSON Schema library
 * (networknt json-schema-validator, the outside reference) on the bundled circuit schema: whenever the
 * first look says a node conforms, the library finds no violation in it (it may never vouch for a
 * node the library rejects), and it does vouch for every node of the valid fixtures (so that a valid
 * circuit is checked without building trees).
 */
class NodeShapeCheckTest {
    private static final ObjectMapper JSON = JsonInput.mapperFor(ReadLimits.DEFAULT);
    private static final Path FIXTURES = Path.of("..", "fixtures");

    private static boolean vouches(JsonNode node) throws FormatException {
        byte[] text = JSON.writeValueAsString(node).getBytes(StandardCharsets.UTF_8);
        try (JsonInput in = JsonInput.fromStream(new ByteArrayInputStream(text), "node.json", ReadLimits.DEFAULT)) {
            in.next();
            return SchemaCatalog.get().nodeShapes().fresh().conforms(in);
        }
    }

    private static boolean libraryAccepts(JsonNode node) {
        return SchemaCatalog.get().validateNode(node, "/nodes/0").isEmpty();
    }

    private static List<JsonNode> fixtureNodes(boolean validOnly) throws Exception {
        List<JsonNode> nodes = new ArrayList<>();
        List<Path> files;
        try (Stream<Path> s = Files.walk(FIXTURES)) {
            files = s.filter(p -> p.toString().endsWith(".json")).sorted().toList();
        }
        for (Path f : files) {
            JsonNode doc;
            try {
                doc = JSON.readTree(f.toFile());
            } catch (RuntimeException e) {
                continue;
            }
            if (doc == null || !"circa.circuit".equals(doc.path("format").asString(""))
                    || validOnly && f.toString().contains("invalid") || !doc.path("nodes").isArray()) {
                continue;
            }
            for (JsonNode n : doc.get("nodes")) {
                nodes.add(n);
            }
        }
        return nodes;
    }

    @Test
    void vouchesForEveryNodeOfTheValidFixtures() throws Exception {
        List<JsonNode> nodes = fixtureNodes(true);
        assertTrue(nodes.size() > 50, "fixture nodes found: " + nodes.size());
        for (JsonNode n : nodes) {
            if (libraryAccepts(n)) {
                assertTrue(vouches(n), "a node the schema library accepts is not vouched for: " + n);
            }
        }
    }

    @Test
    void neverVouchesForANodeTheLibraryRejects() throws Exception {
        List<JsonNode> nodes = fixtureNodes(false);
        Random rnd = new Random(20261202);
        int rejected = 0;
        int checked = 0;
        for (int round = 0; round < 6; round++) {
            for (JsonNode original : nodes) {
                JsonNode n = round == 0 ? original : mutate(original, rnd);
                boolean library = libraryAccepts(n);
                rejected += library ? 0 : 1;
                checked++;
                if (vouches(n)) {
                    assertTrue(library, "vouched for a node the schema library rejects: " + n);
                }
            }
        }
        assertTrue(rejected > checked / 4, "the mutations broke " + rejected + " of " + checked + " nodes");
    }

    @Test
    void schemaCheckOfAFileFindsWhatTheWholeTreeFinds() throws Exception {
        // every circuit of the schema corpus, through the two-pass file check and through the whole tree
        List<Path> files;
        try (Stream<Path> s = Files.walk(FIXTURES.resolve("schema-corpus").resolve("circuit"))) {
            files = s.filter(p -> p.toString().endsWith(".json")).sorted().toList();
        }
        assertTrue(files.size() > 20);
        for (Path f : files) {
            List<SchemaViolation> streamed;
            try {
                streamed = SchemaCatalog.get().validateCircuit(f, ReadLimits.DEFAULT);
            } catch (FormatException e) {
                continue;
            }
            List<SchemaViolation> tree;
            try (var in = Files.newInputStream(f)) {
                tree = SchemaCatalog.get().validateCircuit(in, f.toString(), ReadLimits.DEFAULT);
            }
            assertEquals(tree, streamed, f.toString());
        }
    }

    /** One seeded change to a copy of {@code node}: a value replaced, a member dropped or added, an array emptied or nested. */
    private static JsonNode mutate(JsonNode node, Random rnd) {
        if (!(node instanceof ObjectNode o) || o.isEmpty()) {
            return node;
        }
        ObjectNode n = o.deepCopy();
        List<String> names = new ArrayList<>();
        for (Map.Entry<String, JsonNode> e : n.properties()) {
            names.add(e.getKey());
        }
        String name = names.get(rnd.nextInt(names.size()));
        JsonNodeFactory f = JsonNodeFactory.instance;
        JsonNode[] values = {f.numberNode(-1), f.numberNode(0), f.numberNode(0.5), f.numberNode(1.5), f.numberNode(2.0),
            f.numberNode(1e300), f.numberNode(9.1e15), f.numberNode(Long.MAX_VALUE), f.stringNode("normal"),
            f.stringNode("x"), f.booleanNode(true), f.nullNode(), f.arrayNode(), f.objectNode(),
            f.arrayNode().add(1).add(1), f.arrayNode().add(0.5).add(-0.5), f.arrayNode().add(f.arrayNode().add(1))};
        switch (rnd.nextInt(5)) {
            case 0 -> n.remove(name);
            case 1 -> n.set(rnd.nextBoolean() ? "extra" : new String[] {"sum", "product", "input", "weights", "logWeights",
                "var", "vars", "label", "probs", "logProbs"}[rnd.nextInt(10)], values[rnd.nextInt(values.length)]);
            case 2 -> {
                JsonNode v = n.get(name);
                if (v instanceof ArrayNode a && !a.isEmpty()) {
                    a.set(rnd.nextInt(a.size()), values[rnd.nextInt(values.length)]);
                } else {
                    n.set(name, values[rnd.nextInt(values.length)]);
                }
            }
            default -> n.set(name, values[rnd.nextInt(values.length)]);
        }
        return n;
    }
}
