package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A categorical's probabilities do not add to 1. */
@RuleInfo(id = "ProbabilitiesNotNormalized", summary = "A categorical's probabilities do not add to 1", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class ProbabilitiesNotNormalized extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.PROBABILITIES) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
