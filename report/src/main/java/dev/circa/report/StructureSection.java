package dev.circa.report;

import dev.circa.converter.render.DotRenderer;
import dev.circa.converter.render.RenderOptions;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.NodeKind;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The structure by depth (edges on the longest path from an output; nodes no output reaches apart) and the
 * DOT drawing of the structure, summarised by scope above {@value #DOT_NODES} nodes.
 */
final class StructureSection {
    /** Above this many nodes the DOT text is the summary by scope. */
    static final int DOT_NODES = 60;

    private StructureSection() {
    }

    /**
     * Per node its depth: the number of edges on the longest path from an output, -1 when no output reaches
     * it. One pass from the last node to the first (parents come after their children).
     */
    static int[] depths(CompiledCircuit c) {
        int n = c.nodeCount();
        int[] depth = new int[n];
        Arrays.fill(depth, -1);
        for (int o = 0; o < c.outputCount(); o++) {
            depth[c.outputNode(o)] = 0;
        }
        int[] start = c.childStart();
        int[] child = c.childIndex();
        for (int i = n - 1; i >= 0; i--) {
            if (depth[i] < 0) {
                continue;
            }
            for (int e = start[i]; e < start[i + 1]; e++) {
                depth[child[e]] = Math.max(depth[child[e]], depth[i] + 1);
            }
        }
        return depth;
    }

    static void write(Html html, CompiledCircuit c) {
        html.section("structure", "Structure");
        int[] depth = depths(c);
        int max = 0;
        for (int d : depth) {
            max = Math.max(max, d);
        }
        int layers = max + 2; // the last layer holds the nodes no output reaches
        long[][] kinds = new long[3][layers];
        long[] edges = new long[layers];
        int[] start = c.childStart();
        for (int i = 0; i < c.nodeCount(); i++) {
            int layer = depth[i] < 0 ? layers - 1 : depth[i];
            kinds[c.kind(i).ordinal()][layer]++;
            edges[layer] += start[i + 1] - start[i];
        }
        boolean unreached = kinds[0][layers - 1] + kinds[1][layers - 1] + kinds[2][layers - 1] > 0;
        int shown = unreached ? layers : layers - 1;
        List<String> categories = new ArrayList<>();
        for (int d = 0; d < shown; d++) {
            categories.add(d == layers - 1 ? "unreached" : Integer.toString(d));
        }
        List<String> names = List.of("sums", "products", "inputs");
        List<double[]> ys = new ArrayList<>();
        for (NodeKind k : new NodeKind[] {NodeKind.SUM, NodeKind.PRODUCT, NodeKind.INPUT}) {
            double[] y = new double[shown];
            for (int d = 0; d < shown; d++) {
                y[d] = kinds[k.ordinal()][d];
            }
            ys.add(y);
        }
        String title = "Nodes by depth";
        html.figure("structure", title, "Sums, products and inputs at each depth (edges on the longest path from an "
                + "output); the numbers, with the edges leaving each layer, are in the table that follows.",
                Charts.bars("depth", "nodes", categories, names, ys));
        html.numbers("The numbers behind this plot");
        html.tableHead(title, "depth", "nodes", "sums", "products", "inputs", "edges to children");
        for (int d = 0; d < shown; d++) {
            long s = kinds[NodeKind.SUM.ordinal()][d];
            long p = kinds[NodeKind.PRODUCT.ordinal()][d];
            long in = kinds[NodeKind.INPUT.ordinal()][d];
            html.row(categories.get(d), Long.toString(s + p + in), Long.toString(s), Long.toString(p), Long.toString(in),
                    Long.toString(edges[d]));
        }
        html.tableEnd().endNumbers().endFigure();
        RenderOptions options = new RenderOptions(false, DOT_NODES);
        html.raw("<details class=\"dot\"><summary>").text(DotRenderer.isSummary(c, options)
                ? "Graphviz DOT of the structure, summarised by scope (one node per scope and kind; draw it with dot -Tsvg)"
                : "Graphviz DOT of the structure (draw it with dot -Tsvg)").raw("</summary>\n<pre>")
                .text(DotRenderer.render(c, options)).raw("</pre></details>\n");
        html.endSection();
    }
}
