package dev.circa.validator.rules;

import dev.circa.format.Variable;
import dev.circa.validator.Severity;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/** Two variables have the same name (FORMAT.md: names are unique; data and checks refer to them by name). */
@RuleInfo(id = "VariableNameDuplicate", summary = "Two variables have the same name", severity = Severity.ERROR,
        guards = Aspect.REFERENCES)
public final class VariableNameDuplicate extends Rule {
    @Override
    public void check(RuleContext ctx) {
        List<Variable> vars = ctx.document().variables();
        Map<String, Integer> first = new HashMap<>();
        for (int v = 0; v < vars.size(); v++) {
            Integer at = first.putIfAbsent(vars.get(v).name(), v);
            if (at != null && !ctx.skip(this, severity())) {
                ctx.at(this, severity(), ctx.locate("/variables/" + v), String.format(Locale.ROOT,
                        "variable %d is named \"%s\" like variable %d; expected unique variable names",
                        v, vars.get(v).name(), at));
            }
        }
    }
}
