package dev.circa.validator.rules;

import dev.circa.format.NodeTable;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** A sum weight is negative. */
@RuleInfo(id = "WeightNegative", summary = "A sum weight is negative", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class WeightNegative extends Rule {
    @Override
    public void check(RuleContext ctx) {
        NodeTable t = ctx.document().nodeTable();
        Parameters facts = ctx.parameters();
        // a sum without a defect has no negative weight
        for (int d = 0; d < facts.defectCount(); d++) {
            int i = facts.defect(d);
            if (t.kind(i) == NodeTable.SUM && !t.logForm(i)) {
                int a = t.valueStart(i);
                for (int k = a; k < t.valueEnd(i); k++) {
                    double w = t.value(k);
                    if (Double.isFinite(w) && w < 0 && !ctx.skip(this, severity())) {
                        ctx.atNode(this, severity(), i, "weights/" + (k - a), String.format(Locale.ROOT,
                                "weight %d of sum %d is %s; expected a weight >= 0", k - a, t.id(i), Numbers.text(w)));
                    }
                }
            }
        }
    }
}
