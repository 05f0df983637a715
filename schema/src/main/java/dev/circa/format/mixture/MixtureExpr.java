package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;
import java.util.List;

/**
 * A weighted mixture of expressions ({@code mixture: [...]}).
 *
 * @param entries the components with their weights, in document order (at least one)
 * @param label optional label or {@code null}
 * @param path model path of this expression
 * @param location where this expression's object starts
 */
public record MixtureExpr(List<MixtureEntry> entries, String label, String path, SourceLocation location)
        implements Expression {
    public MixtureExpr {
        entries = List.copyOf(entries);
    }
}
