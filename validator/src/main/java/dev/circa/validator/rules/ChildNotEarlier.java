package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A child is not listed before its parent. */
@RuleInfo(id = "ChildNotEarlier", summary = "A child is not listed before its parent", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class ChildNotEarlier extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.laterChildren.size(); k += 2) {
            int i = g.laterChildren.get(k);
            int j = g.laterChildren.get(k + 1);
            int cid = g.node(i).children()[j];
            int at = g.indexOfId(cid);
            String kind = kindName(g, i);
            ctx.atNode(this, severity(), i, kind + "/" + j, at == i
                    ? String.format(Locale.ROOT, "%s %d lists itself as a child; expected children listed before "
                            + "their parents", kind, g.id(i))
                    : String.format(Locale.ROOT, "%s %d lists child %d, which is defined later (at /nodes/%d); "
                            + "expected children listed before their parents, so that the graph has no cycle",
                            kind, g.id(i), cid, at));
        }
    }

    static String kindName(Graph g, int i) {
        byte k = g.kind(i);
        return k == Graph.SUM ? "sum" : k == Graph.PRODUCT ? "product" : "input";
    }
}
