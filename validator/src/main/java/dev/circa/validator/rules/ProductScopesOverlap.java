package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A product's children share a variable. */
@RuleInfo(id = "ProductScopesOverlap", summary = "A product's children share a variable", severity = Severity.ERROR, guards = Aspect.DECOMPOSABLE)
public final class ProductScopesOverlap extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Scopes s = ctx.scopes();
        if (s == null) {
            return;
        }
        Graph g = ctx.graph();
        Severity sev = ctx.propertySeverity(Property.DECOMPOSABLE);
        for (int k = 0; k < s.overlapping.size(); k++) {
            int i = s.overlapping.get(k);
            if (ctx.skip(this, sev)) {
                continue;
            }
            int[] w = s.overlapWitness(i);
            ctx.atNode(this, sev, i, null, String.format(Locale.ROOT,
                    "product %d is not decomposable: variable %s is in the scopes of both child %d and child %d; "
                            + "expected the children of a product to have disjoint scopes",
                    g.id(i), ctx.document().variables().get(w[0]).name(), g.id(w[1]), g.id(w[2])));
        }
    }
}
