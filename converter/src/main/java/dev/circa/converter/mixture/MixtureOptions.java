package dev.circa.converter.mixture;

/**
 * How {@link MixtureConverter} converts and verifies.
 *
 * @param normalizeWeights rescale mixture weights that do not add to 1 (otherwise they are an error)
 * @param verifyPoints points sampled from the source for verification (each also compared with random
 *     variables missing); 0 skips verification
 * @param atol absolute tolerance on log-densities
 * @param rtol relative tolerance on log-densities
 * @param seed seed of the verification sample
 */
public record MixtureOptions(boolean normalizeWeights, int verifyPoints, double atol, double rtol, long seed) {
    /** No rescaling, 1000 points, tolerances 1e-9 and 1e-9, seed 0 (CLI.md, {@code convert}). */
    public static final MixtureOptions DEFAULT = new MixtureOptions(false, 1000, 1e-9, 1e-9, 0L);

    public MixtureOptions {
        if (verifyPoints < 0) {
            throw new IllegalArgumentException("verifyPoints must be >= 0, got " + verifyPoints);
        }
        if (!(atol >= 0) || !(rtol >= 0)) {
            throw new IllegalArgumentException("tolerances must be >= 0");
        }
    }

    /** These options with {@code normalizeWeights} set to {@code v}. */
    public MixtureOptions withNormalizeWeights(boolean v) {
        return new MixtureOptions(v, verifyPoints, atol, rtol, seed);
    }

    /** These options verifying at {@code v} sampled points (0 skips verification). */
    public MixtureOptions withVerifyPoints(int v) {
        return new MixtureOptions(normalizeWeights, v, atol, rtol, seed);
    }

    /** These options with absolute tolerance {@code a} and relative tolerance {@code r}. */
    public MixtureOptions withTolerances(double a, double r) {
        return new MixtureOptions(normalizeWeights, verifyPoints, a, r, seed);
    }

    /** These options with verification seed {@code v}. */
    public MixtureOptions withSeed(long v) {
        return new MixtureOptions(normalizeWeights, verifyPoints, atol, rtol, v);
    }
}
