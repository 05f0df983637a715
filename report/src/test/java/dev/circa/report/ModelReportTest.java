package dev.circa.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/** The report page: its HTML, its sections, and the numbers behind its plots against outside references. */
class ModelReportTest {
    /** Agreement asked of the plotted numbers with commons-math3 3.6.1. */
    private static final double TOLERANCE = 1e-12;
    private static Document regimes;

    @BeforeAll
    static void writeRegimesReport() throws Exception {
        Path report = ReportFixtures.reportFile(ReportFixtures.regimes(),
                "inlet_pressure:outlet_pressure,valve:motor_current", List.of(), "regimes.report.html");
        regimes = Jsoup.parse(report.toFile(), "UTF-8");
    }

    @Test
    void page_regimes_everySectionPresentInOrder() {
        int last = -1;
        for (String[] s : ModelReport.SECTIONS) {
            Element section = regimes.getElementById(s[0]);
            assertNotNull(section, "section " + s[0]);
            assertEquals(s[1], section.selectFirst("h2").text());
            int at = regimes.html().indexOf("id=\"" + s[0] + "\"");
            assertTrue(at > last, "section " + s[0] + " in page order");
            last = at;
        }
        assertNotNull(regimes.getElementById("caution"));
        assertEquals("Model report: pump-station-regimes", regimes.title());
        assertEquals(6, regimes.select("#marginals div.marginal").size(), "one marginal per variable");
        assertEquals(2, regimes.select("#pairs div.pair").size(), "one heat map per pair and output");
        assertTrue(regimes.getElementById("summary").text().contains(sha256(ReportFixtures.OUT.resolve("regimes.circuit.json"))));
        assertTrue(regimes.getElementById("verdict").text().contains("every sum's children have the same scope"));
    }

    @Test
    void page_regimes_referencesNothingOutside() {
        assertTrue(regimes.select("script, link, iframe, object, embed, img, video, audio, source").isEmpty(),
                "no element that loads something");
        for (Element e : regimes.getAllElements()) {
            for (org.jsoup.nodes.Attribute a : e.attributes()) {
                String key = a.getKey().toLowerCase(java.util.Locale.ROOT);
                if (key.equals("href") || key.equals("src") || key.endsWith(":href") || key.equals("srcset")) {
                    assertTrue(a.getValue().startsWith("#"), "only in-page links: " + e.tagName() + " " + a);
                }
                assertFalse(key.startsWith("on"), "no event handler attribute: " + a);
            }
        }
        String html = regimes.html();
        assertFalse(Pattern.compile("url\\(\\s*['\"]?(?!#)").matcher(html).find(), "no url() other than in-page fragments");
        assertFalse(html.contains("@import"), "no CSS import");
        assertFalse(Pattern.compile("(?i)(https?:)?//[a-z0-9.-]+\\.[a-z]{2,}/").matcher(
                html.replace("http://www.w3.org/2000/svg", "").replace("http://www.w3.org/1999/xlink", "")).find(),
                "no address of another server");
    }

    @Test
    void page_regimes_everyPlotHasTitleDescriptionAndNumbers() {
        List<Element> figures = regimes.select("figure.plot");
        assertTrue(figures.size() >= 6 + 2 + 1, "marginals, pairs, structure");
        for (Element f : figures) {
            assertFalse(f.selectFirst("figcaption").text().isBlank());
            Element svg = f.selectFirst("svg");
            assertEquals("img", svg.attr("role"));
            assertFalse(svg.selectFirst("title").text().isBlank());
            assertFalse(svg.selectFirst("desc").text().isBlank());
            assertNotNull(f.selectFirst("details > table tbody tr"), "the numbers behind " + f.selectFirst("figcaption").text());
        }
    }

    @Test
    void caution_isTheReadmeParagraph() throws Exception {
        String readme = Files.readString(Path.of("..", "README.md")).replaceAll("\\s+", " ");
        assertTrue(readme.contains("**" + CautionSection.HEADLINE + "** " + CautionSection.EXPLANATION),
                "the README says the same as the report");
        String caution = regimes.getElementById("caution").text();
        assertTrue(caution.startsWith(CautionSection.HEADLINE + " " + CautionSection.EXPLANATION));
    }

    @Test
    void marginal_categoricalValve_sumsToOneAndMatchesTheMixture() {
        double[] p = column(regimes, "valve", 2);
        assertEquals(3, p.length);
        double sum = 0;
        for (double v : p) {
            sum += v;
        }
        assertEquals(1, sum, TOLERANCE, "a categorical marginal sums to 1");
        // the YAML's regimes by hand (common practice: a mixture's marginal mixes the components' marginals)
        double[] expected = {0.80 * 0.05 + 0.20 * 0.6, 0.80 * 0.15 + 0.20 * 0.3, 0.80 * 0.80 + 0.20 * 0.1};
        for (int k = 0; k < 3; k++) {
            assertEquals(expected[k], p[k], TOLERANCE, "valve state " + k);
        }
    }

    @Test
    void marginal_normalMixtureWithMvnormal_equalsCommonsMathDensityAtGridPoints() throws Exception {
        // x: 0.5 N(-1, 0.8) + 0.3 N(2.5, 0.5) + 0.2 (coordinate 0 of an mvnormal with mean 1, variance 2.25)
        List<Variable> vars = List.of(Variable.of("inlet_pressure", VariableType.REAL), Variable.of("flow", VariableType.REAL));
        List<Node> nodes = new ArrayList<>();
        nodes.add(new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {-1, 0.8}, false));
        nodes.add(new InputNode(1, null, Family.NORMAL, new int[] {1}, new double[] {0, 1}, false));
        nodes.add(new ProductNode(2, null, new int[] {0, 1}));
        nodes.add(new InputNode(3, null, Family.NORMAL, new int[] {0}, new double[] {2.5, 0.5}, false));
        nodes.add(new InputNode(4, null, Family.EXPONENTIAL, new int[] {1}, new double[] {2}, false));
        nodes.add(new ProductNode(5, null, new int[] {3, 4}));
        nodes.add(new InputNode(6, null, Family.MVNORMAL, new int[] {0, 1}, new double[] {1, 3, 2.25, 0.3, 0.3, 1}, false));
        nodes.add(new SumNode(7, null, new int[] {2, 5, 6}, new double[] {0.5, 0.3, 0.2}, false));
        CircuitDocument doc = CircuitDocument.builder().name("normal-mixture").variables(vars).nodes(nodes)
                .outputs(List.of(new Output("joint", 7))).build();
        Path file = ReportFixtures.save(doc, "normal-mixture.circuit.json");
        Document page = Jsoup.parse(ReportFixtures.report(file, ReportOptions.defaults("circa test")));
        double[] x = column(page, "inlet_pressure", 0);
        double[] p = column(page, "inlet_pressure", 1);
        assertEquals(MarginalSection.REAL_POINTS, x.length);
        NormalDistribution a = new NormalDistribution(null, -1, 0.8);
        NormalDistribution b = new NormalDistribution(null, 2.5, 0.5);
        NormalDistribution c = new NormalDistribution(null, 1, 1.5);
        for (int k = 0; k < x.length; k++) {
            double expected = 0.5 * a.density(x[k]) + 0.3 * b.density(x[k]) + 0.2 * c.density(x[k]);
            assertEquals(expected, p[k], TOLERANCE * Math.max(1, expected), "density at " + x[k]);
        }
        assertTrue(x[0] < -1 - 5 * 0.8 && x[x.length - 1] > 2.5 + 5 * 0.5, "the range covers the mass");
    }

    @Test
    void pair_regimesPressures_equalsCommonsMathJointDensity() {
        Element table = regimes.selectFirst("div.pair[data-pair=inlet_pressure:outlet_pressure] details table");
        // the regimes as written in the YAML; commons-math3 3.6.1 densities
        MultivariateNormalDistribution n1 = new MultivariateNormalDistribution(null, new double[] {3.1, 5.0},
                new double[][] {{0.04, 0.01}, {0.01, 0.09}});
        NormalDistribution n2a = new NormalDistribution(null, 2.9, Math.sqrt(0.05));
        NormalDistribution n2b = new NormalDistribution(null, 4.8, Math.sqrt(0.06));
        MultivariateNormalDistribution cav = new MultivariateNormalDistribution(null, new double[] {2.2, 4.1},
                new double[][] {{0.25, 0.05}, {0.05, 0.16}});
        NormalDistribution blockedIn = new NormalDistribution(null, 3.6, 0.3);
        LogNormalDistribution blockedOut = new LogNormalDistribution(null, 1.9, 0.1);
        int rows = 0;
        for (Element tr : table.select("tbody tr")) {
            double a = Double.parseDouble(tr.child(0).text());
            double b = Double.parseDouble(tr.child(1).text());
            double v = Double.parseDouble(tr.child(2).text());
            double expected = 0.80 * (0.7 * n1.density(new double[] {a, b}) + 0.3 * n2a.density(a) * n2b.density(b))
                    + 0.15 * cav.density(new double[] {a, b}) + 0.05 * blockedIn.density(a) * blockedOut.density(b);
            assertEquals(expected, v, TOLERANCE * Math.max(1, expected), "joint density at " + a + ", " + b);
            rows++;
        }
        assertEquals(PairSection.REAL_CELLS * PairSection.REAL_CELLS, rows);
    }

    @Test
    void checks_stationsWithNumpyReference_countsEveryRowAndPasses() throws Exception {
        Path file = ReportFixtures.stations();
        Path report = ReportFixtures.reportFile(file, "", List.of(ReportFixtures.stationsReference()),
                "stations.report.html");
        Document page = Jsoup.parse(report.toFile(), "UTF-8");
        Element check = page.selectFirst("#checks div.check");
        long rows = Files.readAllLines(ReportFixtures.stationsReference()).stream()
                .filter(l -> !l.isBlank() && !l.startsWith("#")).count() - 1;
        assertTrue(check.selectFirst("h3").text().endsWith(": passed"));
        assertTrue(check.text().contains("cases " + rows + " passed " + rows + " failed 0"), check.selectFirst("dl").text());
        assertEquals(2, check.select("figure.plot").size(), "scatter and histogram");
        assertFalse(check.select("table").last().select("tbody tr").isEmpty(), "worst cases listed");
    }

    @Test
    void structure_regimes_layersCountEveryNodeAndEdgeDownToTheValidatorsDepth() {
        List<Element> rows = regimes.select("#structure figure details table tbody tr");
        long nodes = 0;
        long edges = 0;
        for (Element tr : rows) {
            nodes += Long.parseLong(tr.child(1).text());
            edges += Long.parseLong(tr.child(5).text());
        }
        // the summary's counts, from the validator
        assertEquals(24, nodes, "every node in one layer");
        assertEquals(24, edges, "every edge leaves one layer");
        assertEquals(4 + 1, rows.size(), "depths 0 to the validator's depth 4");
        assertTrue(regimes.selectFirst("#structure details.dot pre").text().startsWith("digraph"), "the DOT text");
    }

    @Test
    void verdict_certificateStateGiven_shownBesideTheProperties() throws Exception {
        Document page = Jsoup.parse(ReportFixtures.report(ReportFixtures.OUT.resolve("regimes.circuit.json"),
                ReportOptions.defaults("circa test").withCertificateState("matches this file")));
        assertTrue(page.getElementById("verdict").selectFirst("dl.facts").text().equals("certificate matches this file"));
        assertTrue(regimes.getElementById("verdict").select("dl.facts").isEmpty(), "no certificate line without one");
    }

    @Test
    void pairs_badSpecifications_areRefusedWithTheReason() {
        List<Variable> vars = List.of(Variable.of("a", VariableType.REAL), Variable.of("b", VariableType.REAL));
        assertEquals(1, VariablePairs.parse("a:b", vars).size());
        assertTrue(assertThrows(IllegalArgumentException.class, () -> VariablePairs.parse("a:c", vars)).getMessage()
                .contains("no variable \"c\"; expected one of a, b"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> VariablePairs.parse("a-b", vars)).getMessage()
                .contains("not a pair"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> VariablePairs.parse("a:a", vars)).getMessage()
                .contains("with itself"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> VariablePairs.parse("a:b,a:b,a:b,a:b,a:b,a:b,a:b", vars)).getMessage().contains("at most 6"));
    }

    /** Column {@code col} of the numbers table behind variable {@code name}'s marginal. */
    private static double[] column(Document page, String name, int col) {
        Element table = page.selectFirst("div.marginal[data-variable=" + name + "] details table");
        return table.select("tbody tr").stream().mapToDouble(tr -> Double.parseDouble(tr.child(col).text())).toArray();
    }

    private static String sha256(Path file) {
        try {
            return ReportSource.sha256(file);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
