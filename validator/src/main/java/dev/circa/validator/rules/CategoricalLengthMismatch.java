package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Variable;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** A categorical does not have one probability per state. */
@RuleInfo(id = "CategoricalLengthMismatch", summary = "A categorical does not have one probability per state", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CategoricalLengthMismatch extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Parameters facts = ctx.parameters();
        for (int k = 0; k < facts.defectCount(); k++) {
            int i = facts.defect(k);
            // an input without a defect passes (the facts judged every input once, with the same tolerance)
            if (ctx.family(i) == Family.CATEGORICAL && ctx.input(i) instanceof InputNode in
                    && Parameters.firstNonFinite(in) < 0) {
                Variable var = Parameters.variable(ctx.document(), in);
                if (Parameters.lengthMismatch(in, var) && !ctx.skip(this, severity())) {
                    ctx.atNode(this, severity(), i, in.logForm() ? "logProbs" : "probs", String.format(Locale.ROOT,
                            "categorical node %d has %d %s; expected one per state of %s (%d)", in.id(),
                            in.params().length, in.logForm() ? "log-probabilities" : "probabilities", var.name(),
                            var.stateCount()));
                }
            }
        }
    }
}
