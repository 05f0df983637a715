package dev.circa.converter.mixture;

/**
 * Dense Gaussian arithmetic of the source evaluator and sampler, written here so that the proof of
 * a conversion does not lean on the engine's kernels: Cholesky factorisation, triangular solves and
 * the log-density of a normal vector. Matrices are row-major {@code double[]}. Not for application code.
 */
final class GaussianMath {
    static final double LOG_2PI = Math.log(2 * Math.PI);

    private GaussianMath() {
    }

    /**
     * The lower Cholesky factor of the symmetric {@code d x d} matrix {@code a} (lower triangle used),
     * or {@code null} when a pivot is not positive (not positive definite).
     */
    static double[] cholesky(double[] a, int d) {
        double[] l = new double[d * d];
        for (int j = 0; j < d; j++) {
            double s = a[j * d + j];
            for (int k = 0; k < j; k++) {
                s -= l[j * d + k] * l[j * d + k];
            }
            if (!(s > 0) || !Double.isFinite(s)) {
                return null;
            }
            double ljj = Math.sqrt(s);
            l[j * d + j] = ljj;
            for (int i = j + 1; i < d; i++) {
                double t = a[i * d + j];
                for (int k = 0; k < j; k++) {
                    t -= l[i * d + k] * l[j * d + k];
                }
                l[i * d + j] = t / ljj;
            }
        }
        return l;
    }

    /** log det of the matrix whose Cholesky factor is {@code l}. */
    static double logDet(double[] l, int d) {
        double s = 0;
        for (int i = 0; i < d; i++) {
            s += Math.log(l[i * d + i]);
        }
        return 2 * s;
    }

    /**
     * log N(x; mean, L L^T) with {@code l} the Cholesky factor; {@code work} has length >= d. The
     * quadratic form never meets 0 * inf: zero entries of L are skipped, a whitened coordinate beyond
     * double range gives -inf at once, and when some x - mean overflows while x is finite, everything
     * is computed on halves (the whitened vector is linear in x - mean) and the form scaled back.
     */
    static double logDensity(double[] x, double[] mean, double[] l, int d, double logDet, double[] work) {
        double h = 1;
        for (int i = 0; i < d; i++) {
            if (Double.isInfinite(x[i] - mean[i]) && Double.isFinite(x[i]) && Double.isFinite(mean[i])) {
                h = 0.5;
            }
        }
        double q = 0;
        for (int i = 0; i < d; i++) {
            double t = h * x[i] - h * mean[i];
            for (int k = 0; k < i; k++) {
                double lik = l[i * d + k];
                if (lik != 0) {
                    t -= lik * work[k];
                }
            }
            work[i] = t / l[i * d + i];
            if (Double.isInfinite(work[i])) {
                return Double.NEGATIVE_INFINITY;
            }
            q += work[i] * work[i];
        }
        q = q / (h * h);
        return -0.5 * (d * LOG_2PI + logDet + q);
    }

    /** The sub-matrix of the {@code d x d} matrix {@code a} on {@code idx} (row-major, k x k). */
    static double[] sub(double[] a, int d, int[] idx, int k) {
        double[] s = new double[k * k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < k; j++) {
                s[i * k + j] = a[idx[i] * d + idx[j]];
            }
        }
        return s;
    }
}
