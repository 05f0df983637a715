package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.analysis.Determinism;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** Two children of a sum are positive at the same assignment. */
@RuleInfo(id = "SumNotDeterministic", summary = "Two children of a sum are positive at the same assignment", severity = Severity.ERROR, guards = Aspect.DETERMINISTIC)
public final class SumNotDeterministic extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Determinism d = ctx.determinism();
        if (d == null) {
            return;
        }
        Graph g = ctx.graph();
        Severity sev = ctx.propertySeverity(Property.DETERMINISTIC);
        int n = d.falseSums().size();
        for (int k = 0; k < n; k++) {
            int[] f = d.falseSums().get(k);
            if (ctx.skip(this, sev)) {
                // every later one is dropped as well
                ctx.skipAlso(this, sev, n - k - 1);
                break;
            }
            ctx.atNode(this, sev, f[0], null, String.format(Locale.ROOT,
                    "sum %d is not deterministic: children %d and %d are both positive at %s; "
                            + "expected at most one positive child at every assignment",
                    g.id(f[0]), g.id(f[1]), g.id(f[2]), d.witness(k)));
        }
    }
}
