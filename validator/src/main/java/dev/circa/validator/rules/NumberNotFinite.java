package dev.circa.validator.rules;

import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;
import java.util.List;

/** A parameter or weight is not a finite number. */
@RuleInfo(id = "NumberNotFinite", summary = "A parameter or weight is not a finite number", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class NumberNotFinite extends Rule {
    @Override
    public void check(RuleContext ctx) {
        List<Node> nodes = ctx.document().nodes();
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i) instanceof InputNode in) {
                int k = Parameters.firstNonFinite(in);
                if (k >= 0) {
                    report(ctx, i, Parameters.member(in, k), String.format(java.util.Locale.ROOT,
                            "parameter %s of %s node %d is %s; expected a finite number", Parameters.member(in, k),
                            in.family().jsonName(), in.id(), Numbers.text(in.params()[k])));
                }
            } else if (nodes.get(i) instanceof SumNode s) {
                double[] w = s.weights();
                String member = s.logWeights() ? "logWeights" : "weights";
                for (int j = 0; j < w.length; j++) {
                    if (!Double.isFinite(w[j])) {
                        report(ctx, i, member + "/" + j, String.format(java.util.Locale.ROOT,
                                "%s %d of sum %d is %s; expected a finite number",
                                s.logWeights() ? "log-weight" : "weight", j, s.id(), Numbers.text(w[j])));
                    }
                }
            }
        }
    }

    private void report(RuleContext ctx, int node, String member, String message) {
        if (!ctx.skip(this, severity())) {
            ctx.atNode(this, severity(), node, member, message);
        }
    }
}
