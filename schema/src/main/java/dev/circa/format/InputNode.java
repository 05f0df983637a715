package dev.circa.format;

/**
 * An input node: a distribution over one variable ({@code var}) or, for {@code mvnormal}, several.
 *
 * @param id unique id
 * @param label optional label or {@code null}
 * @param family the family
 * @param vars variable indices (one, except for {@code mvnormal}); callers must not modify
 * @param params parameters in the layout described by {@link Family}; callers must not modify
 * @param logForm {@code true} when a categorical's probabilities were given as {@code logProbs}
 *     (then {@code params} holds the log-probabilities); always {@code false} for other families
 */
public record InputNode(int id, String label, Family family, int[] vars, double[] params, boolean logForm)
        implements Node {
    private static final int[] NONE = new int[0];

    @Override
    public int[] children() {
        return NONE;
    }

    /** The single variable of a one-variable input. */
    public int var() {
        return vars[0];
    }

    /** Value of the scalar parameter {@code name} of this family. */
    public double param(String name) {
        int i = family.parameters().indexOf(name);
        if (i < 0 || !family.isScalar()) {
            throw new IllegalArgumentException(family.jsonName() + " has no scalar parameter " + name);
        }
        return params[i];
    }
}
