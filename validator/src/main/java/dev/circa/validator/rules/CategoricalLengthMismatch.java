package dev.circa.validator.rules;

import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A categorical does not have one probability per state. */
@RuleInfo(id = "CategoricalLengthMismatch", summary = "A categorical does not have one probability per state", severity = Severity.ERROR, guards = Aspect.PARAMETERS)
public final class CategoricalLengthMismatch extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (Parameters.Problem p : ctx.parameters().problems()) {
            if (p.code().equals(Parameters.LENGTH) && !ctx.skip(this, severity())) {
                ctx.atNode(this, severity(), p.node(), p.member(), p.message());
            }
        }
    }
}
