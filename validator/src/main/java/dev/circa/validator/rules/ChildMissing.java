package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A child id names no node. */
@RuleInfo(id = "ChildMissing", summary = "A child id names no node", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class ChildMissing extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.missingChildren.size(); k += 2) {
            int i = g.missingChildren.get(k);
            int j = g.missingChildren.get(k + 1);
            String kind = ChildNotEarlier.kindName(g, i);
            ctx.atNode(this, severity(), i, kind + "/" + j, String.format(Locale.ROOT,
                    "%s %d lists child %d, but no node has that id; expected the id of an earlier node",
                    kind, g.id(i), g.node(i).children()[j]));
        }
    }
}
