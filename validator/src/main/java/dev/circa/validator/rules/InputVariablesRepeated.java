package dev.circa.validator.rules;

import dev.circa.format.InputNode;
import java.util.Arrays;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An mvnormal input has fewer than two distinct variables. */
@RuleInfo(id = "InputVariablesRepeated", summary = "An mvnormal input has fewer than two distinct variables", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class InputVariablesRepeated extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.repeatedVars.size(); k++) {
            int i = g.repeatedVars.get(k);
            InputNode in = (InputNode) g.node(i);
            ctx.atNode(this, severity(), i, "vars", String.format(Locale.ROOT,
                    "mvnormal node %d has vars %s; expected 2 or more distinct variable indices",
                    in.id(), Arrays.toString(in.vars())));
        }
    }
}
