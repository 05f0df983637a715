package dev.circa.report;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.ExactMarginals;
import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Every variable's exact marginal under every output, each variable in one plot (a curve or bars per output)
 * with the numbers behind it in a table: the mixture of {@link ExactMarginals}, normalised by each output's
 * partition function.
 */
final class MarginalSection {
    /** Points of a real variable's curve. */
    static final int REAL_POINTS = 200;
    /** Counts shown at most for a count variable. */
    static final int MAX_COUNTS = 200;
    /** Up to this many values, a discrete marginal is drawn as bars, beyond as a curve over its points. */
    private static final int MAX_BARS = 40;

    private MarginalSection() {
    }

    /** The normalised marginal of variable {@code v} at {@code x} under each output (NaN where out of scope). */
    static List<double[]> values(ExactMarginals m, int v, double[] x) {
        List<double[]> ys = new ArrayList<>();
        double[] log = new double[x.length];
        for (int o = 0; o < m.circuit().outputCount(); o++) {
            double[] y = new double[x.length];
            if (m.inScope(o, v)) {
                m.logDensity(o, v, x, x.length, log);
                double z = m.logPartition(o);
                for (int k = 0; k < x.length; k++) {
                    y[k] = Math.exp(log[k] - z);
                }
            } else {
                Arrays.fill(y, Double.NaN);
            }
            ys.add(y);
        }
        return ys;
    }

    static void write(Html html, ExactMarginals m) {
        CompiledCircuit c = m.circuit();
        html.section("marginals", "Exact marginals");
        html.raw("<p>").text("Each variable's distribution under each output with every other variable left "
                + "missing (summed or integrated out). The circuit is smooth and decomposable, so one pass up and one "
                + "pass down the circuit give every marginal at once as a mixture of the inputs over that variable, "
                + "weighted by how much the output changes with each input. These are exact values, not samples; "
                + "each is divided by its output's partition function, so it integrates (or sums) to 1.").raw("</p>\n");
        List<String> names = new ArrayList<>();
        for (int o = 0; o < c.outputCount(); o++) {
            names.add(c.outputName(o));
        }
        for (int v = 0; v < c.variableCount(); v++) {
            Variable var = c.variables().get(v);
            MarginalGrid grid = MarginalGrid.of(m, var, v, REAL_POINTS, MAX_COUNTS);
            List<double[]> ys = values(m, v, grid.x());
            String what = grid.discrete() ? "probability" : "density";
            String unit = var.unit() == null ? "" : " (" + var.unit() + ")";
            String svg = grid.discrete() && grid.x().length <= MAX_BARS
                    ? Charts.bars(var.name(), what, Arrays.asList(grid.labels()), names, ys)
                    : Charts.lines(var.name() + unit, what, grid.x(), names, ys);
            String title = "Marginal of " + var.name() + unit;
            String desc = String.format(java.util.Locale.ROOT, "The exact marginal %s of %s (%s, %s)"
                    + " under %s, at %s from %s to %s. The numbers are in the table that follows.", what, var.name(),
                    var.type().jsonName(), dev.circa.format.Counts.of(m.componentCount(v), "mixture component"),
                    names.size() == 1 ? "output " + names.get(0) : names.size() + " outputs",
                    dev.circa.format.Counts.of(grid.x().length, grid.discrete() ? "value" : "point"),
                    grid.discrete() ? grid.labels()[0] : Html.round(grid.x()[0]),
                    grid.discrete() ? grid.labels()[grid.x().length - 1] : Html.round(grid.x()[grid.x().length - 1]));
            html.raw("<div class=\"marginal\" data-variable=\"").text(var.name()).raw("\">\n");
            html.figure("marginal", title, desc, svg);
            html.numbers("The numbers behind this plot");
            String[] columns = new String[names.size() + (grid.discrete() ? 2 : 1)];
            int col = 0;
            columns[col++] = grid.discrete() ? "value" : var.name();
            if (grid.discrete()) {
                columns[col++] = "label";
            }
            for (String n : names) {
                columns[col++] = what + " under " + n;
            }
            html.tableHead(title, columns);
            String[] cells = new String[columns.length];
            for (int k = 0; k < grid.x().length; k++) {
                col = 0;
                cells[col++] = Html.num(grid.x()[k]);
                if (grid.discrete()) {
                    cells[col++] = grid.labels()[k];
                }
                for (double[] y : ys) {
                    cells[col++] = Double.isNaN(y[k]) ? "not in scope" : Html.num(y[k]);
                }
                html.row(cells);
            }
            html.tableEnd().endNumbers().endFigure();
            html.raw("</div>\n");
        }
        html.endSection();
    }
}
