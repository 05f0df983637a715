package dev.circa.report;

import dev.circa.engine.ExactMarginals;
import dev.circa.format.io.FormatException;
import dev.circa.validator.Property;
import dev.circa.validator.Verdict;
import dev.circa.validator.regression.Tolerance;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;

/**
 * Writes the model report: one self-contained HTML page (inline SVG and CSS; a content security policy that
 * forbids fetching anything) with, in order, the warning that a valid file is not a good model, the summary,
 * the validator's verdict, the regression checks, every variable's exact marginal, the chosen pairs, and the
 * structure. Every plot has a title, a description and the numbers behind it in a {@code <details>} table.
 */
public final class ModelReport {
    /** Sections in page order: anchor and heading. */
    static final String[][] SECTIONS = {
        {"summary", "Summary"}, {"verdict", "Validator's verdict"}, {"checks", "Regression checks"},
        {"marginals", "Exact marginals"}, {"pairs", "Pairs of variables"}, {"structure", "Structure"}};

    private ModelReport() {
    }

    /**
     * Writes the report of {@code src} to {@code out}. The reference sets are read and checked before anything
     * is written, so a bad reference set leaves {@code out} untouched.
     *
     * @throws IllegalArgumentException when the circuit is not proven smooth and decomposable (its marginals
     *     would not be exact); callers check that first
     * @throws FormatException when a reference set cannot be read
     */
    public static void write(ReportSource src, ReportOptions options, Appendable out) throws IOException, FormatException {
        if (src.validation().property(Property.SMOOTH) != Verdict.TRUE
                || src.validation().property(Property.DECOMPOSABLE) != Verdict.TRUE) {
            throw new IllegalArgumentException("a report needs a circuit proven smooth and decomposable");
        }
        Tolerance tol = options.tolerance() != null ? options.tolerance()
                : Tolerance.resolve(src.document().checks(), null, null);
        List<RegressionSection.Source> checks = RegressionSection.run(src.document(), src.circuit(),
                options.references(), options.limits(), tol);
        ExactMarginals marginals = ExactMarginals.of(src.circuit());
        Html html = new Html(out);
        String name = src.document().name() != null ? src.document().name() : src.fileName();
        try {
            html.raw("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                    .raw("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; "
                            + "style-src 'unsafe-inline'\">\n")
                    .raw("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
                    .raw("<meta name=\"generator\" content=\"").text(options.producer()).raw("\">\n")
                    .raw("<title>").text("Model report: " + name).raw("</title>\n<style>").raw(STYLE).raw("</style>\n")
                    .raw("</head>\n<body>\n<header>\n<h1>").text("Model report: " + name).raw("</h1>\n");
            CautionSection.write(html);
            html.raw("<nav aria-label=\"Sections\"><ol>");
            for (String[] s : SECTIONS) {
                html.raw("<li><a href=\"#" + s[0] + "\">").text(s[1]).raw("</a></li>");
            }
            html.raw("</ol></nav>\n</header>\n<main>\n");
            SummarySection.write(html, src);
            VerdictSection.write(html, src.validation(), options.certificateState());
            RegressionSection.write(html, checks, tol);
            MarginalSection.write(html, marginals);
            PairSection.write(html, marginals, options.pairs());
            StructureSection.write(html, src.circuit());
            html.raw("</main>\n<footer><p>").text("Written by " + options.producer() + " from " + src.fileName()
                    + " (SHA-256 " + src.sha256() + "). The plots are inline SVG; the page fetches nothing.")
                    .raw("</p></footer>\n</body>\n</html>\n");
        } catch (UncheckedIOException e) {
            throw e.getCause();
        }
    }

    private static final String STYLE = """
            body{font-family:system-ui,-apple-system,"Segoe UI",sans-serif;color:#1a1a1a;background:#fff;max-width:60rem;\
            margin:0 auto;padding:1rem 1.5rem;line-height:1.45}
            h1{font-size:1.6rem;margin:.5rem 0}h2{border-bottom:2px solid #1f4e9c;padding-bottom:.2rem;margin-top:2.5rem}
            h3{margin-top:1.5rem}
            .caution{border-left:6px solid #c2571a;background:#fff4ec;padding:.6rem 1rem;margin:1rem 0}
            nav ol{display:flex;flex-wrap:wrap;gap:.3rem 1.5rem;list-style:none;padding-left:0}
            table{border-collapse:collapse;margin:.8rem 0;font-size:.9rem}
            caption{text-align:left;font-weight:600;padding:.2rem 0}
            th,td{border:1px solid #c8c8c8;padding:.2rem .5rem;text-align:left;vertical-align:top}
            th{background:#eef2f8}
            dl.facts{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem}
            dl.facts dt{font-weight:600}dl.facts dd{margin:0;overflow-wrap:anywhere}
            figure.plot{margin:1.2rem 0;break-inside:avoid}figure.plot svg{width:100%;height:auto;max-width:640px;display:block}
            figcaption{font-weight:600;margin-bottom:.3rem}
            details{margin:.3rem 0}summary{cursor:pointer;color:#1f4e9c}
            pre{background:#f6f6f6;padding:.6rem;overflow:auto;font-size:.8rem;max-height:30rem}
            .verdict.valid{color:#2e7d32;font-weight:600}.verdict.invalid{color:#b00020;font-weight:600}
            footer{margin-top:3rem;color:#555;font-size:.85rem}
            @media print{details{display:block}nav{display:none}pre{max-height:none}}
            """;
}
