package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An input refers to a variable index that does not exist. */
@RuleInfo(id = "VariableIndexOutOfRange", summary = "An input refers to a variable index that does not exist", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class VariableIndexOutOfRange extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        int nv = ctx.document().variables().size();
        for (int k = 0; k < g.badVars.size(); k += 2) {
            int i = g.badVars.get(k);
            int p = g.badVars.get(k + 1);
            InputNode in = (InputNode) g.node(i);
            boolean many = in.family() == Family.MVNORMAL;
            ctx.atNode(this, severity(), i, many ? "vars/" + p : "var", String.format(Locale.ROOT,
                    "%s node %d refers to variable %d; expected an index 0..%d of \"variables\"",
                    in.family().jsonName(), in.id(), in.vars()[p], nv - 1));
        }
    }
}
