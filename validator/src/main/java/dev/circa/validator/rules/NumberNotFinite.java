package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A parameter or weight is not a finite number. */
@RuleInfo(id = "NumberNotFinite", summary = "A parameter or weight is not a finite number", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class NumberNotFinite extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.NOT_FINITE) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
