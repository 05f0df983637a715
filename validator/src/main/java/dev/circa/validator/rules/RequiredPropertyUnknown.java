package dev.circa.validator.rules;

import dev.circa.validator.Property;
import dev.circa.validator.Verdict;
import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** A required property could not be decided. */
@RuleInfo(id = "RequiredPropertyUnknown", summary = "A required property could not be decided", severity = Severity.ERROR, guards = Aspect.PROPERTIES)
public final class RequiredPropertyUnknown extends Rule {
    @Override
    public void check(RuleContext ctx) {
        if (!ctx.graph().usable()) {
            return;
        }
        for (Property p : ctx.options().require()) {
            if (ctx.verdict(p) == Verdict.UNKNOWN) {
                ctx.at(this, severity(), "", String.format(Locale.ROOT,
                        "property %s is required (--require) but could not be decided: %s",
                        p.optionName(), reason(ctx, p)));
            }
        }
    }

    private static String reason(RuleContext ctx, Property p) {
        boolean inputsBad = ctx.parameters().anyProblem() || !ctx.graph().familyTypes.isEmpty()
                || !ctx.graph().repeatedVars.isEmpty();
        if (inputsBad) {
            return "some inputs are invalid (see the errors above)";
        }
        return switch (p) {
            case NORMALIZED -> "log Z is computed in one pass only for smooth, decomposable circuits";
            case DETERMINISTIC -> "some sums are neither separated by one variable nor small enough to enumerate "
                    + "(--max-enumeration)";
            default -> "the references are invalid";
        };
    }
}
