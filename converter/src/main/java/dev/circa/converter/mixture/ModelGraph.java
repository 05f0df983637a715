package dev.circa.converter.mixture;

import dev.circa.format.SourceLocation;
import dev.circa.format.io.FormatException;
import dev.circa.format.mixture.Definition;
import dev.circa.format.mixture.Expression;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureExpr;
import dev.circa.format.mixture.ProductExpr;
import dev.circa.format.mixture.UseExpr;
import java.util.ArrayList;
import java.util.IdentityHashMap;
import java.util.List;

/**
 * The expressions of a mixture document reachable from its model, each once, children first, with
 * {@code use} resolved: every use of a definition points at the definition's one item. Built by an
 * explicit-stack depth-first search, which also finds {@code use} cycles. Immutable once built.
 */
final class ModelGraph {
    private final MixtureDocument document;
    private final List<Expression> items;
    private final int[][] children;
    private final int root;
    private final IdentityHashMap<Expression, String> definitionRoots;

    private ModelGraph(MixtureDocument document, List<Expression> items, int[][] children, int root,
            IdentityHashMap<Expression, String> definitionRoots) {
        this.document = document;
        this.items = items;
        this.children = children;
        this.root = root;
        this.definitionRoots = definitionRoots;
    }

    /**
     * Orders the document's reachable expressions.
     *
     * @throws FormatException on a {@code use} cycle, at the use that closes it
     */
    static ModelGraph of(MixtureDocument doc) throws FormatException {
        IdentityHashMap<Expression, Integer> state = new IdentityHashMap<>();
        IdentityHashMap<Expression, Integer> index = new IdentityHashMap<>();
        List<Expression> items = new ArrayList<>();
        List<int[]> kids = new ArrayList<>();
        List<Expression> stackExpr = new ArrayList<>();
        List<List<Expression>> stackKids = new ArrayList<>();
        int[] stackNext = new int[16];
        push(doc, doc.model(), stackExpr, stackKids, state);
        while (!stackExpr.isEmpty()) {
            int top = stackExpr.size() - 1;
            Expression e = stackExpr.get(top);
            List<Expression> k = stackKids.get(top);
            if (stackNext.length <= top) {
                stackNext = java.util.Arrays.copyOf(stackNext, stackNext.length * 2);
            }
            if (stackNext[top] < k.size()) {
                Expression c = k.get(stackNext[top]++);
                Integer s = state.get(c);
                if (s == null) {
                    if (stackNext.length <= top + 1) {
                        stackNext = java.util.Arrays.copyOf(stackNext, stackNext.length * 2);
                    }
                    stackNext[top + 1] = 0;
                    push(doc, c, stackExpr, stackKids, state);
                } else if (s == 1) {
                    throw cycle(doc, stackExpr, c);
                }
                continue;
            }
            stackExpr.remove(top);
            stackKids.remove(top);
            state.put(e, 2);
            if (e instanceof UseExpr) {
                index.put(e, index.get(k.get(0)));
            } else {
                int[] ci = new int[k.size()];
                for (int j = 0; j < ci.length; j++) {
                    ci[j] = index.get(k.get(j));
                }
                index.put(e, items.size());
                items.add(e);
                kids.add(ci);
            }
        }
        IdentityHashMap<Expression, String> roots = new IdentityHashMap<>();
        for (Definition d : doc.definitions().values()) {
            roots.putIfAbsent(d.expression(), d.name());
        }
        return new ModelGraph(doc, List.copyOf(items), kids.toArray(new int[0][]), index.get(doc.model()), roots);
    }

    private static void push(MixtureDocument doc, Expression e, List<Expression> stackExpr,
            List<List<Expression>> stackKids, IdentityHashMap<Expression, Integer> state) {
        state.put(e, 1);
        stackExpr.add(e);
        stackKids.add(childrenOf(doc, e));
    }

    /** The direct sub-expressions, a use's being its definition's expression. */
    static List<Expression> childrenOf(MixtureDocument doc, Expression e) {
        if (e instanceof MixtureExpr m) {
            List<Expression> l = new ArrayList<>(m.entries().size());
            for (var entry : m.entries()) {
                l.add(entry.expression());
            }
            return l;
        }
        if (e instanceof ProductExpr p) {
            return p.factors();
        }
        if (e instanceof UseExpr u) {
            return List.of(doc.definitions().get(u.name()).expression());
        }
        return List.of();
    }

    private static FormatException cycle(MixtureDocument doc, List<Expression> stack, Expression back) {
        int from = 0;
        for (int i = 0; i < stack.size(); i++) {
            if (stack.get(i) == back) {
                from = i;
            }
        }
        List<String> names = new ArrayList<>();
        for (Definition d : doc.definitions().values()) {
            if (d.expression() == back) {
                names.add(d.name());
            }
        }
        for (int i = from + 1; i < stack.size(); i++) {
            if (stack.get(i) instanceof UseExpr u) {
                names.add(u.name());
            }
        }
        UseExpr closing = (UseExpr) stack.get(stack.size() - 1);
        SourceLocation l = closing.location();
        return new FormatException(doc.source(), l.line(), l.column(), closing.path(),
                "a use cycle: " + String.join(" uses ", names) + "; a definition may not use itself, "
                        + "directly or through others");
    }

    MixtureDocument document() {
        return document;
    }

    /** The reachable expressions (no {@code use}), children before parents. */
    List<Expression> items() {
        return items;
    }

    /** Item indices of item {@code i}'s sub-expressions, in document order. */
    int[] children(int i) {
        return children[i];
    }

    /** The model's item. */
    int root() {
        return root;
    }

    /** The definition name when item {@code e} is a definition's expression, else {@code null}. */
    String definitionName(Expression e) {
        return definitionRoots.get(e);
    }

    /** Number of items. */
    int size() {
        return items.size();
    }
}
