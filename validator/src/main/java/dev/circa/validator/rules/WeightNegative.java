package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A sum weight is negative. */
@RuleInfo(id = "WeightNegative", summary = "A sum weight is negative", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class WeightNegative extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.NEGATIVE_WEIGHT) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
