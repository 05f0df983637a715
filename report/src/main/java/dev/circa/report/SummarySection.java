package dev.circa.report;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.NodeKind;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.Provenance;
import dev.circa.format.Variable;
import dev.circa.validator.CircuitStats;
import dev.circa.validator.ValidationReport;
import java.util.EnumMap;
import java.util.Map;

/** What the model is: name, description, provenance, the file and its SHA-256, variables, sizes, families, outputs. */
final class SummarySection {
    private SummarySection() {
    }

    static void write(Html html, ReportSource src) {
        CircuitDocument doc = src.document();
        CompiledCircuit c = src.circuit();
        html.section("summary", "Summary");
        Provenance p = doc.provenance();
        CircuitStats s = src.validation().stats();
        int[] kinds = new int[NodeKind.values().length];
        Map<Family, Integer> families = new EnumMap<>(Family.class);
        for (int i = 0; i < c.nodeCount(); i++) {
            kinds[c.kind(i).ordinal()]++;
            if (c.kind(i) == NodeKind.INPUT) {
                families.merge(c.inputFamily(i), 1, Integer::sum);
            }
        }
        StringBuilder fam = new StringBuilder();
        for (Map.Entry<Family, Integer> e : families.entrySet()) {
            fam.append(fam.length() == 0 ? "" : ", ").append(e.getKey().jsonName()).append(" (").append(e.getValue())
                    .append(')');
        }
        html.facts("name", orNone(doc.name()), "description", orNone(doc.description()),
                "produced by", p == null ? "not stated" : orNone(p.producer()),
                "created", p == null ? "not stated" : orNone(p.created()),
                "source", p == null ? "not stated" : orNone(p.source()),
                "file", src.fileName(), "SHA-256 of the file", src.sha256(),
                "variables", Integer.toString(s.variables()),
                "nodes", s.nodes() + " (" + kinds[NodeKind.SUM.ordinal()] + " sums, " + kinds[NodeKind.PRODUCT.ordinal()]
                        + " products, " + kinds[NodeKind.INPUT.ordinal()] + " inputs)",
                "edges", Long.toString(s.edges()), "depth", Integer.toString(s.depth()),
                "families used", fam.length() == 0 ? "none" : fam.toString());
        html.tableHead("Variables", "index", "name", "type", "unit", "states", "description");
        for (int v = 0; v < doc.variables().size(); v++) {
            Variable var = doc.variables().get(v);
            html.row(Integer.toString(v), var.name(), var.type().jsonName(), orNone(var.unit()),
                    var.states().isEmpty() ? "" : String.join(", ", var.states()), orNone(var.description()));
        }
        html.tableEnd();
        ValidationReport r = src.validation();
        html.tableHead("Outputs", "name", "node id", "log Z (0 when normalised)");
        for (int o = 0; o < c.outputCount(); o++) {
            Double z = r.logPartition() == null ? null : r.logPartition().get(c.outputName(o));
            html.row(c.outputName(o), Integer.toString(c.nodeId(c.outputNode(o))), z == null ? "not computed" : Html.num(z));
        }
        html.tableEnd();
        html.endSection();
    }

    static String orNone(String s) {
        return s == null || s.isBlank() ? "not stated" : s;
    }
}
