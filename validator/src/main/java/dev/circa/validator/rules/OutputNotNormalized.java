package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import dev.circa.validator.analysis.Numbers;
import java.util.Locale;

/** An output does not integrate to 1. */
@RuleInfo(id = "OutputNotNormalized", summary = "An output does not integrate to 1", severity = Severity.ERROR, guards = Aspect.NORMALIZED)
public final class OutputNotNormalized extends Rule {
    @Override
    public void check(RuleContext ctx) {
        if (ctx.logPartition() == null) {
            return;
        }
        Graph g = ctx.graph();
        double tol = ctx.options().tolerance();
        for (int o = 0; o < g.outputCount(); o++) {
            double z = ctx.outputLogPartition(o);
            if (!(Math.abs(z) <= tol)) {
                ctx.at(this, ctx.propertySeverity(Property.NORMALIZED), "/outputs/" + o, String.format(Locale.ROOT,
                        "output \"%s\" has log Z = %s (expected |log Z| <= %s, set by --tolerance); "
                                + "circa normalize rescales it exactly",
                        ctx.document().outputs().get(o).name(), Numbers.text(z), Numbers.text(tol)));
            }
        }
    }
}
