package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** The circuit has no outputs. */
@RuleInfo(id = "OutputsMissing", summary = "The circuit has no outputs", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class OutputsMissing extends Rule {
    @Override
    public void check(RuleContext ctx) {
        if (ctx.document().outputs().isEmpty()) {
            ctx.at(this, severity(), "/outputs", "the circuit has no outputs; expected at least one {\"name\": ..., \"node\": ...}");
        }
    }
}
