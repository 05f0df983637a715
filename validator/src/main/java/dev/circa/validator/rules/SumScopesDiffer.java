package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A sum's children have different scopes. */
@RuleInfo(id = "SumScopesDiffer", summary = "A sum's children have different scopes", severity = Severity.ERROR, guards = Aspect.SMOOTH)
public final class SumScopesDiffer extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Scopes s = ctx.scopes();
        if (s == null) {
            return;
        }
        Graph g = ctx.graph();
        Severity sev = ctx.propertySeverity(Property.SMOOTH);
        for (int k = 0; k < s.nonSmooth.size(); k++) {
            int i = s.nonSmooth.get(k);
            if (ctx.skip(this, sev)) {
                continue;
            }
            int[] w = s.smoothWitness(i);
            ctx.atNode(this, sev, i, null, String.format(Locale.ROOT,
                    "sum %d is not smooth: variable %s is in the scope of child %d but not of child %d; "
                            + "expected all children of a sum to have the same scope",
                    g.id(i), ctx.document().variables().get(w[0]).name(), g.id(w[1]), g.id(w[2])));
        }
    }
}
