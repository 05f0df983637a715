package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;
import java.util.List;

/**
 * A product of expressions over disjoint variables ({@code product: [...]}).
 *
 * @param factors the factors in document order (at least one)
 * @param label optional label or {@code null}
 * @param path model path of this expression
 * @param location where this expression's object starts
 */
public record ProductExpr(List<Expression> factors, String label, String path, SourceLocation location)
        implements Expression {
    public ProductExpr {
        factors = List.copyOf(factors);
    }
}
