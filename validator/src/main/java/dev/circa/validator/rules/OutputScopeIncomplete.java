package dev.circa.validator.rules;

import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An output's scope does not cover every variable. */
@RuleInfo(id = "OutputScopeIncomplete", summary = "An output's scope does not cover every variable", severity = Severity.WARNING, guards = Aspect.REFERENCES)
public final class OutputScopeIncomplete extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Scopes s = ctx.scopes();
        if (s == null) {
            return;
        }
        Graph g = ctx.graph();
        int nv = ctx.document().variables().size();
        for (int o = 0; o < g.outputCount(); o++) {
            int[] vars = s.vars(g.outputNode(o));
            if (vars.length < nv) {
                int missing = 0;
                while (missing < vars.length && vars[missing] == missing) {
                    missing++;
                }
                ctx.at(this, severity(), "/outputs/" + o, String.format(Locale.ROOT,
                        "output \"%s\" covers %d of %d variables (not %s, for one); expected every variable in its scope",
                        ctx.document().outputs().get(o).name(), vars.length, nv,
                        ctx.document().variables().get(missing).name()));
            }
        }
    }
}
