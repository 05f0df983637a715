package dev.circa.validator.rules;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An input's family does not accept its variable's type. */
@RuleInfo(id = "FamilyTypeMismatch", summary = "An input's family does not accept its variable's type", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class FamilyTypeMismatch extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.familyTypes.size(); k++) {
            int i = g.familyTypes.get(k);
            InputNode in = (InputNode) g.node(i);
            for (int v : in.vars()) {
                Variable var = ctx.document().variables().get(v);
                if (!in.family().accepts(var.type())) {
                    ctx.atNode(this, severity(), i, "input", String.format(Locale.ROOT,
                            "%s node %d is over %s, a %s variable; expected a variable of type %s",
                            in.family().jsonName(), in.id(), var.name(), var.type().name().toLowerCase(Locale.ROOT),
                            types(in.family())));
                    break;
                }
            }
        }
    }

    private static String types(Family f) {
        StringBuilder sb = new StringBuilder();
        for (VariableType t : f.acceptedTypes()) {
            if (sb.length() > 0) {
                sb.append(" or ");
            }
            sb.append(t.name().toLowerCase(Locale.ROOT));
        }
        return sb.toString();
    }
}
