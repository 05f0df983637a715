package dev.circa.validator.render;

import dev.circa.format.io.FormatException;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationOutcome;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.VariableTree;
import dev.circa.validator.Verdict;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.List;
import java.util.Map;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;
import tools.jackson.databind.util.RawValue;

/** The JSON form of validation reports (CLI.md's fields; an array when there are several). */
public final class JsonReport {
    private static final ObjectMapper MAPPER = JsonMapper.builder().build();
    private static final JsonNodeFactory F = JsonNodeFactory.instance;

    private JsonReport() {
    }

    /** One object per file (a lone object for one file): its report, or its status-2 entry. */
    public static String render(List<ValidationOutcome> outcomes) {
        JsonNode out;
        if (outcomes.size() == 1) {
            out = tree(outcomes.get(0));
        } else {
            ArrayNode a = F.arrayNode();
            for (ValidationOutcome r : outcomes) {
                a.add(tree(r));
            }
            out = a;
        }
        return MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(out) + "\n";
    }

    /**
     * One outcome as a JSON object: the report, or for a file that could not be read
     * {@code {"file", "valid": false, "status": 2, "error": {"message", "problem", "line", "column", "pointer"}}}.
     */
    static ObjectNode tree(ValidationOutcome r) {
        if (r.report() != null) {
            return tree(r.report());
        }
        FormatException e = r.failure();
        ObjectNode o = F.objectNode();
        if (r.file() == null) {
            o.putNull("file");
        } else {
            o.put("file", r.file());
        }
        o.put("valid", false);
        o.put("status", 2);
        ObjectNode x = o.putObject("error");
        x.put("message", e.getMessage());
        x.put("problem", e.problem());
        if (e.line() > 0) {
            x.put("line", e.line());
            x.put("column", e.column());
        } else {
            x.putNull("line");
            x.putNull("column");
        }
        x.put("pointer", e.pointer());
        return o;
    }

    /** One report as a JSON object. */
    public static ObjectNode tree(ValidationReport r) {
        ObjectNode o = F.objectNode();
        if (r.file() == null) {
            o.putNull("file");
        } else {
            o.put("file", r.file());
        }
        o.put("valid", r.valid());
        ObjectNode props = o.putObject("properties");
        for (Property p : Property.values()) {
            Verdict v = r.property(p);
            if (v == Verdict.UNKNOWN) {
                props.put(p.jsonName(), "unknown");
            } else {
                props.put(p.jsonName(), v == Verdict.TRUE);
            }
        }
        if (r.logPartition() == null) {
            o.putNull("logPartition");
        } else {
            ObjectNode z = o.putObject("logPartition");
            for (Map.Entry<String, Double> e : r.logPartition().entrySet()) {
                number(z, e.getKey(), e.getValue());
            }
        }
        if (r.variableTree() == null) {
            o.putNull("variableTree");
        } else {
            // raw text: a deep tree would exceed the writer's nesting limit as a node tree
            o.putRawValue("variableTree", new RawValue(r.variableTree().toString()));
        }
        ExactQueries q = r.exactQueries();
        ObjectNode eq = o.putObject("exactQueries");
        eq.put("density", q.density());
        eq.put("marginal", q.marginal());
        eq.put("conditional", q.conditional());
        eq.put("mpe", q.mpe());
        eq.put("sampling", q.sampling());
        ObjectNode st = o.putObject("stats");
        st.put("variables", r.stats().variables());
        st.put("nodes", r.stats().nodes());
        st.put("edges", r.stats().edges());
        st.put("depth", r.stats().depth());
        ArrayNode ds = o.putArray("diagnostics");
        for (Diagnostic d : r.diagnostics()) {
            ObjectNode x = ds.addObject();
            x.put("code", d.code());
            x.put("severity", d.severity().jsonName());
            x.put("message", d.message());
            x.put("pointer", d.pointer());
            if (d.node() == null) {
                x.putNull("node");
            } else {
                x.put("node", d.node().intValue());
            }
            if (d.hasLineColumn()) {
                x.put("line", d.line());
                x.put("column", d.column());
            } else {
                x.putNull("line");
                x.putNull("column");
            }
        }
        return o;
    }

    /** A finite number, or {@code null} for infinities and NaN (not JSON numbers). */
    private static void number(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    /** The tree as nested arrays (a bare index for a single variable), built without recursion. */
    public static JsonNode tree(VariableTree t) {
        Deque<ArrayNode> stack = new ArrayDeque<>();
        JsonNode[] result = new JsonNode[1];
        t.write(new VariableTree.Visitor() {
            @Override
            public void startInner() {
                ArrayNode a = F.arrayNode();
                if (!stack.isEmpty()) {
                    stack.peek().add(a);
                }
                stack.push(a);
            }

            @Override
            public void leaf(int variable) {
                if (stack.isEmpty()) {
                    result[0] = F.numberNode(variable);
                } else {
                    stack.peek().add(variable);
                }
            }

            @Override
            public void endInner() {
                ArrayNode a = stack.pop();
                if (stack.isEmpty()) {
                    result[0] = a;
                }
            }
        });
        return result[0];
    }
}
