package dev.circa.validator.rules;

import dev.circa.format.Variable;
import dev.circa.validator.Severity;
import java.util.List;
import java.util.Locale;

/** A variable is named {@code log_density} or {@code output}, the reserved columns of reference sets (FORMAT.md section 5). */
@RuleInfo(id = "VariableNameReserved", summary = "A variable has a name reserved for reference-set columns",
        severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class VariableNameReserved extends Rule {
    @Override
    public void check(RuleContext ctx) {
        List<Variable> vars = ctx.document().variables();
        for (int v = 0; v < vars.size(); v++) {
            String n = vars.get(v).name();
            if (n.equals("log_density") || n.equals("output")) {
                ctx.at(this, severity(), ctx.locate("/variables/" + v + "/name"), String.format(Locale.ROOT,
                        "variable %d is named \"%s\", a column name reserved by reference sets; expected another name",
                        v, n));
            }
        }
    }
}
