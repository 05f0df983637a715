package dev.circa.report;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.regression.CaseResult;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The regression checks: the document's embedded checks and each reference set, each with its pass count, a
 * scatter of computed against reference log-density, a histogram of the errors against the tolerance band,
 * and its worst cases.
 */
final class RegressionSection {
    /** One checked source. */
    record Source(String name, CheckReport report, CaseSample sample) {
    }

    private RegressionSection() {
    }

    /** Runs every check; reference sets are streamed. */
    static List<Source> run(CircuitDocument doc, CompiledCircuit circuit, List<Path> references, ReadLimits limits,
            Tolerance tolerance) throws FormatException {
        List<Source> sources = new ArrayList<>();
        if (doc.checks() != null && !doc.checks().cases().isEmpty()) {
            CaseSample sample = new CaseSample();
            RegressionCheck check = new RegressionCheck(circuit, tolerance, sample);
            check.checkEmbedded(doc);
            sources.add(new Source("embedded checks", check.report(), sample));
        }
        for (Path ref : references) {
            CaseSample sample = new CaseSample();
            RegressionCheck check = new RegressionCheck(circuit, tolerance, sample);
            check.checkReference(ref, limits);
            sources.add(new Source(ref.getFileName().toString(), check.report(), sample));
        }
        return sources;
    }

    static void write(Html html, List<Source> sources, Tolerance tolerance) {
        html.section("checks", "Regression checks");
        html.element("p", String.format(Locale.ROOT, "Each case compares the circuit's log-density with a reference "
                + "value computed elsewhere; it passes when |computed - reference| <= atol + rtol * |reference| "
                + "(atol %s, rtol %s here).", Html.num(tolerance.atol()), Html.num(tolerance.rtol())));
        if (sources.isEmpty()) {
            html.element("p", "None: the file has no embedded checks and no reference set was given "
                    + "(circa report --reference REF.csv). Without them the numbers are not checked against anything.");
            html.endSection();
            return;
        }
        for (Source s : sources) {
            writeSource(html, s, tolerance);
        }
        html.endSection();
    }

    private static void writeSource(Html html, Source s, Tolerance tolerance) {
        CheckReport r = s.report();
        CaseSample c = s.sample();
        html.raw("<div class=\"check\" data-source=\"").text(s.name()).raw("\">\n");
        html.element("h3", s.name() + (r.passed() ? ": passed" : ": FAILED"));
        html.facts("cases", Long.toString(r.cases()), "passed", Long.toString(r.cases() - r.failures()),
                "failed", Long.toString(r.failures()), "largest absolute error", Html.num(r.maxAbsError()),
                "largest relative error", Html.num(r.maxRelError()),
                "exact matches", Long.toString(c.exact), "disagreeing on -inf or NaN", Long.toString(c.nonFinite));

        int n = c.kept();
        String title = "Computed against reference log-density, " + s.name();
        String desc = String.format(Locale.ROOT, "%d of %d finite cases as points; on the diagonal line the circuit "
                + "agrees with the reference.", n, c.seen);
        html.figure("scatter", title, desc, Charts.scatter("reference log-density", "computed log-density",
                c.expected, c.computed, n));
        html.numbers("The numbers behind this plot (" + n + " cases)");
        html.tableHead(title, "reference", "computed", "difference");
        for (int k = 0; k < n; k++) {
            html.row(Html.num(c.expected[k]), Html.num(c.computed[k]), Html.num(c.computed[k] - c.expected[k]));
        }
        html.tableEnd().endNumbers().endFigure();

        double bandLo = Math.log10(tolerance.atol() > 0 ? tolerance.atol() : tolerance.rtol() * c.minAbsExpected);
        double bandHi = Math.log10(tolerance.atol() + tolerance.rtol() * c.maxAbsExpected);
        String hTitle = "Errors against the tolerance band, " + s.name();
        String hDesc = String.format(Locale.ROOT, "How many cases have each size of error, log10 |computed - reference| "
                + "in bins of %s; the shaded band from %s to %s is the allowed error (atol + rtol * |reference|) over "
                + "these references: a case right of its allowance fails. %d exact matches are not drawn.",
                Html.num(CaseSample.BIN), Html.round(bandLo), Html.round(bandHi), c.exact);
        double[] edges = c.edges();
        html.figure("histogram", hTitle, hDesc, Charts.histogram("log10 |computed - reference|", edges, c.bins,
                bandLo, bandHi, "allowed"));
        html.numbers("The numbers behind this plot");
        html.tableHead(hTitle, "from log10 error", "to log10 error", "cases");
        for (int k = 0; k < c.bins.length; k++) {
            html.row(Html.num(edges[k]), Html.num(edges[k + 1]), Long.toString(c.bins[k]));
        }
        html.tableEnd().endNumbers().endFigure();

        html.tableHead("Worst cases, " + s.name() + " (furthest beyond their allowance first)", "verdict", "where",
                "output", "reference", "computed", "absolute error", "relative error");
        for (CaseResult w : r.worst()) {
            String where = w.pointer() != null ? w.pointer() : "row " + w.row() + " (line " + w.line() + ")";
            html.row(w.passed() ? "pass" : "FAIL", where, w.output(), Html.num(w.expected()), Html.num(w.computed()),
                    Html.num(w.absError()), Html.num(w.relError()));
        }
        html.tableEnd();
        html.raw("</div>\n");
    }
}
