package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** Two nodes have the same id. */
@RuleInfo(id = "DuplicateNodeId", summary = "Two nodes have the same id", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class DuplicateNodeId extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.duplicateIds.size(); k++) {
            int i = g.duplicateIds.get(k);
            int first = g.indexOfId(g.id(i));
            ctx.atNode(this, severity(), i, "id", String.format(Locale.ROOT,
                    "node id %d is already used by the node at /nodes/%d; expected ids unique in the document",
                    g.id(i), first));
        }
    }
}
