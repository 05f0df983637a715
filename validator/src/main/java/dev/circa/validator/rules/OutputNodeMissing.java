package dev.circa.validator.rules;

import dev.circa.format.Output;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An output names a node id that no node has. */
@RuleInfo(id = "OutputNodeMissing", summary = "An output names a node id that no node has", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class OutputNodeMissing extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.missingOutputs.size(); k++) {
            int o = g.missingOutputs.get(k);
            Output out = ctx.document().outputs().get(o);
            ctx.at(this, severity(), "/outputs/" + o, String.format(Locale.ROOT,
                    "output \"%s\" names node %d, but no node has that id; expected the id of a node",
                    out.name(), out.node()));
        }
    }
}
