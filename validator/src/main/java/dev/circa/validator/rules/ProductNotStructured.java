package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.analysis.TreeFinder;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** No variable tree fits every product. */
@RuleInfo(id = "ProductNotStructured", summary = "No variable tree fits every product", severity = Severity.ERROR, guards = Aspect.STRUCTURED_DECOMPOSABLE)
public final class ProductNotStructured extends Rule {
    @Override
    public void check(RuleContext ctx) {
        TreeFinder.Result t = ctx.tree();
        if (t == null || t.tree() != null || t.product() < 0) {
            return;
        }
        ctx.atNode(this, ctx.propertySeverity(Property.STRUCTURED_DECOMPOSABLE), t.product(), null,
                String.format(Locale.ROOT, "the circuit is not structured-decomposable: product %d %s", ctx.graph().id(t.product()), t.reason()));
    }
}
