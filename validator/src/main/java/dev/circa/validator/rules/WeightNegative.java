package dev.circa.validator.rules;

import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import java.util.List;
import java.util.Locale;

/** A sum weight is negative. */
@RuleInfo(id = "WeightNegative", summary = "A sum weight is negative", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class WeightNegative extends Rule {
    @Override
    public void check(RuleContext ctx) {
        List<Node> nodes = ctx.document().nodes();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof SumNode s && !s.logWeights()) {
                double[] w = s.weights();
                for (int j = 0; j < w.length; j++) {
                    if (Double.isFinite(w[j]) && w[j] < 0 && !ctx.skip(this, severity())) {
                        ctx.atNode(this, severity(), i, "weights/" + j, String.format(Locale.ROOT,
                                "weight %d of sum %d is %s; expected a weight >= 0", j, s.id(), Numbers.text(w[j])));
                    }
                }
            }
        }
    }
}
