package dev.circa.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Paint;
import java.awt.Rectangle;
import java.util.List;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.IntervalMarker;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.PaintScale;
import org.jfree.chart.renderer.category.BarRenderer;
import org.jfree.chart.renderer.category.StandardBarPainter;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYBlockRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.PaintScaleLegend;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.data.category.DefaultCategoryDataset;
import org.jfree.data.xy.DefaultXYZDataset;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.svg.SVGGraphics2D;

/**
 * The page's plots: JFreeChart charts drawn into JFreeSVG's {@code SVGGraphics2D} and returned as inline
 * {@code <svg>} markup (no script, font or image referenced). Needs {@code java.awt.headless} on servers,
 * which this class sets when nothing else has.
 */
final class Charts {
    static final int WIDTH = 640;
    static final int HEIGHT = 320;
    private static final Color[] SERIES = {new Color(0x1f4e9c), new Color(0xc2571a), new Color(0x2e7d32),
        new Color(0x7b1fa2), new Color(0x616161), new Color(0xad1457)};
    private static int charts;

    static {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
    }

    private Charts() {
    }

    /** Curves y(x), one series per name; NaN values leave gaps. */
    static String lines(String xLabel, String yLabel, double[] x, List<String> names, List<double[]> ys) {
        XYSeriesCollection data = new XYSeriesCollection();
        for (int s = 0; s < names.size(); s++) {
            XYSeries series = new XYSeries(names.get(s), false, true);
            double[] y = ys.get(s);
            for (int k = 0; k < x.length; k++) {
                series.add(x[k], Double.isFinite(y[k]) ? y[k] : Double.NaN);
            }
            data.addSeries(series);
        }
        JFreeChart chart = ChartFactory.createXYLineChart(null, xLabel, yLabel, data, PlotOrientation.VERTICAL,
                names.size() > 1, false, false);
        XYPlot plot = chart.getXYPlot();
        XYLineAndShapeRenderer r = (XYLineAndShapeRenderer) plot.getRenderer();
        for (int s = 0; s < names.size(); s++) {
            r.setSeriesPaint(s, SERIES[s % SERIES.length]);
            r.setSeriesStroke(s, new BasicStroke(2f));
        }
        ((NumberAxis) plot.getRangeAxis()).setAutoRangeIncludesZero(true);
        return svg(chart, WIDTH, HEIGHT);
    }

    /** Bars per category (state or count), one series per name. */
    static String bars(String xLabel, String yLabel, List<String> categories, List<String> names, List<double[]> ys) {
        DefaultCategoryDataset data = new DefaultCategoryDataset();
        for (int s = 0; s < names.size(); s++) {
            for (int k = 0; k < categories.size(); k++) {
                data.addValue(ys.get(s)[k], names.get(s), categories.get(k));
            }
        }
        JFreeChart chart = ChartFactory.createBarChart(null, xLabel, yLabel, data, PlotOrientation.VERTICAL,
                names.size() > 1, false, false);
        CategoryPlot plot = chart.getCategoryPlot();
        BarRenderer r = (BarRenderer) plot.getRenderer();
        r.setBarPainter(new StandardBarPainter());
        r.setShadowVisible(false);
        for (int s = 0; s < names.size(); s++) {
            r.setSeriesPaint(s, SERIES[s % SERIES.length]);
        }
        return svg(chart, WIDTH, HEIGHT);
    }

    /** Points (x, y) with the line y = x for reference. */
    static String scatter(String xLabel, String yLabel, double[] x, double[] y, int n) {
        XYSeriesCollection data = new XYSeriesCollection();
        XYSeries points = new XYSeries("cases", false, true);
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            points.add(x[k], y[k]);
            lo = Math.min(lo, Math.min(x[k], y[k]));
            hi = Math.max(hi, Math.max(x[k], y[k]));
        }
        XYSeries diagonal = new XYSeries("computed = reference", false, true);
        if (n > 0) {
            diagonal.add(lo, lo);
            diagonal.add(hi, hi);
        }
        data.addSeries(points);
        data.addSeries(diagonal);
        JFreeChart chart = ChartFactory.createScatterPlot(null, xLabel, yLabel, data, PlotOrientation.VERTICAL,
                true, false, false);
        XYPlot plot = chart.getXYPlot();
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer();
        r.setSeriesLinesVisible(0, false);
        r.setSeriesShapesVisible(0, true);
        r.setSeriesShape(0, new java.awt.geom.Ellipse2D.Double(-2.5, -2.5, 5, 5));
        r.setSeriesPaint(0, SERIES[0]);
        r.setSeriesLinesVisible(1, true);
        r.setSeriesShapesVisible(1, false);
        r.setSeriesPaint(1, SERIES[1]);
        plot.setRenderer(r);
        ((NumberAxis) plot.getDomainAxis()).setAutoRangeIncludesZero(false);
        ((NumberAxis) plot.getRangeAxis()).setAutoRangeIncludesZero(false);
        return svg(chart, WIDTH, HEIGHT);
    }

    /** A histogram of counts over bins [edges[k], edges[k+1]), with the band [bandLo, bandHi] shaded. */
    static String histogram(String xLabel, double[] edges, long[] counts, double bandLo, double bandHi, String band) {
        XYIntervalSeries series = new XYIntervalSeries("cases");
        for (int k = 0; k < counts.length; k++) {
            double mid = (edges[k] + edges[k + 1]) / 2;
            series.add(mid, edges[k], edges[k + 1], counts[k], counts[k], counts[k]);
        }
        XYIntervalSeriesCollection data = new XYIntervalSeriesCollection();
        data.addSeries(series);
        JFreeChart chart = ChartFactory.createXYBarChart(null, xLabel, false, "cases", data, PlotOrientation.VERTICAL,
                false, false, false);
        XYPlot plot = chart.getXYPlot();
        XYBarRenderer r = (XYBarRenderer) plot.getRenderer();
        r.setBarPainter(new StandardXYBarPainter());
        r.setShadowVisible(false);
        r.setSeriesPaint(0, SERIES[0]);
        if (Double.isFinite(bandLo) && Double.isFinite(bandHi)) {
            IntervalMarker m = new IntervalMarker(bandLo, Math.max(bandHi, bandLo + 1e-3), new Color(0x2e7d32, false),
                    new BasicStroke(1f), new Color(0x2e7d32), new BasicStroke(1f), 0.25f);
            m.setLabel(band);
            m.setLabelFont(new Font(Font.SANS_SERIF, Font.PLAIN, 11));
            m.setLabelAnchor(org.jfree.chart.ui.RectangleAnchor.TOP_LEFT);
            m.setLabelTextAnchor(org.jfree.chart.ui.TextAnchor.TOP_LEFT);
            plot.addDomainMarker(m, org.jfree.chart.ui.Layer.BACKGROUND);
        }
        return svg(chart, WIDTH, HEIGHT);
    }

    /**
     * A heat map of z over the cells (x[i], y[j]), {@code z[i * ny + j]}; a discrete axis is labelled by
     * {@code xLabels}/{@code yLabels} (null for a real axis).
     */
    static String heatMap(String xName, String yName, double[] x, double[] y, double[] z, String[] xLabels,
            String[] yLabels) {
        int nx = x.length;
        int ny = y.length;
        double[][] series = new double[3][nx * ny];
        double max = 0;
        for (int i = 0; i < nx; i++) {
            for (int j = 0; j < ny; j++) {
                int k = i * ny + j;
                series[0][k] = x[i];
                series[1][k] = y[j];
                series[2][k] = Double.isFinite(z[k]) ? z[k] : 0;
                max = Math.max(max, series[2][k]);
            }
        }
        DefaultXYZDataset data = new DefaultXYZDataset();
        data.addSeries("density", series);
        XYBlockRenderer r = new XYBlockRenderer();
        r.setBlockWidth(step(x));
        r.setBlockHeight(step(y));
        BluePaintScale scale = new BluePaintScale(max > 0 ? max : 1);
        r.setPaintScale(scale);
        XYPlot plot = new XYPlot(data, axis(xName, xLabels), axis(yName, yLabels), r);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        JFreeChart chart = new JFreeChart(null, JFreeChart.DEFAULT_TITLE_FONT, plot, false);
        chart.setBackgroundPaint(Color.WHITE);
        NumberAxis legendAxis = new NumberAxis("density");
        legendAxis.setRange(0, scale.getUpperBound());
        PaintScaleLegend legend = new PaintScaleLegend(scale, legendAxis);
        legend.setPosition(RectangleEdge.RIGHT);
        legend.setMargin(4, 4, 4, 4);
        chart.addSubtitle(legend);
        return svg(chart, WIDTH, 400);
    }

    private static ValueAxis axis(String name, String[] labels) {
        if (labels != null) {
            return new SymbolAxis(name, labels);
        }
        NumberAxis a = new NumberAxis(name);
        a.setAutoRangeIncludesZero(false);
        return a;
    }

    private static double step(double[] v) {
        return v.length > 1 ? Math.abs(v[1] - v[0]) : 1;
    }

    /** White to dark blue over [0, upper]. */
    private static final class BluePaintScale implements PaintScale {
        private final double upper;

        BluePaintScale(double upper) {
            this.upper = upper;
        }

        @Override
        public double getLowerBound() {
            return 0;
        }

        @Override
        public double getUpperBound() {
            return upper;
        }

        @Override
        public Paint getPaint(double value) {
            double t = Math.max(0, Math.min(1, value / upper));
            return new Color((int) Math.round(255 - t * (255 - 0x0d)), (int) Math.round(255 - t * (255 - 0x2b)),
                    (int) Math.round(255 - t * (255 - 0x6e)));
        }
    }

    private static String svg(JFreeChart chart, int width, int height) {
        chart.setBackgroundPaint(Color.WHITE);
        chart.setAntiAlias(true);
        // white plot area with light grid lines: readable on screen and on paper
        Color grid = new Color(0xd0d0d0);
        if (chart.getPlot() instanceof XYPlot xy) {
            xy.setBackgroundPaint(Color.WHITE);
            xy.setDomainGridlinePaint(grid);
            xy.setRangeGridlinePaint(grid);
        } else if (chart.getPlot() instanceof CategoryPlot cat) {
            cat.setBackgroundPaint(Color.WHITE);
            cat.setRangeGridlinePaint(grid);
        }
        SVGGraphics2D g = new SVGGraphics2D(width, height);
        String prefix;
        synchronized (Charts.class) {
            prefix = "c" + (++charts) + "_";
        }
        g.setDefsKeyPrefix(prefix);
        chart.draw(g, new Rectangle(0, 0, width, height));
        return g.getSVGElement(prefix + "svg");
    }

    /**
     * {@code svg} with {@code role="img"}, a {@code viewBox} so it scales with the page, and a title and
     * description that screen readers announce.
     */
    static String accessible(String svg, String id, String title, String description) {
        // the library's own namespace is never used in the markup it writes; drop its declaration
        svg = svg.replace(" xmlns:jfreesvg='http://www.jfree.org/jfreesvg/svg'", "");
        int open = svg.indexOf("<svg");
        int end = svg.indexOf('>', open);
        String tag = svg.substring(open, end);
        String w = attribute(tag, "width");
        String h = attribute(tag, "height");
        StringBuilder sb = new StringBuilder(svg.length() + 256);
        sb.append(svg, 0, end);
        sb.append(" role=\"img\" aria-labelledby=\"").append(id).append("-title ").append(id).append("-desc\"");
        if (w != null && h != null && attribute(tag, "viewBox") == null) {
            sb.append(" viewBox=\"0 0 ").append(w.replace("px", "")).append(' ').append(h.replace("px", "")).append('"');
        }
        sb.append("><title id=\"").append(id).append("-title\">").append(Html.escape(title)).append("</title>");
        sb.append("<desc id=\"").append(id).append("-desc\">").append(Html.escape(description)).append("</desc>");
        sb.append(svg, end + 1, svg.length());
        return sb.toString();
    }

    private static String attribute(String tag, String name) {
        int i = tag.indexOf(' ' + name + "=");
        if (i < 0) {
            return null;
        }
        int start = i + name.length() + 3;
        char quote = tag.charAt(start - 1);
        return tag.substring(start, tag.indexOf(quote, start));
    }
}
