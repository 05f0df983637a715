package dev.circa.engine.family;

/**
 * Scratch arrays for {@link MvNormal}, sized once for the largest dimension of a circuit so that no
 * evaluation allocates. Not thread-safe: one per evaluator.
 */
public final class MvNormalWorkspace {
    /** The input's values in the order of its variables, NaN where missing; completed by the mode. */
    public final double[] value;
    final int[] observed;
    final int[] missing;
    final double[] factor;
    final double[] solve;

    /** Workspace for inputs of up to {@code maxDimension} variables. */
    public MvNormalWorkspace(int maxDimension) {
        int d = Math.max(maxDimension, 1);
        value = new double[d];
        observed = new int[d];
        missing = new int[d];
        factor = new double[d * d];
        solve = new double[d];
    }
}
