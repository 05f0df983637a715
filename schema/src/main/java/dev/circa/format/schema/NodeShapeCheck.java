package dev.circa.format.schema;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonInput;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.databind.JsonNode;

/**
 * A one-sided conformance test of a circuit node against the sub-schema of its kind, read straight
 * from the token stream with no tree: it answers "conforms" only when it is sure, and "not sure"
 * otherwise (a violation, or anything it does not model), so that the node is then judged by the
 * schema library as before. The rules are compiled from the bundled circuit schema itself (the
 * {@code input-FAMILY}, {@code productNode} and {@code sumNode} definitions); a definition using a
 * keyword outside the small set modelled here (type, minimum, maximum, exclusive bounds, minItems,
 * maxItems, items, uniqueItems, enum, const, required, properties, {@code additionalProperties: false},
 * a {@code oneOf} of {@code required} lists, local {@code $ref}) is never answered "conforms".
 *
 * <p>Each member is summarised as it streams by (its type; for a number its value; for an array its
 * length, element types, least and greatest element, the same for rows of an array of arrays), and
 * the kind's rule is applied to the summaries when the node closes. Numbers are compared as doubles,
 * as the schema library compares the tree's numbers; an integer beyond 2^53 or a fractional token
 * where an integer is expected is "not sure". Not thread-safe: one instance per pass.
 */
final class NodeShapeCheck {
    private static final int STRING = 1;
    private static final int INT = 2;
    private static final int FLOAT = 4;
    private static final int OTHER = 8;
    private static final int ARRAY = 16;
    private static final int NUMBER = INT | FLOAT;
    private static final double EXACT = 9.007199254740992E15;
    /** Members per node and distinct values per array followed; beyond them the answer is "not sure". */
    private static final int MAX_MEMBERS = 16;
    private static final int MAX_UNIQUE = 64;

    /** A compiled property schema; {@code null} fields are absent keywords. */
    private static final class Prop {
        String type;
        Double minimum;
        Double maximum;
        Double exclusiveMinimum;
        Double exclusiveMaximum;
        Integer minItems;
        Integer maxItems;
        boolean unique;
        List<String> strings;
        Prop items;
    }

    /** A compiled kind schema. */
    private static final class Kind {
        final Map<String, Prop> props = new HashMap<>();
        final List<String> required = new ArrayList<>();
        final List<List<String>> oneOfRequired = new ArrayList<>();
    }

    /** The summary of one member's value. */
    private static final class Shape {
        String name;
        int type;
        String text;
        double value;
        boolean exact;
        int count;
        int elements;
        double min;
        double max;
        boolean allExact;
        int rowMin;
        int rowElements;
        double rowLow;
        double rowHigh;
        final double[] seen = new double[MAX_UNIQUE];
        boolean duplicate;

        void reset(String n) {
            name = n;
            type = 0;
            text = null;
            count = 0;
            elements = 0;
            min = Double.POSITIVE_INFINITY;
            max = Double.NEGATIVE_INFINITY;
            allExact = true;
            rowMin = Integer.MAX_VALUE;
            rowElements = 0;
            rowLow = Double.POSITIVE_INFINITY;
            rowHigh = Double.NEGATIVE_INFINITY;
            duplicate = false;
        }
    }

    private final Map<String, Kind> kinds;
    private final Shape[] shapes = new Shape[MAX_MEMBERS];
    private int members;

    private NodeShapeCheck(Map<String, Kind> kinds) {
        this.kinds = kinds;
        for (int i = 0; i < MAX_MEMBERS; i++) {
            shapes[i] = new Shape();
        }
    }

    /** A checker with the same compiled rules and its own state (one per pass). */
    NodeShapeCheck fresh() {
        return new NodeShapeCheck(kinds);
    }

    /** A checker for the node definitions of {@code circuitSchema} (keyed like {@code SchemaCatalog}'s kind schemas). */
    static NodeShapeCheck of(JsonNode circuitSchema, Map<String, String> defsByKind) {
        JsonNode defs = circuitSchema.get("$defs");
        Map<String, Kind> kinds = new HashMap<>();
        for (Map.Entry<String, String> e : defsByKind.entrySet()) {
            Kind k = compileKind(defs, defs.get(e.getValue()));
            if (k != null) {
                kinds.put(e.getKey(), k);
            }
        }
        return new NodeShapeCheck(kinds);
    }

    private static Kind compileKind(JsonNode defs, JsonNode s) {
        if (s == null || !s.isObject()) {
            return null;
        }
        Kind k = new Kind();
        for (Map.Entry<String, JsonNode> m : s.properties()) {
            JsonNode v = m.getValue();
            switch (m.getKey()) {
                case "type" -> {
                    if (!"object".equals(v.asString())) {
                        return null;
                    }
                }
                case "description", "title" -> {
                }
                case "additionalProperties" -> {
                    if (!v.isBoolean() || v.asBoolean()) {
                        return null;
                    }
                }
                case "required" -> {
                    for (JsonNode r : v) {
                        k.required.add(r.asString());
                    }
                }
                case "properties" -> {
                    for (Map.Entry<String, JsonNode> p : v.properties()) {
                        Prop prop = compileProp(defs, p.getValue(), 0);
                        if (prop == null) {
                            return null;
                        }
                        k.props.put(p.getKey(), prop);
                    }
                }
                case "oneOf" -> {
                    for (JsonNode branch : v) {
                        if (branch.size() != 1 || !branch.has("required")) {
                            return null;
                        }
                        List<String> req = new ArrayList<>();
                        for (JsonNode r : branch.get("required")) {
                            req.add(r.asString());
                        }
                        k.oneOfRequired.add(req);
                    }
                }
                default -> {
                    return null;
                }
            }
        }
        // additionalProperties false must be present: members outside "properties" are then violations
        return s.has("additionalProperties") ? k : null;
    }

    private static Prop compileProp(JsonNode defs, JsonNode s, int depth) {
        if (depth > 4 || s == null || !s.isObject()) {
            return null;
        }
        if (s.has("$ref")) {
            String ref = s.get("$ref").asString();
            for (Map.Entry<String, JsonNode> m : s.properties()) {
                if (!m.getKey().equals("$ref") && !m.getKey().equals("description")) {
                    return null;
                }
            }
            return ref.startsWith("#/$defs/") ? compileProp(defs, defs.get(ref.substring(8)), depth + 1) : null;
        }
        Prop p = new Prop();
        for (Map.Entry<String, JsonNode> m : s.properties()) {
            JsonNode v = m.getValue();
            switch (m.getKey()) {
                case "type" -> {
                    p.type = v.isString() ? v.asString() : null;
                    if (p.type == null || !List.of("integer", "number", "string", "array").contains(p.type)) {
                        return null;
                    }
                }
                case "minimum" -> p.minimum = number(v);
                case "maximum" -> p.maximum = number(v);
                case "exclusiveMinimum" -> p.exclusiveMinimum = number(v);
                case "exclusiveMaximum" -> p.exclusiveMaximum = number(v);
                case "minItems" -> p.minItems = v.asInt();
                case "maxItems" -> p.maxItems = v.asInt();
                case "uniqueItems" -> p.unique = v.asBoolean();
                case "enum", "const" -> {
                    p.strings = new ArrayList<>();
                    for (JsonNode x : v.isArray() ? v : List.of(v)) {
                        if (!x.isString()) {
                            return null;
                        }
                        p.strings.add(x.asString());
                    }
                }
                case "items" -> {
                    p.items = compileProp(defs, v, depth + 1);
                    if (p.items == null) {
                        return null;
                    }
                }
                case "description", "title" -> {
                }
                default -> {
                    return null;
                }
            }
        }
        if ((p.minimum != null && p.minimum.isNaN()) || (p.maximum != null && p.maximum.isNaN())
                || (p.exclusiveMinimum != null && p.exclusiveMinimum.isNaN())
                || (p.exclusiveMaximum != null && p.exclusiveMaximum.isNaN())) {
            return null;
        }
        return p;
    }

    private static Double number(JsonNode v) {
        return v.isNumber() ? v.asDouble() : Double.NaN;
    }

    /**
     * Reads the node the parser is on (its start, an object) to its end and says whether it surely
     * conforms to the sub-schema of its kind. On return the parser is on the node's last token.
     */
    boolean conforms(JsonInput in) throws FormatException {
        if (in.token() != JsonToken.START_OBJECT) {
            in.skipValue();
            return false;
        }
        members = 0;
        boolean sure = true;
        JsonToken t;
        while ((t = in.next()) == JsonToken.PROPERTY_NAME) {
            String name = in.name();
            in.next();
            if (members == MAX_MEMBERS) {
                in.skipValue();
                sure = false;
                continue;
            }
            Shape s = shapes[members++];
            s.reset(name);
            sure &= read(in, s);
        }
        return sure && t == JsonToken.END_OBJECT && judge();
    }

    /** Summarises the current value into {@code s}; false when it holds something not modelled. */
    private boolean read(JsonInput in, Shape s) throws FormatException {
        JsonToken t = in.token();
        if (t != JsonToken.START_ARRAY) {
            s.type = scalar(in, t);
            if (s.type == STRING) {
                s.text = in.stringOrNull();
            } else if ((s.type & NUMBER) != 0) {
                s.value = value(in);
                s.exact = s.type == INT && Math.abs(s.value) <= EXACT;
            } else if (t == JsonToken.START_OBJECT) {
                in.skipValue();
            }
            return true;
        }
        s.type = ARRAY;
        while ((t = in.next()) != JsonToken.END_ARRAY) {
            if (t == null) {
                return false;
            }
            s.count++;
            if (t == JsonToken.START_ARRAY) {
                s.elements |= ARRAY;
                int n = 0;
                while ((t = in.next()) != JsonToken.END_ARRAY) {
                    if (t == null) {
                        return false;
                    }
                    n++;
                    int k = scalar(in, t);
                    s.rowElements |= k;
                    if ((k & NUMBER) != 0) {
                        double v = value(in);
                        s.rowLow = Math.min(s.rowLow, v);
                        s.rowHigh = Math.max(s.rowHigh, v);
                    } else if (t == JsonToken.START_OBJECT || t == JsonToken.START_ARRAY) {
                        s.rowElements |= OTHER;
                        in.skipValue();
                    }
                }
                s.rowMin = Math.min(s.rowMin, n);
                continue;
            }
            int k = scalar(in, t);
            s.elements |= k;
            if ((k & NUMBER) != 0) {
                double v = value(in);
                s.min = Math.min(s.min, v);
                s.max = Math.max(s.max, v);
                s.allExact &= k == INT && Math.abs(v) <= EXACT;
                if (s.count <= MAX_UNIQUE) {
                    for (int j = 0; j < s.count - 1 && !s.duplicate; j++) {
                        s.duplicate = s.seen[j] == v;
                    }
                    s.seen[s.count - 1] = v;
                }
            } else if (t == JsonToken.START_OBJECT) {
                in.skipValue();
            }
        }
        return true;
    }

    private static int scalar(JsonInput in, JsonToken t) {
        return switch (t) {
            case VALUE_STRING -> STRING;
            case VALUE_NUMBER_INT -> in.parser().getNumberType() == JsonParser.NumberType.BIG_INTEGER ? OTHER : INT;
            case VALUE_NUMBER_FLOAT -> FLOAT;
            default -> OTHER;
        };
    }

    private static double value(JsonInput in) throws FormatException {
        double v = in.finiteOrNaN();
        return Double.isNaN(v) ? Double.POSITIVE_INFINITY : v;
    }

    /** Applies the rule of the node's kind to the summaries. */
    private boolean judge() {
        Shape input = find("input");
        Shape product = find("product");
        Shape sum = find("sum");
        Kind k;
        if (input != null) {
            k = product != null || sum != null || input.type != STRING ? null : kinds.get(input.text);
        } else if ((product == null) == (sum == null)) {
            k = null;
        } else {
            k = kinds.get(product != null ? "product" : "sum");
        }
        if (k == null) {
            return false;
        }
        for (String r : k.required) {
            if (find(r) == null) {
                return false;
            }
        }
        if (!k.oneOfRequired.isEmpty()) {
            int held = 0;
            for (List<String> branch : k.oneOfRequired) {
                boolean all = true;
                for (String r : branch) {
                    all &= find(r) != null;
                }
                held += all ? 1 : 0;
            }
            if (held != 1) {
                return false;
            }
        }
        for (int i = 0; i < members; i++) {
            Prop p = k.props.get(shapes[i].name);
            if (p == null || !fits(p, shapes[i])) {
                return false;
            }
        }
        return true;
    }

    private Shape find(String name) {
        for (int i = 0; i < members; i++) {
            if (shapes[i].name.equals(name)) {
                return shapes[i];
            }
        }
        return null;
    }

    private static boolean fits(Prop p, Shape s) {
        if (s.type == ARRAY) {
            if (p.type == null || !p.type.equals("array") || p.strings != null) {
                return false;
            }
            if ((p.minItems != null && s.count < p.minItems) || (p.maxItems != null && s.count > p.maxItems)) {
                return false;
            }
            if (s.count == 0) {
                return true;
            }
            Prop it = p.items;
            if (it == null) {
                return false;
            }
            if (p.unique && (s.count > MAX_UNIQUE || s.duplicate || s.elements != INT && s.elements != NUMBER
                    && s.elements != FLOAT)) {
                return false;
            }
            if (s.elements == ARRAY) {
                return rows(it, s);
            }
            return (s.elements & ~NUMBER) == 0 && numbers(it, s.elements, s.allExact, s.min, s.max);
        }
        if (s.type == STRING) {
            // a string fits "type": "string" and an enum of strings (numeric keywords do not apply to it)
            return (p.type == null ? p.strings != null : p.type.equals("string")) && p.items == null
                    && (p.strings == null || p.strings.contains(s.text));
        }
        return (s.type & NUMBER) != 0 && p.type != null && numbers(p, s.type, s.exact, s.value, s.value);
    }

    /** Whether numbers of token kinds {@code elements} in [{@code min}, {@code max}] fit {@code p}. */
    private static boolean numbers(Prop p, int elements, boolean exact, double min, double max) {
        if (p.type == null || p.strings != null || p.items != null || p.minItems != null || p.maxItems != null || p.unique) {
            return false;
        }
        if (p.type.equals("integer")) {
            if (elements != INT || !exact) {
                return false;
            }
        } else if (!p.type.equals("number") || Double.isInfinite(min) || Double.isInfinite(max)) {
            return false;
        }
        return (p.minimum == null || min >= p.minimum) && (p.maximum == null || max <= p.maximum)
                && (p.exclusiveMinimum == null || min > p.exclusiveMinimum)
                && (p.exclusiveMaximum == null || max < p.exclusiveMaximum);
    }

    /** Whether the rows of an array of arrays fit {@code it}, the schema of each row. */
    private static boolean rows(Prop it, Shape s) {
        if (it.type == null || !it.type.equals("array") || it.unique || it.strings != null || it.items == null) {
            return false;
        }
        if ((it.minItems != null && s.rowMin < it.minItems) || (it.maxItems != null)) {
            return false;
        }
        if (s.rowElements == 0) {
            return true;
        }
        return (s.rowElements & ~NUMBER) == 0 && it.items.type != null && it.items.type.equals("number")
                && numbers(it.items, s.rowElements, false, s.rowLow, s.rowHigh);
    }
}
