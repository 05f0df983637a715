package dev.circa.format.schema;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog.Kind;
import java.io.IOException;
import java.io.InputStream;
import java.net.InetSocketAddress;
import java.nio.channels.ServerSocketChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

class SchemaCatalogTest {
    private static final Path CORPUS = Path.of("..", "fixtures", "schema-corpus");
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    private static final String META_SCHEMA = "https://json-schema.org/draft/2020-12/schema";
    private static final ObjectMapper MAPPER = JsonMapper.builder().build();

    private static JsonNode tree(Path p) throws IOException {
        return MAPPER.readTree(Files.readString(p, StandardCharsets.UTF_8));
    }

    private static JsonNode bundled(Kind k) throws IOException {
        try (InputStream in = SchemaCatalog.openSchema(k)) {
            return MAPPER.readTree(in);
        }
    }

    @Test
    void metaSchema_everyBundledSchema_conforms() throws Exception {
        // Source: the official JSON Schema draft 2020-12 meta-schema, as bundled in networknt json-schema-validator 3.0.9.
        Schema meta = SchemaCatalog.newRegistry().getSchema(SchemaLocation.of(META_SCHEMA));
        for (Kind k : Kind.values()) {
            JsonNode schema = bundled(k);
            assertEquals(List.of(), meta.validate(schema), k.fileName());
            assertEquals(k.id(), schema.get("$id").asString());
            assertEquals(META_SCHEMA, schema.get("$schema").asString());
        }
    }

    @Test
    void metaSchema_malformedSchema_rejected() throws Exception {
        // Control for the test above: the same meta-schema must reject a schema whose "type" is a number.
        Schema meta = SchemaCatalog.newRegistry().getSchema(SchemaLocation.of(META_SCHEMA));
        ObjectNode broken = (ObjectNode) bundled(Kind.CIRCUIT);
        broken.put("type", 5);
        assertFalse(meta.validate(broken).isEmpty());
    }

    @Test
    void circuitSchema_description_explainsNewerMinorVersions() throws Exception {
        // FORMAT.md: unknown properties in a newer minor version are a warning; the schema describes 1.0 only.
        for (Kind k : Kind.values()) {
            String d = bundled(k).get("description").asString();
            assertTrue(d.contains("version 1.0") && d.contains("newer minor"), k + ": " + d);
        }
    }

    @Test
    void bundledSchemas_families_matchFamilyEnumAndParameters() throws Exception {
        // FORMAT.md section 2, input table: every family and its parameter names, in the schemas and in the model.
        JsonNode circuit = bundled(Kind.CIRCUIT).get("$defs");
        JsonNode mixture = bundled(Kind.MIXTURE).get("$defs");
        List<String> names = new ArrayList<>();
        circuit.get("family").get("enum").forEach(n -> names.add(n.asString()));
        List<String> expected = new ArrayList<>();
        for (dev.circa.format.Family f : dev.circa.format.Family.values()) {
            expected.add(f.jsonName());
            JsonNode props = circuit.get("input-" + f.jsonName()).get("properties");
            assertNotNull(props, f.jsonName());
            for (String param : f.parameters()) {
                assertNotNull(props.get(param), f.jsonName() + "." + param + " in circuit.schema.json");
            }
            JsonNode mix = mixture.get("params-" + f.jsonName());
            assertNotNull(mix, f.jsonName() + " in mixture.schema.json");
            if (f.isScalar() || f == dev.circa.format.Family.MVNORMAL) {
                for (String param : f.parameters()) {
                    assertNotNull(mix.get("properties").get(param), f.jsonName() + "." + param + " in mixture.schema.json");
                }
            }
        }
        assertEquals(expected, names);
    }

    @Test
    void validate_formatExample_noViolations() throws Exception {
        assertEquals(List.of(), SchemaCatalog.get().validate(Kind.CIRCUIT, tree(EXAMPLE)));
        assertEquals(List.of(), SchemaCatalog.get().validate(tree(EXAMPLE)));
    }

    @Test
    void validate_validCorpus_noViolations() throws Exception {
        int n = 0;
        for (Kind k : Kind.values()) {
            for (Path p : files(k, "valid")) {
                assertEquals(List.of(), SchemaCatalog.get().validate(k, tree(p)), p.toString());
                assertEquals(List.of(), SchemaCatalog.get().validate(tree(p)), p.toString());
                n++;
            }
        }
        assertTrue(n >= 8, "valid corpus has " + n + " documents");
    }

    /**
     * Each invalid document breaks one rule of FORMAT.md; the keyword expected is the one of JSON Schema
     * 2020-12 (draft-bhutton-json-schema-01 and draft-bhutton-json-schema-validation-01) that states that rule.
     */
    @Test
    void validate_invalidCorpus_expectedViolationAtExpectedPointer() throws Exception {
        Map<String, String[]> expected = expectations();
        int circuitCases = 0;
        for (Kind k : Kind.values()) {
            for (Path p : files(k, "invalid")) {
                String rel = CORPUS.relativize(p).toString().replace('\\', '/');
                String[] want = expected.remove(rel);
                assertNotNull(want, rel + " has no line in expected-violations.tsv");
                List<SchemaViolation> got = SchemaCatalog.get().validate(k, tree(p));
                assertTrue(got.stream().anyMatch(v -> v.pointer().equals(want[0]) && v.keyword().equals(want[1])),
                        rel + ": expected " + want[1] + " at '" + want[0] + "', got " + got);
                if (k == Kind.CIRCUIT) {
                    circuitCases++;
                }
            }
        }
        assertEquals(Map.of(), expected, "expectations without a file");
        assertTrue(circuitCases >= 10, "invalid circuit cases: " + circuitCases);
    }

    @Test
    void validate_invalidCorpus_everyViolationNearTheOneBreak() throws Exception {
        // Each invalid document breaks one thing: every violation must lie on the path to it or below it.
        for (Map.Entry<String, String[]> e : expectations().entrySet()) {
            Path p = CORPUS.resolve(e.getKey());
            Kind k = Kind.valueOf(e.getKey().substring(0, e.getKey().indexOf('/')).toUpperCase(java.util.Locale.ROOT));
            String want = e.getValue()[0];
            for (SchemaViolation v : SchemaCatalog.get().validate(k, tree(p))) {
                boolean related = want.startsWith(v.pointer()) || v.pointer().startsWith(want)
                        || v.pointer().startsWith(parent(want));
                assertTrue(related, e.getKey() + ": unrelated violation " + v);
            }
        }
    }

    @Test
    void validateNode_eachCorpusNode_agreesWithWholeDocument() throws Exception {
        List<Path> all = new ArrayList<>(files(Kind.CIRCUIT, "valid"));
        all.addAll(files(Kind.CIRCUIT, "invalid"));
        all.add(EXAMPLE);
        for (Path p : all) {
            JsonNode doc = tree(p);
            List<SchemaViolation> whole = new ArrayList<>();
            for (SchemaViolation v : SchemaCatalog.get().validate(Kind.CIRCUIT, doc)) {
                if (v.pointer().startsWith("/nodes/")) {
                    whole.add(v);
                }
            }
            List<SchemaViolation> perNode = new ArrayList<>();
            JsonNode nodes = doc.get("nodes");
            if (nodes != null && nodes.isArray()) {
                for (int i = 0; i < nodes.size(); i++) {
                    perNode.addAll(SchemaCatalog.get().validateNode(nodes.get(i), "/nodes/" + i));
                }
            }
            assertEquals(whole, perNode, p.toString());
        }
    }

    @Test
    void validateCircuit_streamingOverCorpus_sameViolationsAsWholeTree() throws Exception {
        List<Path> all = new ArrayList<>(files(Kind.CIRCUIT, "valid"));
        all.addAll(files(Kind.CIRCUIT, "invalid"));
        all.add(EXAMPLE);
        for (Path p : all) {
            List<String> whole = sorted(SchemaCatalog.get().validate(Kind.CIRCUIT, tree(p)));
            List<String> streamed = sorted(SchemaCatalog.get().validateCircuit(p, ReadLimits.DEFAULT));
            assertEquals(whole, streamed, p.toString());
        }
    }

    @Test
    void validateCircuit_tooManyNodes_limitNamed() {
        LimitExceededException e = assertThrows(LimitExceededException.class,
                () -> SchemaCatalog.get().validateCircuit(EXAMPLE, ReadLimits.DEFAULT.withMaxNodes(2)));
        assertEquals(ReadLimits.MAX_NODES, e.option());
        assertEquals(12, e.line());
    }

    @Test
    void validateCircuit_notJson_formatExceptionWithPosition() {
        FormatException e = assertThrows(FormatException.class, () -> SchemaCatalog.get().validateCircuit(
                new java.io.ByteArrayInputStream("{\"nodes\": [1, 2,]}".getBytes(StandardCharsets.UTF_8)), "bad.json",
                ReadLimits.DEFAULT));
        assertTrue(e.getMessage().startsWith("bad.json:1:"), e.getMessage());
    }

    private static List<String> sorted(List<SchemaViolation> v) {
        return v.stream().map(SchemaViolation::toString).sorted().toList();
    }

    @Test
    void validateNode_negativeSd_pointerPrefixed() throws Exception {
        JsonNode node = MAPPER.readTree("{\"id\": 3, \"input\": \"normal\", \"var\": 0, \"mean\": 2.2, \"sd\": -0.5}");
        List<SchemaViolation> v = SchemaCatalog.get().validateNode(node, "/nodes/41");
        assertEquals(1, v.size(), v.toString());
        assertEquals("/nodes/41/sd", v.get(0).pointer());
        assertEquals("exclusiveMinimum", v.get(0).keyword());
    }

    @Test
    void validate_unknownFormat_violationAtFormat() throws Exception {
        List<SchemaViolation> v = SchemaCatalog.get().validate(MAPPER.readTree("{\"format\": \"circa.other\"}"));
        assertEquals("/format", v.get(0).pointer());
    }

    @Test
    void validate_documentNamingHttpSchemaAndRef_nothingFetched() throws Exception {
        try (ServerSocketChannel server = ServerSocketChannel.open()) {
            server.bind(new InetSocketAddress("127.0.0.1", 0));
            server.configureBlocking(false);
            String url = "http://127.0.0.1:" + server.socket().getLocalPort() + "/circuit.schema.json";
            ObjectNode doc = (ObjectNode) tree(EXAMPLE);
            doc.put("$schema", url);
            doc.put("$id", url);
            ((ObjectNode) doc.get("nodes").get(0)).put("$ref", url + "#/$defs/node");
            List<SchemaViolation> v = SchemaCatalog.get().validate(doc);
            assertTrue(v.stream().anyMatch(x -> x.pointer().equals("/$schema")), v.toString());
            assertTrue(v.stream().anyMatch(x -> x.pointer().equals("/nodes/0/$ref")), v.toString());
            assertEquals(null, server.accept(), "the validator connected to the address a document named");
        }
    }

    @Test
    void registry_schemaAtHttpAddress_refusedWithoutConnecting() throws Exception {
        try (ServerSocketChannel server = ServerSocketChannel.open()) {
            server.bind(new InetSocketAddress("127.0.0.1", 0));
            server.configureBlocking(false);
            SchemaRegistry registry = SchemaCatalog.newRegistry();
            String url = "http://127.0.0.1:" + server.socket().getLocalPort() + "/evil.schema.json";
            assertThrows(RuntimeException.class, () -> registry.getSchema(SchemaLocation.of(url)).initializeValidators());
            String ref = "{\"$schema\": \"" + META_SCHEMA + "\", \"$ref\": \"" + url + "\"}";
            assertThrows(RuntimeException.class, () -> {
                Schema s = registry.getSchema(MAPPER.readTree(ref));
                s.initializeValidators();
                s.validate(MAPPER.readTree("{}"));
            });
            assertEquals(null, server.accept(), "the registry connected to an address outside the bundle");
        }
    }

    private static String parent(String pointer) {
        int i = pointer.lastIndexOf('/');
        return i <= 0 ? "" : pointer.substring(0, i);
    }

    private static List<Path> files(Kind k, String verdict) throws IOException {
        Path dir = CORPUS.resolve(k.name().toLowerCase(java.util.Locale.ROOT)).resolve(verdict);
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(p -> p.toString().endsWith(".json")).sorted().toList();
        }
    }

    private static Map<String, String[]> expectations() throws IOException {
        Map<String, String[]> m = new TreeMap<>();
        for (String line : Files.readAllLines(CORPUS.resolve("expected-violations.tsv"), StandardCharsets.UTF_8)) {
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            String[] f = line.split("\t", -1);
            m.put(f[0], new String[] {f[1], f[2]});
        }
        return m;
    }

    @Test
    void validateCircuit_integerParametersBeyondDoubleIntegers_violationNamesTheMember() throws FormatException {
        for (String v : new String[] {"1e19", "1e300", "-1e300", "-1e19"}) {
            String doc = "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [{\"name\": \"c\","
                    + " \"type\": \"count\"}, {\"name\": \"b\", \"type\": \"binary\"}], \"nodes\": ["
                    + "{\"id\": 0, \"input\": \"binomial\", \"var\": 0, \"trials\": " + v + ", \"p\": 0.5},"
                    + "{\"id\": 1, \"input\": \"indicator\", \"var\": 1, \"value\": " + v + "},"
                    + "{\"id\": 2, \"product\": [0, 1]}], \"outputs\": [{\"name\": \"joint\", \"node\": 2}]}";
            List<SchemaViolation> found = SchemaCatalog.get().validateCircuit(
                    new java.io.ByteArrayInputStream(doc.getBytes(StandardCharsets.UTF_8)), "big.json", ReadLimits.DEFAULT);
            List<String> pointers = found.stream().map(SchemaViolation::pointer).toList();
            assertTrue(pointers.contains("/nodes/0/trials") && pointers.contains("/nodes/1/value"), v + ": " + found);
            assertTrue(found.get(0).message().contains("beyond the integers a double holds exactly"), found.toString());
        }
    }
}
