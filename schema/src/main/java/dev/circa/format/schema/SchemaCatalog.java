package dev.circa.format.schema;

import com.networknt.schema.AbsoluteIri;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SchemaRegistryConfig;
import com.networknt.schema.SpecificationVersion;
import com.networknt.schema.path.PathType;
import com.networknt.schema.resource.InputStreamSource;
import com.networknt.schema.resource.ResourceLoader;
import com.networknt.schema.resource.SchemaLoader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import tools.jackson.core.JsonToken;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * The bundled JSON Schemas (draft 2020-12) of the circa documents and validation against them.
 *
 * <p>Only the schemas shipped with circa (and the 2020-12 meta-schema bundled with the schema
 * library) can ever be loaded: a {@code $schema}, {@code $id} or {@code $ref} named by a document
 * is data, never a location to fetch. Instances are immutable and safe to share between threads;
 * {@link #get()} returns a shared one.
 */
public final class SchemaCatalog {
    /** The base of every circa schema {@code $id} (an identifier only; nothing is fetched from it). */
    public static final String ID_BASE = "https://circa.dev/schemas/1/";

    private static final String RESOURCE_DIR = "dev/circa/format/schemas/";
    private static final String META_BASE = "https://json-schema.org/draft/2020-12/";

    /** The document kinds with a schema. */
    public enum Kind {
        /** {@code circa.circuit}. */
        CIRCUIT("circuit.schema.json"),
        /** {@code circa.regions}. */
        REGIONS("regions.schema.json"),
        /** {@code circa.mixture} (JSON or YAML read into the same tree). */
        MIXTURE("mixture.schema.json"),
        /** {@code circa.certificate}. */
        CERTIFICATE("certificate.schema.json");

        private final String fileName;

        Kind(String fileName) {
            this.fileName = fileName;
        }

        /** The schema's resource file name, e.g. {@code circuit.schema.json}. */
        public String fileName() {
            return fileName;
        }

        /** The schema's {@code $id}. */
        public String id() {
            return ID_BASE + fileName;
        }

        /** The kind whose {@code format} value is {@code format}, or {@code null}. */
        public static Kind ofFormat(String format) {
            return switch (format == null ? "" : format) {
                case "circa.circuit" -> CIRCUIT;
                case "circa.regions" -> REGIONS;
                case "circa.mixture" -> MIXTURE;
                case "circa.certificate" -> CERTIFICATE;
                default -> null;
            };
        }
    }

    private static final class Holder {
        static final SchemaCatalog INSTANCE = new SchemaCatalog();
    }

    private final SchemaRegistry registry;
    private final Map<Kind, Schema> schemas = new EnumMap<>(Kind.class);
    private final Schema nodeSchema;
    /**
     * The sub-schemas a node of each kind must satisfy ({@code input-FAMILY}, {@code productNode},
     * {@code sumNode}), keyed by family name, "product" and "sum". Each forbids other members, so a node
     * that satisfies the one its kind names satisfies the whole node schema: checking it alone gives the
     * same verdict at a fraction of the cost (the node schema tries every kind and family in turn).
     */
    private final Map<String, Schema> nodeKindSchemas = new java.util.HashMap<>();
    /** The same definitions compiled for the tree-less first look at each node ({@link NodeShapeCheck}). */
    private final NodeShapeCheck nodeShapes;

    private SchemaCatalog() {
        registry = newRegistry();
        for (Kind k : Kind.values()) {
            Schema s = registry.getSchema(SchemaLocation.of(k.id()));
            s.initializeValidators();
            schemas.put(k, s);
        }
        nodeSchema = registry.getSchema(SchemaLocation.of(Kind.CIRCUIT.id() + "#/$defs/node"));
        nodeSchema.initializeValidators();
        Map<String, String> defs = new java.util.HashMap<>();
        for (dev.circa.format.Family f : dev.circa.format.Family.values()) {
            defs.put(f.jsonName(), "input-" + f.jsonName());
        }
        defs.put("product", "productNode");
        defs.put("sum", "sumNode");
        defs.forEach((kind, def) -> nodeKindSchemas.put(kind, defOf(def)));
        try (InputStream in = open(Kind.CIRCUIT)) {
            nodeShapes = NodeShapeCheck.of(JsonInput.mapperFor(ReadLimits.DEFAULT).readTree(in), defs);
        } catch (java.io.IOException | tools.jackson.core.JacksonException e) {
            throw new IllegalStateException("the bundled schema " + Kind.CIRCUIT.fileName() + " cannot be read", e);
        }
    }

    private Schema defOf(String name) {
        Schema s = registry.getSchema(SchemaLocation.of(Kind.CIRCUIT.id() + "#/$defs/" + name));
        s.initializeValidators();
        return s;
    }

    /** The compiled node rules of the first look (for tests in this package). */
    NodeShapeCheck nodeShapes() {
        return nodeShapes;
    }

    /** The shared catalog (schemas are loaded once, on first use). */
    public static SchemaCatalog get() {
        return Holder.INSTANCE;
    }

    /**
     * A registry that resolves only circa's classpath schemas and the bundled 2020-12 meta-schema;
     * every other address is refused before any attempt to read it.
     */
    static SchemaRegistry newRegistry() {
        ResourceLoader bundled = SchemaCatalog::bundled;
        SchemaLoader loader = SchemaLoader.builder()
                .fetchRemoteResources(false)
                .resourceLoaders(r -> r.values(list -> {
                    list.clear();
                    list.add(bundled);
                }))
                .allow(SchemaCatalog::allowed)
                .build();
        SchemaRegistryConfig config = SchemaRegistryConfig.builder()
                .pathType(PathType.JSON_POINTER)
                .locale(Locale.ROOT)
                .formatAssertionsEnabled(false)
                .build();
        return SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12,
                b -> b.schemaLoader(loader).schemaRegistryConfig(config));
    }

    private static boolean allowed(AbsoluteIri iri) {
        String s = iri.toString();
        return s.startsWith(ID_BASE) || s.startsWith(META_BASE);
    }

    private static InputStreamSource bundled(AbsoluteIri iri) {
        String s = iri.toString();
        if (!s.startsWith(ID_BASE)) {
            return null;
        }
        String name = s.substring(ID_BASE.length());
        for (Kind k : Kind.values()) {
            if (k.fileName().equals(name)) {
                return () -> open(k);
            }
        }
        return null;
    }

    private static InputStream open(Kind kind) {
        InputStream in = SchemaCatalog.class.getClassLoader().getResourceAsStream(RESOURCE_DIR + kind.fileName());
        if (in == null) {
            throw new IllegalStateException("the bundled schema " + kind.fileName() + " is missing from the classpath");
        }
        return in;
    }

    /** The schema text of {@code kind} as shipped (for {@code --help}-style output and tests). */
    public static InputStream openSchema(Kind kind) {
        return open(kind);
    }

    /**
     * Validates a whole document (already parsed into a tree) against the schema of {@code kind}.
     *
     * @return the violations, empty when the document conforms; in document order of the schema checks
     */
    public List<SchemaViolation> validate(Kind kind, JsonNode document) {
        return checked(schemas.get(kind), document, "");
    }

    /**
     * Validates a document against the schema its {@code format} names; a missing or unknown
     * {@code format} is itself a violation at {@code /format}.
     */
    public List<SchemaViolation> validate(JsonNode document) {
        JsonNode f = document == null ? null : document.get("format");
        Kind kind = f != null && f.isString() ? Kind.ofFormat(f.asString()) : null;
        if (kind == null) {
            return List.of(new SchemaViolation("/format", "const",
                    "expected \"format\" to be one of circa.circuit, circa.regions, circa.mixture or circa.certificate"));
        }
        return validate(kind, document);
    }

    /**
     * Validates one element of a circuit's {@code nodes} array against the node sub-schema, so that a
     * large file can be checked one node at a time while streaming.
     *
     * @param node the node object
     * @param pointer the node's pointer in its document (e.g. {@code /nodes/41}), prefixed to every violation
     */
    public List<SchemaViolation> validateNode(JsonNode node, String pointer) {
        String prefix = pointer == null ? "" : pointer;
        List<SchemaViolation> huge = integersBeyondRange(node, prefix);
        if (!huge.isEmpty()) {
            // the schema library compares integer keywords in 64 bits and fails on such numbers; they are
            // reported here, by member, instead
            return huge;
        }
        Schema kind = kindSchema(node);
        if (kind != null && checked(kind, node, prefix).isEmpty()) {
            return List.of();
        }
        // not valid for its kind (or of no single kind): the whole node schema gives the full account
        return checked(nodeSchema, node, prefix);
    }

    /** The sub-schema of the one kind {@code node} names, or {@code null} when it names none or several. */
    private Schema kindSchema(JsonNode node) {
        if (node == null || !node.isObject()) {
            return null;
        }
        JsonNode input = node.get("input");
        boolean product = node.has("product");
        boolean sum = node.has("sum");
        if (input != null) {
            return product || sum || !input.isString() ? null : nodeKindSchemas.get(input.asString());
        }
        if (product == sum) {
            return null;
        }
        return nodeKindSchemas.get(product ? "product" : "sum");
    }

    /** Numbers beyond 2^53 in magnitude are not integers a double holds exactly (nor, past 2^63, a long). */
    private static final double LARGEST_EXACT_INTEGER = 9.007199254740992E15;

    /**
     * The members of a node whose integer parameters ({@code trials}, {@code value}) lie beyond the
     * integers a double holds exactly, each as a violation naming the member.
     */
    private static List<SchemaViolation> integersBeyondRange(JsonNode node, String prefix) {
        List<SchemaViolation> out = new ArrayList<>();
        if (node == null || !node.isObject()) {
            return out;
        }
        for (String member : new String[] {"trials", "value"}) {
            JsonNode v = node.get(member);
            if (v != null && v.isNumber() && Math.abs(v.asDouble()) > LARGEST_EXACT_INTEGER) {
                out.add(new SchemaViolation(prefix + "/" + member, "maximum", String.format(Locale.ROOT,
                        "%s is %s, beyond the integers a double holds exactly; expected an integer from %s to %.0f",
                        member, v.toString(), member.equals("trials") ? "0" : "0 (a state index)", LARGEST_EXACT_INTEGER)));
            }
        }
        return out;
    }

    /** Opens a document again from its start. */
    @FunctionalInterface
    private interface Reopen {
        JsonInput open() throws FormatException;
    }

    /**
     * Validates a circuit file against the circuit schema, streaming, without a tree per node: each
     * node is first summarised from the token stream and checked against the sub-schema of its kind
     * ({@link NodeShapeCheck}); only the nodes that check cannot vouch for (in practice, those with a
     * violation) are read again as trees, in a second pass, and judged by the schema library against
     * the node schema; the rest of the document is checked as a whole. The verdict and the violations
     * are those of {@link #validate(Kind, JsonNode)} on the whole tree.
     *
     * @param path the file ({@code .gz} decompressed, {@code -} for standard input)
     * @return document-level violations first, then each node's in node order
     * @throws FormatException when the file is not JSON or a read limit is hit
     */
    public List<SchemaViolation> validateCircuit(Path path, ReadLimits limits) throws FormatException {
        return validateCircuit(() -> JsonInput.openJson(path, limits), limits);
    }

    /** As {@link #validateCircuit(Path, ReadLimits)}, reading the document through {@code reopen} (once, or twice when a node needs a tree). */
    private List<SchemaViolation> validateCircuit(Reopen reopen, ReadLimits limits) throws FormatException {
        try (JsonInput json = reopen.open()) {
            return validateCircuit(json, limits, reopen);
        }
    }

    /**
     * As {@link #validateCircuit(Path, ReadLimits)}, from a stream that can be read once; {@code file} names
     * it in messages. Each node is read as a tree and judged by the schema library.
     */
    public List<SchemaViolation> validateCircuit(InputStream in, String file, ReadLimits limits) throws FormatException {
        try (JsonInput json = JsonInput.fromStream(in, file, limits)) {
            return validateCircuit(json, limits, null);
        }
    }

    private List<SchemaViolation> validateCircuit(JsonInput json, ReadLimits limits, Reopen reopen) throws FormatException {
        List<SchemaViolation> nodeViolations = new ArrayList<>();
        ObjectNode skeleton = JsonNodeFactory.instance.objectNode();
        NodeShapeCheck shapes = nodeShapes.fresh();
        java.util.BitSet doubtful = new java.util.BitSet();
        json.startDocument("a circuit document");
        String member;
        while ((member = json.nextProperty()) != null) {
            if (member.equals("nodes") && json.token() == JsonToken.START_ARRAY) {
                int count = 0;
                while (json.nextElement()) {
                    if (count >= limits.maxNodes()) {
                        throw LimitExceededException.of(json.file(), json.line(), json.column(), "/nodes/" + count,
                                "the number of nodes", ReadLimits.MAX_NODES, limits.maxNodes());
                    }
                    if (reopen == null) {
                        nodeViolations.addAll(validateNode(json.readTree(), "/nodes/" + count));
                    } else if (!shapes.conforms(json)) {
                        doubtful.set(count);
                    }
                    count++;
                }
                // The nodes were checked one by one; a valid stand-in keeps the array's own rules (minItems) in play.
                ArrayNode stand = skeleton.putArray("nodes");
                if (count > 0) {
                    stand.addObject().put("id", 0).putArray("product").add(0);
                }
            } else {
                skeleton.set(member, json.readTree());
            }
        }
        json.endDocument();
        if (!doubtful.isEmpty()) {
            nodeViolations.addAll(judgeNodes(reopen, doubtful));
        }
        List<SchemaViolation> out = new ArrayList<>(validate(Kind.CIRCUIT, skeleton));
        out.addAll(nodeViolations);
        return out;
    }

    /** The second pass: reads the nodes of {@code which} as trees and judges them with the schema library. */
    private List<SchemaViolation> judgeNodes(Reopen reopen, java.util.BitSet which) throws FormatException {
        List<SchemaViolation> out = new ArrayList<>();
        try (JsonInput json = reopen.open()) {
            json.startDocument("a circuit document");
            String member;
            while ((member = json.nextProperty()) != null) {
                if (!member.equals("nodes") || json.token() != JsonToken.START_ARRAY) {
                    json.skipValue();
                    continue;
                }
                int count = 0;
                while (json.nextElement()) {
                    if (which.get(count)) {
                        out.addAll(validateNode(json.readTree(), "/nodes/" + count));
                    } else {
                        json.skipValue();
                    }
                    count++;
                }
            }
        }
        return out;
    }

    /**
     * Runs {@code schema} on {@code node}; a number the schema library cannot judge (an integral
     * value beyond the 64-bit range, such as 1e19 where an integer is expected) becomes a violation
     * at that number instead of an error of the library.
     */
    private static List<SchemaViolation> checked(Schema schema, JsonNode node, String prefix) {
        try {
            return convert(schema.validate(node), prefix);
        } catch (RuntimeException e) {
            List<SchemaViolation> out = new ArrayList<>();
            java.util.ArrayDeque<Map.Entry<String, JsonNode>> todo = new java.util.ArrayDeque<>();
            todo.push(Map.entry("", node));
            while (!todo.isEmpty()) {
                Map.Entry<String, JsonNode> at = todo.pop();
                JsonNode n = at.getValue();
                if (n.isNumber() && !n.canConvertToLong() && (n.isIntegralNumber() || isWhole(n.doubleValue()))) {
                    out.add(new SchemaViolation(prefix + at.getKey(), "type", "the number " + n.toString()
                            + " is beyond the range of 64-bit integers; expected a value from -9223372036854775808 to"
                            + " 9223372036854775807 where an integer is expected"));
                } else if (n.isObject()) {
                    for (Map.Entry<String, JsonNode> m : n.properties()) {
                        todo.push(Map.entry(at.getKey() + "/" + escape(m.getKey()), m.getValue()));
                    }
                } else if (n.isArray()) {
                    for (int i = n.size() - 1; i >= 0; i--) {
                        todo.push(Map.entry(at.getKey() + "/" + i, n.get(i)));
                    }
                }
            }
            if (out.isEmpty()) {
                out.add(new SchemaViolation(prefix, "type", "a value here cannot be checked against the schema"));
            }
            return out;
        }
    }

    private static boolean isWhole(double d) {
        return Double.isFinite(d) && d == Math.rint(d);
    }

    private static List<SchemaViolation> convert(List<com.networknt.schema.Error> errors, String prefix) {
        List<SchemaViolation> out = new ArrayList<>(errors.size());
        for (com.networknt.schema.Error e : errors) {
            String at = e.getInstanceLocation() == null ? "" : e.getInstanceLocation().toString();
            if ("/".equals(at) || "$".equals(at)) {
                at = "";
            }
            String keyword = e.getKeyword();
            if (("additionalProperties".equals(keyword) || "unevaluatedProperties".equals(keyword))
                    && e.getProperty() != null) {
                at = at + "/" + escape(e.getProperty());
            }
            out.add(new SchemaViolation(prefix + at, keyword, e.getMessage()));
        }
        return out;
    }

    private static String escape(String token) {
        return token.replace("~", "~0").replace("/", "~1");
    }
}
