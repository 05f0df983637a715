package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.validator.CircuitStats;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.format.io.FormatException;
import dev.circa.model.CheckedCircuit;
import dev.circa.model.Requirement;
import dev.circa.validator.ValidationReport;
import dev.circa.model.Model;
import dev.circa.validator.Verdict;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.EnumMap;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code circa inspect}: sizes, depth, families, outputs, properties, variable tree and exact queries. */
@Command(name = "inspect", mixinStandardHelpOptions = true,
        description = "Sizes, depth, families, outputs and their scopes, properties, variable tree and exact queries.")
final class InspectCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file.")
    Path circuitFile;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        // described whatever its verdict: read and validated by the model API's loader, nothing required
        CircuitDocument doc;
        ValidationReport report;
        if (read.certified()) {
            Model m = read.loadCertified(circuitFile, Requirement.parse(""));
            doc = m.document();
            report = CircuitReadOptions.reportWithLogZ(m);
        } else {
            CheckedCircuit checked;
            try {
                checked = read.loader().withRequirement(Requirement.parse("")).check(circuitFile);
            } catch (FormatException e) {
                throw ConvertibleDocument.explain(circuitFile, e, read.limits());
            }
            doc = checked.document();
            report = checked.report();
        }
        PrintWriter out = read.out();
        CircuitStats s = report.stats();
        int inputs = 0;
        int products = 0;
        int sums = 0;
        Map<Family, Integer> families = new EnumMap<>(Family.class);
        for (Node n : doc.nodes()) {
            if (n instanceof InputNode in) {
                inputs++;
                families.merge(in.family(), 1, Integer::sum);
            } else if (n instanceof ProductNode) {
                products++;
            } else if (n instanceof SumNode) {
                sums++;
            }
        }
        out.printf(Locale.ROOT, "%s%s%n", circuitFile, doc.name() == null ? "" : " (" + doc.name() + ")");
        out.printf(Locale.ROOT, "  variables: %d%n", s.variables());
        out.printf(Locale.ROOT, "  nodes:     %d (%s, %s, %s)%n", s.nodes(), Counts.of(inputs, "input"),
                Counts.of(products, "product"), Counts.of(sums, "sum"));
        out.printf(Locale.ROOT, "  edges:     %d%n", s.edges());
        out.printf(Locale.ROOT, "  depth:     %d%n", s.depth());
        StringBuilder fam = new StringBuilder();
        for (Map.Entry<Family, Integer> e : families.entrySet()) {
            fam.append(fam.length() == 0 ? "" : ", ").append(e.getKey().jsonName()).append(' ').append(e.getValue());
        }
        out.printf(Locale.ROOT, "  families:  %s%n", fam);
        out.println("  outputs:");
        for (Output o : doc.outputs()) {
            Double z = report.logPartition() == null ? null : report.logPartition().get(o.name());
            out.printf(Locale.ROOT, "    %s = node %d%s%n", o.name(), o.node(),
                    z == null ? "" : ", log Z = " + z);
        }
        out.println("  properties:");
        for (Property p : Property.values()) {
            out.printf(Locale.ROOT, "    %-24s %s%n", p.optionName(), report.property(p).toString().toLowerCase(Locale.ROOT));
        }
        out.printf(Locale.ROOT, "  variable tree: %s%n", report.variableTree() != null ? report.variableTree().toString()
                : report.property(Property.STRUCTURED_DECOMPOSABLE) == Verdict.TRUE ? "not kept in the certificate"
                : "none (not structured-decomposable)");
        ExactQueries q = report.exactQueries();
        out.printf(Locale.ROOT, "  exact queries: density %s, marginal %s, conditional %s, mpe %s, sampling %s%n",
                yes(q.density()), yes(q.marginal()), yes(q.conditional()), yes(q.mpe()), yes(q.sampling()));
        out.printf(Locale.ROOT, "  diagnostics: %s%n", read.certified() ? "not looked for again (certified)"
                : report.diagnostics().size() + " (run circa validate for them)");
        out.flush();
        return ExitStatus.OK;
    }

    private static String yes(boolean b) {
        return b ? "yes" : "no";
    }
}
