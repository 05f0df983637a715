package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An mvnormal covariance is not symmetric. */
@RuleInfo(id = "CovarianceNotSymmetric", summary = "An mvnormal covariance is not symmetric", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CovarianceNotSymmetric extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.ASYMMETRIC) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
