package dev.circa.validator.rules;

import dev.circa.format.SumNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A sum does not have one weight per child. */
@RuleInfo(id = "WeightCountMismatch", summary = "A sum does not have one weight per child", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class WeightCountMismatch extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.weightCounts.size(); k++) {
            int i = g.weightCounts.get(k);
            SumNode s = (SumNode) g.node(i);
            ctx.atNode(this, severity(), i, s.logWeights() ? "logWeights" : "weights", String.format(Locale.ROOT,
                    "sum %d has %d children but %d %s; expected one per child, in the same order",
                    s.id(), s.children().length, s.weights().length, s.logWeights() ? "log-weights" : "weights"));
        }
    }
}
