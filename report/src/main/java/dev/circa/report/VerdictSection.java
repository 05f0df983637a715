package dev.circa.report;

import dev.circa.validator.Diagnostic;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import dev.circa.validator.rules.Rule;
import dev.circa.validator.rules.Rules;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** The validator's verdict: each property with its proof or its witnesses, the exact queries, every diagnostic. */
final class VerdictSection {
    /** Diagnostics listed at most; the rest are counted. */
    static final int MAX_DIAGNOSTICS = 1000;

    private VerdictSection() {
    }

    static void write(Html html, ValidationReport r, String certificateState) {
        html.section("verdict", "Validator's verdict");
        html.raw("<p class=\"verdict ").raw(r.valid() ? "valid" : "invalid").raw("\">")
                .text(r.valid() ? "Valid: no error diagnostic (" + r.count(Severity.WARNING) + " warnings)."
                        : "Not valid: " + r.count(Severity.ERROR) + " error diagnostics.")
                .raw("</p>\n");
        html.tableHead("Properties", "property", "verdict", "proof or witness");
        for (Property p : Property.values()) {
            Verdict v = r.property(p);
            html.row(p.optionName(), v.toString().toLowerCase(Locale.ROOT), reason(r, p, v));
        }
        html.tableEnd();
        ExactQueries q = r.exactQueries();
        html.tableHead("Exact queries", "query", "exact", "why");
        html.row("density", yes(q.density()), "one pass over valid references");
        html.row("marginal", yes(q.marginal()), "needs smooth and decomposable");
        html.row("conditional", yes(q.conditional()), "needs smooth and decomposable");
        html.row("most probable explanation", yes(q.mpe()), "needs smooth, decomposable and deterministic");
        html.row("sampling", yes(q.sampling()), "needs smooth and decomposable with weights >= 0");
        html.tableEnd();
        if (certificateState != null) {
            html.facts("certificate", certificateState);
        }
        List<Diagnostic> ds = r.diagnostics();
        html.tableHead("Diagnostics (" + ds.size() + ")", "severity", "code", "message", "where");
        for (int k = 0; k < Math.min(ds.size(), MAX_DIAGNOSTICS); k++) {
            Diagnostic d = ds.get(k);
            html.row(d.severity().toString().toLowerCase(Locale.ROOT), d.code(), d.message(), where(d));
        }
        html.tableEnd();
        if (ds.size() > MAX_DIAGNOSTICS) {
            html.element("p", (ds.size() - MAX_DIAGNOSTICS) + " more diagnostics are not listed; circa validate lists them all.");
        }
        html.endSection();
    }

    private static String where(Diagnostic d) {
        String at = d.pointer() == null || d.pointer().isEmpty() ? "document" : d.pointer();
        if (d.node() != null) {
            at += ", node " + d.node();
        }
        return at + (d.hasLineColumn() ? ", line " + d.line() + ", column " + d.column() : ", line and column unknown");
    }

    /** The proof when proven, the witnesses (diagnostics of the rules guarding it) when refuted. */
    private static String reason(ValidationReport r, Property p, Verdict v) {
        if (v == Verdict.FALSE) {
            List<String> witnesses = new ArrayList<>();
            for (Diagnostic d : r.diagnostics()) {
                Rule rule = Rules.byId(d.code());
                if (rule != null && rule.guards().property() == p && witnesses.size() < 3) {
                    witnesses.add(d.message());
                }
            }
            return witnesses.isEmpty() ? "refuted (see the diagnostics)" : "witness: " + String.join("; ", witnesses);
        }
        if (v == Verdict.UNKNOWN) {
            return switch (p) {
                case DETERMINISTIC -> "neither proven by the sufficient conditions nor refuted by enumeration within "
                        + "the enumeration limit";
                case NORMALIZED -> "log Z could not be computed in one pass (the circuit is not smooth and decomposable)";
                default -> "not decided";
            };
        }
        return switch (p) {
            case SMOOTH -> "every sum's children have the same scope (checked on every sum)";
            case DECOMPOSABLE -> "every product's children have pairwise disjoint scopes (checked on every product)";
            case DETERMINISTIC -> "at most one child of each sum is positive at any assignment (sufficient conditions "
                    + "or enumeration of the sum's scope)";
            case STRUCTURED_DECOMPOSABLE -> "every product fits the variable tree "
                    + (r.variableTree() == null ? "" : r.variableTree().toString() + " (variable indices)");
            case NORMALIZED -> "every output's log Z is within the tolerance of 0: " + (r.logPartition() == null ? ""
                    : r.logPartition().toString());
        };
    }

    private static String yes(boolean b) {
        return b ? "yes" : "no";
    }
}
