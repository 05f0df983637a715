package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An mvnormal covariance is not positive definite. */
@RuleInfo(id = "CovarianceNotPositiveDefinite", summary = "An mvnormal covariance is not positive definite", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CovarianceNotPositiveDefinite extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.NOT_PD) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
