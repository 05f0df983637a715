package dev.circa.validator.rules;

import dev.circa.engine.family.ParameterLimits;
import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Variable;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.Locale;

/** An input parameter is outside its family's range. */
@RuleInfo(id = "ParameterOutOfRange", summary = "An input parameter is outside its family's range", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class ParameterOutOfRange extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Parameters facts = ctx.parameters();
        for (int k = 0; k < facts.defectCount(); k++) {
            int i = facts.defect(k);
            // an input without a defect has every parameter in range
            if (ctx.family(i) != null && ctx.family(i) != Family.MVNORMAL && ctx.input(i) instanceof InputNode in && Parameters.firstNonFinite(in) < 0) {
                if (in.family() == Family.CATEGORICAL) {
                    negativeProbabilities(ctx, i, in);
                } else {
                    outOfRange(ctx, i, in);
                }
            }
        }
    }

    private void negativeProbabilities(RuleContext ctx, int i, InputNode in) {
        for (int k = Parameters.firstNegativeProbability(in, 0); k >= 0; k = Parameters.firstNegativeProbability(in, k + 1)) {
            report(ctx, i, "probs/" + k, "probability %d of categorical node %d is %s; expected >= 0", k, in.id(),
                    Numbers.text(in.params()[k]));
        }
    }

    private void outOfRange(RuleContext ctx, int i, InputNode in) {
        Variable var = Parameters.variable(ctx.document(), in);
        double[] p = in.params();
        String fam = in.family().jsonName();
        for (int k = Parameters.firstOutOfRange(in, var, 0); k >= 0; k = Parameters.firstOutOfRange(in, var, k + 1)) {
            String name = in.family().parameters().get(k);
            String x = Numbers.text(p[k]);
            Limit limit = ParameterLimits.of(in.family()).get(k);
            switch (limit) {
                case PROBABILITY -> report(ctx, i, name, "%s of %s node %d is %s; expected a probability in [0, 1]",
                        name, fam, in.id(), x);
                case POSITIVE -> report(ctx, i, name, "%s of %s node %d is %s; expected a number > 0", name, fam, in.id(), x);
                case COUNT -> report(ctx, i, name, "%s of %s node %d is %s; expected an integer from 0 to 2^53 = 9007199254740992",
                        name, fam, in.id(), x);
                case STATE -> report(ctx, i, name, "%s of %s node %d is %s; expected a state index 0..%d of %s", name, fam,
                        in.id(), x, Parameters.states(var) - 1, var == null ? "its variable" : var.name());
                default -> report(ctx, i, name, "%s of %s node %d is %s; expected %s", name, fam, in.id(), x,
                        limit.name().toLowerCase(Locale.ROOT));
            }
        }
        if (!ParameterLimits.inOrder(in.family(), p)) {
            report(ctx, i, "low", "uniform node %d has low %s and high %s; expected low < high", in.id(),
                    Numbers.text(p[0]), Numbers.text(p[1]));
        }
    }

    private void report(RuleContext ctx, int node, String member, String fmt, Object... args) {
        if (!ctx.skip(this, severity())) {
            ctx.atNode(this, severity(), node, member, String.format(Locale.ROOT, fmt, args));
        }
    }
}
