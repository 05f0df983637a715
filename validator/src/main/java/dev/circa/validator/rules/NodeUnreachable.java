package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A node is not reachable from any output. */
@RuleInfo(id = "NodeUnreachable", summary = "A node is not reachable from any output", severity = Severity.WARNING, guards = Aspect.REFERENCES)
public final class NodeUnreachable extends Rule {
    @Override
    public void check(RuleContext ctx) {
        if (ctx.graph().outputCount() == 0) {
            return;
        }
        boolean[] r = ctx.reachable();
        for (int i = 0; i < r.length; i++) {
            if (!r[i]) {
            if (ctx.skip(this, severity())) {
                continue;
            }
                ctx.atNode(this, severity(), i, null, String.format(Locale.ROOT,
                        "node %d is not reachable from any output; it adds nothing to the model",
                        ctx.document().nodes().get(i).id()));
            }
        }
    }
}
