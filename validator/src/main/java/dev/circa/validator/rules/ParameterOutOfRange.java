package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** An input parameter is outside its family's range. */
@RuleInfo(id = "ParameterOutOfRange", summary = "An input parameter is outside its family's range", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class ParameterOutOfRange extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.OUT_OF_RANGE) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
