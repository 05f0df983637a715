package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** A categorical's probabilities do not add to 1. */
@RuleInfo(id = "ProbabilitiesNotNormalized", summary = "A categorical's probabilities do not add to 1", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class ProbabilitiesNotNormalized extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Parameters facts = ctx.parameters();
        for (int k = 0; k < facts.defectCount(); k++) {
            int i = facts.defect(k);
            // an input without a defect passes (the facts judged every input once, with the same tolerance)
            if (ctx.family(i) == Family.CATEGORICAL && ctx.input(i) instanceof InputNode in
                    && Parameters.firstNonFinite(in) < 0 && Parameters.firstNegativeProbability(in, 0) < 0) {
                double tol = ctx.options().tolerance();
                double sum = Parameters.probabilityMass(in);
                if (!(Math.abs(sum - 1) <= tol) && !ctx.skip(this, severity())) {
                    ctx.atNode(this, severity(), i, in.logForm() ? "logProbs" : "probs", String.format(Locale.ROOT,
                            "%s of categorical node %d add to %s (expected 1 +/- %s, set by --tolerance)",
                            in.logForm() ? "exp(logProbs)" : "probabilities", in.id(), Numbers.text(sum),
                            Numbers.text(tol)));
                }
            }
        }
    }
}
