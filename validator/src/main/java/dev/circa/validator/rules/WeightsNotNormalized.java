package dev.circa.validator.rules;

import dev.circa.format.NodeTable;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** A sum's weights do not add to 1. */
@RuleInfo(id = "WeightsNotNormalized", summary = "A sum's weights do not add to 1", severity = Severity.WARNING, guards = Aspect.NORMALIZED)
public final class WeightsNotNormalized extends Rule {
    @Override
    public void check(RuleContext ctx) {
        double tol = ctx.options().tolerance();
        Severity sev = null;
        NodeTable t = ctx.document().nodeTable();
        Parameters facts = ctx.parameters();
        // the facts recorded, once and with the same tolerance, the sums whose total is off 1
        for (int k = 0; k < facts.offOneCount(); k++) {
            int i = facts.offOne(k);
            boolean log = t.logForm(i);
            double sum = facts.offOneTotal(k);
            if (sev == null) {
                // CLI.md: a warning when every output's |log Z| is within the tolerance, else an error.
                sev = ctx.outputsNormalized() ? Severity.WARNING : Severity.ERROR;
            }
            if (ctx.skip(this, sev)) {
                continue;
            }
            ctx.atNode(this, sev, i, log ? "logWeights" : "weights", String.format(Locale.ROOT,
                    "weights of sum %d add to %s (expected 1 +/- %s, set by --tolerance)",
                    t.id(i), Numbers.text(sum), Numbers.text(tol)));
        }
    }
}
