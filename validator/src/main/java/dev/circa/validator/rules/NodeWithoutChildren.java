package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A product or sum has no children. */
@RuleInfo(id = "NodeWithoutChildren", summary = "A product or sum has no children", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class NodeWithoutChildren extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.childless.size(); k++) {
            int i = g.childless.get(k);
            String kind = ChildNotEarlier.kindName(g, i);
            ctx.atNode(this, severity(), i, kind, String.format(Locale.ROOT,
                    "%s %d has no children; expected at least one", kind, g.id(i)));
        }
    }
}
