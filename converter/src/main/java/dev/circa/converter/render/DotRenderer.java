package dev.circa.converter.render;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.NodeKind;
import dev.circa.format.Family;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Graphviz DOT of a compiled circuit. Up to {@link RenderOptions#maxNodes()} nodes, one DOT node
 * per circuit node (inputs as rounded boxes with family, variable and rounded parameters; products
 * as boxes; sums as ellipses with rounded weights on their edges; outputs as plain labels), edges
 * from parent to child. Above the limit, a summary: one DOT node per distinct
 * (kind, scope) with the number of circuit nodes in it (and, for inputs, per family), and one edge per pair of groups labelled
 * with the number of edges between them.
 */
public final class DotRenderer {
    private static final int SCOPE_NAMES = 6;

    private final CompiledCircuit c;
    private final RenderOptions options;
    private final Appendable out;
    private InternedScopes scopes;

    private DotRenderer(CompiledCircuit c, RenderOptions options, Appendable out) {
        this.c = c;
        this.options = options;
        this.out = out;
    }

    /** Writes the DOT of {@code c} to {@code out}. */
    public static void render(CompiledCircuit c, RenderOptions options, Appendable out) throws IOException {
        DotRenderer r = new DotRenderer(c, options, out);
        if (c.nodeCount() > options.maxNodes()) {
            r.summary();
        } else {
            r.detailed();
        }
    }

    /** The DOT of {@code c} as a string. */
    public static String render(CompiledCircuit c, RenderOptions options) {
        StringBuilder sb = new StringBuilder();
        try {
            render(c, options, sb);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return sb.toString();
    }

    /** Whether {@code c} would be drawn as a summary by scope under {@code options}. */
    public static boolean isSummary(CompiledCircuit c, RenderOptions options) {
        return c.nodeCount() > options.maxNodes();
    }

    private void detailed() throws IOException {
        if (options.scopes()) {
            scopes = InternedScopes.of(c);
        }
        out.append("digraph circuit {\n");
        out.append("  node [fontname=\"Helvetica\", fontsize=10];\n  edge [fontname=\"Helvetica\", fontsize=9];\n");
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        double[] lw = c.logWeight();
        for (int i = 0; i < c.nodeCount(); i++) {
            NodeKind k = c.kind(i);
            StringBuilder label = new StringBuilder();
            String shape;
            if (k == NodeKind.INPUT) {
                shape = "box, style=rounded";
                label.append('#').append(c.nodeId(i)).append(' ').append(c.inputFamily(i).jsonName()).append('\n');
                label.append(variableNames(c.inputVars(i))).append('\n').append(parameters(i));
            } else if (k == NodeKind.PRODUCT) {
                shape = "box";
                label.append('#').append(c.nodeId(i)).append(" product");
            } else {
                shape = "ellipse";
                label.append('#').append(c.nodeId(i)).append(" sum");
            }
            if (options.scopes() && k != NodeKind.INPUT) {
                label.append('\n').append(scopeText(scopes.variables(scopes.scopeOf(i))));
            }
            out.append("  n").append(Integer.toString(i)).append(" [shape=").append(shape)
                    .append(", label=").append(quote(label.toString())).append("];\n");
        }
        for (int i = 0; i < c.nodeCount(); i++) {
            NodeKind k = c.kind(i);
            for (int e = cs[i]; e < cs[i + 1]; e++) {
                out.append("  n").append(Integer.toString(i)).append(" -> n").append(Integer.toString(ci[e]));
                if (k == NodeKind.SUM) {
                    out.append(" [label=").append(quote(round(Math.exp(lw[e])))).append(']');
                }
                out.append(";\n");
            }
        }
        outputs(null);
        out.append("}\n");
    }

    private void summary() throws IOException {
        scopes = InternedScopes.of(c);
        int n = c.nodeCount();
        int[] group = new int[n];
        Map<Long, Integer> groupOf = new HashMap<>();
        List<long[]> groups = new ArrayList<>();
        List<int[]> families = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            long key = (long) scopes.scopeOf(i) * 3 + c.kind(i).ordinal();
            Integer g = groupOf.get(key);
            if (g == null) {
                g = groups.size();
                groupOf.put(key, g);
                groups.add(new long[] {c.kind(i).ordinal(), scopes.scopeOf(i), 0});
                families.add(new int[Family.values().length]);
            }
            groups.get(g)[2]++;
            if (c.kind(i) == NodeKind.INPUT) {
                families.get(g)[c.inputFamily(i).ordinal()]++;
            }
            group[i] = g;
        }
        Map<Long, long[]> edges = new LinkedHashMap<>();
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        for (int i = 0; i < n; i++) {
            for (int e = cs[i]; e < cs[i + 1]; e++) {
                long key = ((long) group[i] << 32) | group[ci[e]];
                edges.computeIfAbsent(key, x -> new long[1])[0]++;
            }
        }
        out.append("digraph circuit {\n");
        out.append(String.format(Locale.ROOT,
                "  label=%s;%n", quote(String.format(Locale.ROOT, "summary by scope: %d nodes, %d edges in %d groups (more than %d nodes)",
                        n, c.edgeCount(), groups.size(), options.maxNodes()))));
        out.append("  node [fontname=\"Helvetica\", fontsize=10];\n  edge [fontname=\"Helvetica\", fontsize=9];\n");
        NodeKind[] kinds = NodeKind.values();
        for (int g = 0; g < groups.size(); g++) {
            long[] info = groups.get(g);
            NodeKind k = kinds[(int) info[0]];
            String what = switch (k) {
                case INPUT -> info[2] == 1 ? "input" : "inputs";
                case PRODUCT -> info[2] == 1 ? "product" : "products";
                case SUM -> info[2] == 1 ? "sum" : "sums";
            };
            StringBuilder label = new StringBuilder().append(info[2]).append(' ').append(what);
            if (k == NodeKind.INPUT) {
                String sep = " (";
                for (Family f : Family.values()) {
                    int count = families.get(g)[f.ordinal()];
                    if (count > 0) {
                        label.append(sep).append(count).append(' ').append(f.jsonName());
                        sep = ", ";
                    }
                }
                label.append(')');
            }
            label.append('\n').append(scopeText(scopes.variables((int) info[1])));
            out.append("  g").append(Integer.toString(g)).append(" [shape=")
                    .append(k == NodeKind.SUM ? "ellipse" : k == NodeKind.PRODUCT ? "box" : "box, style=rounded")
                    .append(", label=").append(quote(label.toString())).append("];\n");
        }
        for (Map.Entry<Long, long[]> e : edges.entrySet()) {
            long key = e.getKey();
            out.append("  g").append(Long.toString(key >>> 32)).append(" -> g").append(Long.toString(key & 0xFFFFFFFFL))
                    .append(" [label=").append(quote(e.getValue()[0] + (e.getValue()[0] == 1 ? " edge" : " edges"))).append("];\n");
        }
        outputs(group);
        out.append("}\n");
    }

    private void outputs(int[] group) throws IOException {
        for (int o = 0; o < c.outputCount(); o++) {
            out.append("  o").append(Integer.toString(o)).append(" [shape=plaintext, label=")
                    .append(quote(c.outputName(o))).append("];\n");
            int node = c.outputNode(o);
            out.append("  o").append(Integer.toString(o)).append(" -> ")
                    .append(group == null ? "n" + node : "g" + group[node]).append(";\n");
        }
    }

    private String parameters(int i) {
        Family f = c.inputFamily(i);
        double[] p = c.inputParams(i);
        StringBuilder sb = new StringBuilder();
        if (f == Family.CATEGORICAL) {
            sb.append("probs [");
            for (int k = 0; k < p.length && k < 8; k++) {
                sb.append(k == 0 ? "" : ", ").append(round(p[k]));
            }
            sb.append(p.length > 8 ? ", ...]" : "]");
        } else if (f == Family.MVNORMAL) {
            sb.append("d=").append(c.inputVars(i).length);
        } else {
            List<String> names = f.parameters();
            for (int k = 0; k < names.size() && k < p.length; k++) {
                sb.append(k == 0 ? "" : " ").append(names.get(k)).append('=').append(round(p[k]));
            }
        }
        return sb.toString();
    }

    private String variableNames(int[] vars) {
        StringBuilder sb = new StringBuilder();
        for (int k = 0; k < vars.length; k++) {
            sb.append(k == 0 ? "" : ", ").append(c.variables().get(vars[k]).name());
        }
        return sb.toString();
    }

    private String scopeText(int[] vars) {
        StringBuilder sb = new StringBuilder("{");
        for (int k = 0; k < vars.length && k < SCOPE_NAMES; k++) {
            sb.append(k == 0 ? "" : ", ").append(c.variables().get(vars[k]).name());
        }
        if (vars.length > SCOPE_NAMES) {
            sb.append(", ... (").append(vars.length).append(" variables)");
        }
        return sb.append('}').toString();
    }

    private static String round(double d) {
        return String.format(Locale.ROOT, "%.3g", d);
    }

    /** A DOT double-quoted string: quotes and backslashes escaped, newlines as centred line breaks. */
    static String quote(String s) {
        StringBuilder sb = new StringBuilder(s.length() + 2).append('"');
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            if (ch == '"' || ch == '\\') {
                sb.append('\\').append(ch);
            } else if (ch == '\n') {
                sb.append("\\n");
            } else if (ch != '\r') {
                sb.append(ch);
            }
        }
        return sb.append('"').toString();
    }
}
