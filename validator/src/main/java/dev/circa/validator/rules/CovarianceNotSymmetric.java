package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** An mvnormal covariance is not symmetric. */
@RuleInfo(id = "CovarianceNotSymmetric", summary = "An mvnormal covariance is not symmetric", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CovarianceNotSymmetric extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Parameters facts = ctx.parameters();
        for (int k = 0; k < facts.defectCount(); k++) {
            int i = facts.defect(k);
            // an input without a defect passes (the facts judged every input once, with the same tolerance)
            if (ctx.family(i) == Family.MVNORMAL && ctx.input(i) instanceof InputNode in && Parameters.firstNonFinite(in) < 0) {
                double tol = ctx.options().tolerance();
                int[] rc = Parameters.asymmetry(in, tol);
                if (rc != null && !ctx.skip(this, severity())) {
                    int d = in.vars().length;
                    int r = rc[0];
                    int c = rc[1];
                    double max = Parameters.covarianceScale(in);
                    ctx.atNode(this, severity(), i, "cov/" + c + "/" + r, String.format(Locale.ROOT,
                            "covariance of mvnormal node %d has cov[%d][%d] = %s but cov[%d][%d] = %s "
                                    + "(expected equal within %s * max|cov| = %s, set by --tolerance)",
                            in.id(), r, c, Numbers.text(in.params()[d + r * d + c]), c, r,
                            Numbers.text(in.params()[d + c * d + r]), Numbers.text(tol), Numbers.text(tol * max)));
                }
            }
        }
    }
}
