package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** An mvnormal covariance is not positive definite. */
@RuleInfo(id = "CovarianceNotPositiveDefinite", summary = "An mvnormal covariance is not positive definite", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CovarianceNotPositiveDefinite extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Parameters facts = ctx.parameters();
        for (int k = 0; k < facts.defectCount(); k++) {
            int i = facts.defect(k);
            // an input without a defect passes (the facts judged every input once, with the same tolerance)
            if (ctx.family(i) == Family.MVNORMAL && ctx.input(i) instanceof InputNode in && Parameters.firstNonFinite(in) < 0
                    && Parameters.asymmetry(in, ctx.options().tolerance()) == null && !Parameters.positiveDefinite(in)
                    && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), i, "cov", String.format(Locale.ROOT, "covariance of mvnormal node %d is "
                        + "not positive definite: its Cholesky factorisation (of the lower triangle) has a pivot <= 0",
                        in.id()));
            }
        }
    }
}
