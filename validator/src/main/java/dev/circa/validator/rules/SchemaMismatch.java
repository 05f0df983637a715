package dev.circa.validator.rules;

import dev.circa.validator.SchemaFinding;
import dev.circa.validator.Severity;
import java.util.Locale;

/** The document does not conform to the bundled JSON Schema. */
@RuleInfo(id = "SchemaMismatch", summary = "The document does not conform to the bundled JSON Schema",
        severity = Severity.ERROR, guards = Aspect.DOCUMENT)
public final class SchemaMismatch extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (SchemaFinding f : ctx.schemaFindings()) {
            ctx.at(this, severity(), ctx.locate(f.pointer()), String.format(Locale.ROOT,
                    "the document does not conform to the circuit schema (keyword \"%s\"): %s", f.keyword(), f.message()));
        }
    }
}
