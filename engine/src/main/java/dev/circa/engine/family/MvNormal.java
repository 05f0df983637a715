package dev.circa.engine.family;

import dev.circa.engine.random.Xoshiro256;

/**
 * Kernels of the multivariate normal input. Parameters: mean (d) then covariance (d x d, row-major;
 * the lower triangle is used) at {@code p[off]}; {@code factor[fOff]} holds the lower Cholesky factor L
 * of the covariance (d x d, row-major) computed once by the compiler, followed by sum(log L_ii). With
 * some variables missing the density is the Gaussian marginal of the observed ones, whose sub-covariance
 * is factorised on the fly in the workspace.
 */
public final class MvNormal {
    private static final double HALF_LOG_2PI = SpecialFunctions.HALF_LOG_2PI;

    private MvNormal() {
    }

    /** Log-density (marginal over missing values) of {@code ws.value}; 0 when every value is missing. */
    public static double logDensity(double[] p, int off, int d, double[] factor, int fOff, MvNormalWorkspace ws) {
        int k = partition(d, ws);
        if (k == 0) {
            return 0;
        }
        if (anyInfinite(k, ws)) {
            return Double.NEGATIVE_INFINITY;
        }
        if (k == d) {
            return fullLogDensity(p, off, d, factor, fOff, ws);
        }
        if (!factorObserved(p, off, d, k, ws)) {
            return Double.NaN;
        }
        double[] l = ws.factor;
        double[] y = ws.solve;
        double quad = 0;
        double logDiag = 0;
        for (int a = 0; a < k; a++) {
            double s = ws.value[ws.observed[a]] - p[off + ws.observed[a]];
            for (int b = 0; b < a; b++) {
                s -= l[a * k + b] * y[b];
            }
            y[a] = s / l[a * k + a];
            quad += y[a] * y[a];
            logDiag += Math.log(l[a * k + a]);
        }
        return -0.5 * quad - logDiag - k * HALF_LOG_2PI;
    }

    /**
     * The largest log-density over the missing values given the observed ones, reached at the
     * conditional mean; {@code ws.value} is completed with that point.
     */
    public static double maxLogDensity(double[] p, int off, int d, double[] factor, int fOff, MvNormalWorkspace ws) {
        int k = partition(d, ws);
        if (anyInfinite(k, ws)) {
            return Double.NEGATIVE_INFINITY;
        }
        if (k < d) {
            int m = d - k;
            if (k == 0) {
                for (int a = 0; a < m; a++) {
                    ws.value[ws.missing[a]] = p[off + ws.missing[a]];
                }
            } else {
                if (!factorObserved(p, off, d, k, ws)) {
                    return Double.NaN;
                }
                double[] l = ws.factor;
                double[] y = ws.solve;
                // solve S_oo a = x_o - mu_o by forward then backward substitution
                for (int a = 0; a < k; a++) {
                    double s = ws.value[ws.observed[a]] - p[off + ws.observed[a]];
                    for (int b = 0; b < a; b++) {
                        s -= l[a * k + b] * y[b];
                    }
                    y[a] = s / l[a * k + a];
                }
                for (int a = k - 1; a >= 0; a--) {
                    double s = y[a];
                    for (int b = a + 1; b < k; b++) {
                        s -= l[b * k + a] * y[b];
                    }
                    y[a] = s / l[a * k + a];
                }
                for (int a = 0; a < m; a++) {
                    int i = ws.missing[a];
                    double s = p[off + i];
                    for (int b = 0; b < k; b++) {
                        s += cov(p, off, d, i, ws.observed[b]) * y[b];
                    }
                    ws.value[i] = s;
                }
            }
        }
        return fullLogDensity(p, off, d, factor, fOff, ws);
    }

    /** One draw mean + L z into {@code out[0..d-1]} (StrictMath only). */
    public static void sample(double[] p, int off, int d, double[] factor, int fOff, Xoshiro256 rng, double[] out) {
        double[] z = out;
        for (int i = 0; i < d; i++) {
            z[i] = rng.nextGaussian();
        }
        // in place from the last row down: row i only needs z[0..i]
        for (int i = d - 1; i >= 0; i--) {
            double s = p[off + i];
            for (int j = 0; j <= i; j++) {
                s += factor[fOff + i * d + j] * z[j];
            }
            z[i] = s;
        }
    }

    private static double fullLogDensity(double[] p, int off, int d, double[] factor, int fOff, MvNormalWorkspace ws) {
        double[] x = ws.value;
        double[] y = ws.solve;
        double quad = 0;
        for (int i = 0; i < d; i++) {
            double s = x[i] - p[off + i];
            for (int j = 0; j < i; j++) {
                s -= factor[fOff + i * d + j] * y[j];
            }
            y[i] = s / factor[fOff + i * d + i];
            quad += y[i] * y[i];
        }
        return -0.5 * quad - factor[fOff + d * d] - d * HALF_LOG_2PI;
    }

    private static double cov(double[] p, int off, int d, int i, int j) {
        return i >= j ? p[off + d + i * d + j] : p[off + d + j * d + i];
    }

    private static boolean anyInfinite(int k, MvNormalWorkspace ws) {
        for (int a = 0; a < k; a++) {
            if (Double.isInfinite(ws.value[ws.observed[a]])) {
                return true;
            }
        }
        return false;
    }

    /** Splits the variables into observed and missing; returns the number observed. */
    private static int partition(int d, MvNormalWorkspace ws) {
        int k = 0;
        int m = 0;
        for (int i = 0; i < d; i++) {
            if (Double.isNaN(ws.value[i])) {
                ws.missing[m++] = i;
            } else {
                ws.observed[k++] = i;
            }
        }
        return k;
    }

    /** Cholesky factor of the observed sub-covariance into {@code ws.factor} (k x k); false if not positive. */
    private static boolean factorObserved(double[] p, int off, int d, int k, MvNormalWorkspace ws) {
        double[] l = ws.factor;
        for (int a = 0; a < k; a++) {
            for (int b = 0; b <= a; b++) {
                double s = cov(p, off, d, ws.observed[a], ws.observed[b]);
                for (int c = 0; c < b; c++) {
                    s -= l[a * k + c] * l[b * k + c];
                }
                if (a == b) {
                    if (!(s > 0)) {
                        return false;
                    }
                    l[a * k + a] = Math.sqrt(s);
                } else {
                    l[a * k + b] = s / l[b * k + b];
                }
            }
        }
        return true;
    }
}
