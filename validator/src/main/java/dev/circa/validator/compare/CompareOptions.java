package dev.circa.validator.compare;

/**
 * Settings of a numerical comparison.
 *
 * @param samples points sampled from each circuit per output (each also checked with random variables missing)
 * @param seed seed of the samples and of the choice of missing variables
 * @param atol absolute tolerance on log-densities
 * @param rtol relative tolerance: two log-densities a and b agree when |a - b| {@literal <=} atol + rtol * max(|a|, |b|)
 */
public record CompareOptions(int samples, long seed, double atol, double rtol) {
    /** The defaults of CLI.md: 1000 samples, seed 0, atol = rtol = 1e-9. */
    public static final CompareOptions DEFAULT = new CompareOptions(1000, 0, 1e-9, 1e-9);

    public CompareOptions {
        if (samples < 0) {
            throw new IllegalArgumentException("the number of samples must be >= 0");
        }
        if (!(atol >= 0) || !(rtol >= 0) || Double.isInfinite(atol) || Double.isInfinite(rtol)) {
            throw new IllegalArgumentException("tolerances must be finite and >= 0");
        }
    }

    /** Whether log-densities {@code a} and {@code b} agree; both -inf agree, one -inf does not. */
    public boolean agree(double a, double b) {
        if (a == b) {
            return true;
        }
        if (Double.isNaN(a) || Double.isNaN(b) || Double.isInfinite(a) || Double.isInfinite(b)) {
            return false;
        }
        return Math.abs(a - b) <= atol + rtol * Math.max(Math.abs(a), Math.abs(b));
    }

    double excess(double a, double b) {
        if (a == b) {
            return 0;
        }
        if (Double.isNaN(a) || Double.isNaN(b) || Double.isInfinite(a) || Double.isInfinite(b)) {
            return Double.POSITIVE_INFINITY;
        }
        double allowance = atol + rtol * Math.max(Math.abs(a), Math.abs(b));
        return allowance > 0 ? Math.abs(a - b) / allowance : Double.POSITIVE_INFINITY;
    }
}
