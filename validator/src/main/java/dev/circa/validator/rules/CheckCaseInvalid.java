package dev.circa.validator.rules;

import dev.circa.format.CheckCase;
import dev.circa.validator.Severity;
import java.util.List;

/** An embedded check case names an unknown output or variable, or a value its variable cannot take. */
@RuleInfo(id = "CheckCaseInvalid", summary = "An embedded check case cannot be evaluated",
        severity = Severity.ERROR, guards = Aspect.CHECKS)
public final class CheckCaseInvalid extends Rule {
    @Override
    public void check(RuleContext ctx) {
        if (ctx.document().checks() == null) {
            return;
        }
        List<CheckCase> cases = ctx.document().checks().cases();
        for (int k = 0; k < cases.size(); k++) {
            String problem = CheckRows.problem(ctx.document(), cases.get(k));
            if (problem != null) {
                ctx.at(this, severity(), "/checks/cases/" + k, problem);
            }
        }
    }
}
