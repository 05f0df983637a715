package dev.circa.validator.rules;

import dev.circa.format.ReadFinding;
import dev.circa.validator.Severity;

/**
 * A property the format does not define, outside {@code extensions}: an error in a document of a
 * known version, a warning (and ignored) in one of a newer minor version (FORMAT.md).
 */
@RuleInfo(id = "UnknownProperty", summary = "A property the format does not define, outside extensions",
        severity = Severity.ERROR, guards = Aspect.DOCUMENT)
public final class UnknownProperty extends Rule {
    @Override
    public void check(RuleContext ctx) {
        for (ReadFinding f : ctx.document().findings()) {
            boolean newer = f.kind() == ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR;
            ctx.at(this, newer ? Severity.WARNING : severity(), f.location(),
                    f.message() + (newer ? "" : "; expected only the members the format defines (docs/circuit.md; free-form data goes under \"extensions\")"));
        }
    }
}
