package dev.circa.report;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.Locale;

/**
 * Writes the page's HTML to an {@link Appendable} as it goes (sections of a large model are not held in
 * memory all at once): escaping, elements, tables and figures with their text alternative.
 */
final class Html {
    private final Appendable out;
    private int ids;

    Html(Appendable out) {
        this.out = out;
    }

    /** Escapes text for element content and attribute values. */
    static String escape(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder sb = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> sb.append("&amp;");
                case '<' -> sb.append("&lt;");
                case '>' -> sb.append("&gt;");
                case '"' -> sb.append("&quot;");
                case '\'' -> sb.append("&#39;");
                default -> sb.append(c);
            }
        }
        return sb.toString();
    }

    /** A number as the page shows it: exactly ({@link Double#toString}), and -inf, inf or NaN spelled out. */
    static String num(double d) {
        if (Double.isNaN(d)) {
            return "NaN";
        }
        if (Double.isInfinite(d)) {
            return d > 0 ? "inf" : "-inf";
        }
        return Double.toString(d);
    }

    /** A number rounded to 4 significant digits, for prose. */
    static String round(double d) {
        if (!Double.isFinite(d)) {
            return num(d);
        }
        return String.format(Locale.ROOT, "%.4g", d);
    }

    /** A fresh id, unique in the page. */
    String id(String prefix) {
        return prefix + "-" + (++ids);
    }

    /** Appends raw markup. */
    Html raw(String markup) {
        try {
            out.append(markup);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return this;
    }

    /** Appends escaped text. */
    Html text(String s) {
        return raw(escape(s));
    }

    /** {@code <tag>text</tag>} with escaped text. */
    Html element(String tag, String text) {
        return raw("<" + tag + ">").text(text).raw("</" + tag + ">\n");
    }

    /** Opens a section with its heading and anchor. */
    Html section(String id, String heading) {
        return raw("<section id=\"" + id + "\">\n<h2>").text(heading).raw("</h2>\n");
    }

    Html endSection() {
        return raw("</section>\n");
    }

    /** A table header row. */
    Html tableHead(String caption, String... columns) {
        raw("<table>");
        if (caption != null) {
            raw("<caption>").text(caption).raw("</caption>");
        }
        raw("<thead><tr>");
        for (String c : columns) {
            raw("<th scope=\"col\">").text(c).raw("</th>");
        }
        return raw("</tr></thead>\n<tbody>\n");
    }

    /** One table row of escaped cells. */
    Html row(String... cells) {
        raw("<tr>");
        for (String c : cells) {
            raw("<td>").text(c).raw("</td>");
        }
        return raw("</tr>\n");
    }

    Html tableEnd() {
        return raw("</tbody></table>\n");
    }

    /** Two-column key/value rows in a definition list. */
    Html facts(String... keyValues) {
        raw("<dl class=\"facts\">");
        for (int i = 0; i + 1 < keyValues.length; i += 2) {
            raw("<dt>").text(keyValues[i]).raw("</dt><dd>").text(keyValues[i + 1]).raw("</dd>");
        }
        return raw("</dl>\n");
    }

    /**
     * Opens a figure: its title as caption and the chart's SVG with a title and description for assistive
     * technology; close it with {@link #endFigure()} after writing the numbers behind it (see {@link #numbers}).
     */
    Html figure(String kind, String title, String description, String svg) {
        String fid = id("fig");
        raw("<figure class=\"plot\" data-plot=\"" + escape(kind) + "\" id=\"" + fid + "\">\n<figcaption>")
                .text(title).raw("</figcaption>\n");
        raw(Charts.accessible(svg, fid, title, description)).raw("\n");
        return this;
    }

    /** Opens the {@code <details>} block that holds the numbers behind a figure. */
    Html numbers(String summary) {
        return raw("<details><summary>").text(summary).raw("</summary>\n");
    }

    Html endNumbers() {
        return raw("</details>\n");
    }

    Html endFigure() {
        return raw("</figure>\n");
    }
}
