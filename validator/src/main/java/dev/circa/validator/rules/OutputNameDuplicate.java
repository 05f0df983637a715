package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import dev.circa.validator.analysis.Graph;
import java.util.Locale;

/** Two outputs have the same name. */
@RuleInfo(id = "OutputNameDuplicate", summary = "Two outputs have the same name", severity = Severity.ERROR, guards = Aspect.REFERENCES)
public final class OutputNameDuplicate extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Graph g = ctx.graph();
        for (int k = 0; k < g.duplicateOutputNames.size(); k++) {
            int o = g.duplicateOutputNames.get(k);
            ctx.at(this, severity(), "/outputs/" + o, String.format(Locale.ROOT,
                    "output name \"%s\" is used by an earlier output; expected unique output names",
                    ctx.document().outputs().get(o).name()));
        }
    }
}
