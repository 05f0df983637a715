package dev.circa.report;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.ExactMarginals;
import dev.circa.format.Variable;
import java.util.List;
import java.util.Locale;

/**
 * Two-variable marginals as heat maps: the exact joint marginal of each pair on a grid of its values with every
 * other variable missing ({@link ExactMarginals#pairLogDensity}: one forward and one backward pass per value of
 * the first variable), normalised by the output's partition function.
 */
final class PairSection {
    /** Cells along a real axis. */
    static final int REAL_CELLS = 40;
    /** Values along a count axis at most. */
    static final int MAX_COUNTS = 40;

    private PairSection() {
    }

    /** p(a, b) on the grid {@code ga x gb} under each output, normalised, {@code [o][i * gb + j]}. */
    static double[][] values(ExactMarginals m, int a, int b, double[] ga, double[] gb) {
        int no = m.circuit().outputCount();
        int rows = ga.length * gb.length;
        double[] out = new double[rows * no];
        m.pairLogDensity(a, ga, ga.length, b, gb, gb.length, out);
        double[][] z = new double[no][rows];
        for (int o = 0; o < no; o++) {
            double lz = m.logPartition(o);
            for (int r = 0; r < rows; r++) {
                z[o][r] = Math.exp(out[r * no + o] - lz);
            }
        }
        return z;
    }

    static void write(Html html, ExactMarginals m, List<int[]> pairs) {
        CompiledCircuit c = m.circuit();
        html.section("pairs", "Pairs of variables");
        if (pairs.isEmpty()) {
            html.element("p", "No pairs were chosen (circa report --pairs a:b,... draws up to 6 two-variable marginals).");
            html.endSection();
            return;
        }
        html.element("p", "The joint marginal of each chosen pair under each output, every other variable missing: "
                + "exact values of the circuit on a grid of the pair's values, divided by the partition function. "
                + "Darker is more probable.");
        for (int[] pair : pairs) {
            Variable va = c.variables().get(pair[0]);
            Variable vb = c.variables().get(pair[1]);
            MarginalGrid ga = MarginalGrid.of(m, va, pair[0], REAL_CELLS, MAX_COUNTS);
            MarginalGrid gb = MarginalGrid.of(m, vb, pair[1], REAL_CELLS, MAX_COUNTS);
            double[][] z = values(m, pair[0], pair[1], ga.x(), gb.x());
            for (int o = 0; o < c.outputCount(); o++) {
                String title = "Joint marginal of " + va.name() + " and " + vb.name() + " under " + c.outputName(o);
                String desc = String.format(Locale.ROOT, "A heat map of the exact joint %s of %s (%d values) and %s "
                        + "(%d values); the numbers are in the table that follows.",
                        ga.discrete() && gb.discrete() ? "probability" : "density", va.name(), ga.x().length,
                        vb.name(), gb.x().length);
                String svg = Charts.heatMap(va.name(), vb.name(), axis(ga), axis(gb), z[o],
                        ga.discrete() ? ga.labels() : null, gb.discrete() ? gb.labels() : null);
                html.raw("<div class=\"pair\" data-pair=\"").text(va.name() + ":" + vb.name()).raw("\">\n");
                html.figure("pair", title, desc, svg);
                html.numbers("The numbers behind this plot");
                html.tableHead(title, va.name(), vb.name(), "value under " + c.outputName(o));
                for (int i = 0; i < ga.x().length; i++) {
                    for (int j = 0; j < gb.x().length; j++) {
                        html.row(label(ga, i), label(gb, j), Html.num(z[o][i * gb.x().length + j]));
                    }
                }
                html.tableEnd().endNumbers().endFigure().raw("</div>\n");
            }
        }
        html.endSection();
    }

    /** The heat map's coordinates: a discrete axis is indexed 0, 1, ... for its symbol labels. */
    private static double[] axis(MarginalGrid g) {
        if (!g.discrete()) {
            return g.x();
        }
        double[] idx = new double[g.x().length];
        for (int k = 0; k < idx.length; k++) {
            idx[k] = k;
        }
        return idx;
    }

    private static String label(MarginalGrid g, int k) {
        return g.discrete() ? g.labels()[k] : Html.num(g.x()[k]);
    }
}
