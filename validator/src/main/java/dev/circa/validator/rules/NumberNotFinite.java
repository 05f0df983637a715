package dev.circa.validator.rules;

import dev.circa.format.InputNode;
import dev.circa.format.NodeTable;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Numbers;
import dev.circa.validator.analysis.Parameters;

/** A parameter or weight is not a finite number. */
@RuleInfo(id = "NumberNotFinite", summary = "A parameter or weight is not a finite number", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class NumberNotFinite extends Rule {
    @Override
    public void check(RuleContext ctx) {
        NodeTable t = ctx.document().nodeTable();
        Parameters facts = ctx.parameters();
        // every number of a node without a defect is finite
        for (int d = 0; d < facts.defectCount(); d++) {
            int i = facts.defect(d);
            if (t.kind(i) == NodeTable.INPUT && ctx.input(i) instanceof InputNode in) {
                int k = Parameters.firstNonFinite(in);
                if (k >= 0) {
                    report(ctx, i, Parameters.member(in, k), String.format(java.util.Locale.ROOT,
                            "parameter %s of %s node %d is %s; expected a finite number", Parameters.member(in, k),
                            in.family().jsonName(), in.id(), Numbers.text(in.params()[k])));
                }
            } else if (t.kind(i) == NodeTable.SUM) {
                int a = t.valueStart(i);
                boolean log = t.logForm(i);
                String member = log ? "logWeights" : "weights";
                for (int k = a; k < t.valueEnd(i); k++) {
                    double w = t.value(k);
                    if (!Double.isFinite(w)) {
                        report(ctx, i, member + "/" + (k - a), String.format(java.util.Locale.ROOT,
                                "%s %d of sum %d is %s; expected a finite number",
                                log ? "log-weight" : "weight", k - a, t.id(i), Numbers.text(w)));
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
