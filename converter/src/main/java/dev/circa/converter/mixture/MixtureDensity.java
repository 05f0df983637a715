package dev.circa.converter.mixture;

import dev.circa.converter.reference.LogSumExp;
import dev.circa.converter.reference.ReferenceDensities;
import dev.circa.format.Family;
import dev.circa.format.io.FormatException;
import dev.circa.format.mixture.Expression;
import dev.circa.format.mixture.GaussianMixtureExpr;
import dev.circa.format.mixture.InputExpr;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.ProductExpr;

/**
 * The log-density of a mixture document itself, computed from the document's expressions with this
 * package's own formulas and Gaussian arithmetic, independently of the engine and of the converted
 * circuit (a block-diagonal covariance is evaluated whole, a Gaussian mixture as written). Missing
 * values (NaN) are marginalised: an input over a missing variable counts 1, a normal vector keeps
 * the sub-mean and sub-covariance of its observed variables. Not thread-safe (owns workspaces).
 */
public final class MixtureDensity {
    private final CheckedModel model;
    private final int variableCount;
    private final double[] values;
    private final double[][] logWeights;
    /** Per item: for a normal vector one entry, for a Gaussian mixture one per component. */
    private final double[][][] fullFactor;
    private final double[][] fullLogDet;
    private final double[] x;
    private final double[] mu;
    private final double[] work;
    private final int[] observed;

    private MixtureDensity(CheckedModel model) {
        this.model = model;
        ModelGraph g = model.graph();
        this.variableCount = g.document().variables().size();
        int n = g.size();
        this.values = new double[n];
        this.logWeights = new double[n][];
        this.fullFactor = new double[n][][];
        this.fullLogDet = new double[n][];
        int maxD = 1;
        for (int i = 0; i < n; i++) {
            Expression e = g.items().get(i);
            double[] w = model.weights(i);
            if (w != null) {
                logWeights[i] = new double[w.length];
                for (int j = 0; j < w.length; j++) {
                    logWeights[i][j] = Math.log(w[j]);
                }
            }
            if (e instanceof InputExpr in && in.family() == Family.MVNORMAL) {
                int d = in.vars().length;
                maxD = Math.max(maxD, d);
                double[] cov = java.util.Arrays.copyOfRange(in.params(), d, d + d * d);
                double[] l = GaussianMath.cholesky(cov, d);
                fullFactor[i] = new double[][] {l};
                fullLogDet[i] = new double[] {GaussianMath.logDet(l, d)};
            } else if (e instanceof GaussianMixtureExpr gm) {
                int d = gm.dimension();
                maxD = Math.max(maxD, d);
                fullFactor[i] = new double[gm.components()][];
                fullLogDet[i] = new double[gm.components()];
                for (int c = 0; c < gm.components(); c++) {
                    fullFactor[i][c] = GaussianMath.cholesky(gm.covariances()[c], d);
                    fullLogDet[i][c] = GaussianMath.logDet(fullFactor[i][c], d);
                }
            }
        }
        this.x = new double[maxD];
        this.mu = new double[maxD];
        this.work = new double[maxD];
        this.observed = new int[maxD];
    }

    /**
     * The density of {@code doc}, checked as the converter checks it.
     *
     * @param normalizeWeights rescale mixture weights that do not add to 1, as the converter would
     * @throws FormatException on the authoring mistakes the converter reports
     */
    public static MixtureDensity of(MixtureDocument doc, boolean normalizeWeights) throws FormatException {
        return new MixtureDensity(CheckedModel.of(doc, normalizeWeights));
    }

    static MixtureDensity of(CheckedModel model) {
        return new MixtureDensity(model);
    }

    /** Number of variables (the length of a row). */
    public int variableCount() {
        return variableCount;
    }

    /**
     * Log-densities of {@code rows} rows.
     *
     * @param data input: row-major rows x {@link #variableCount()}, NaN for missing, discrete values as state indices
     * @param out output: one log-density per row (-inf where the density is zero)
     */
    public void logDensity(double[] data, int rows, double[] out) {
        for (int r = 0; r < rows; r++) {
            out[r] = logDensity(data, r * variableCount);
        }
    }

    /** The log-density of the row starting at {@code offset} in {@code data}. */
    public double logDensity(double[] data, int offset) {
        ModelGraph g = model.graph();
        int n = g.size();
        for (int i = 0; i < n; i++) {
            Expression e = g.items().get(i);
            int[] kids = g.children(i);
            double v;
            if (e instanceof InputExpr in) {
                if (in.family() == Family.MVNORMAL) {
                    int d = in.vars().length;
                    v = normalVector(data, offset, in.vars(), in.params(), in.params(), d, fullFactor[i][0],
                            fullLogDet[i][0]);
                } else {
                    double xv = data[offset + in.vars()[0]];
                    v = Double.isNaN(xv) ? 0 : ReferenceDensities.logValue(in.family(), in.params(), xv);
                }
            } else if (e instanceof GaussianMixtureExpr gm) {
                v = Double.NEGATIVE_INFINITY;
                for (int c = 0; c < gm.components(); c++) {
                    double lw = logWeights[i][c];
                    if (lw == Double.NEGATIVE_INFINITY) {
                        continue;
                    }
                    v = LogSumExp.add(v, lw + normalVector(data, offset, gm.vars(), gm.means()[c],
                            gm.covariances()[c], 0, fullFactor[i][c], fullLogDet[i][c]));
                }
            } else if (e instanceof ProductExpr) {
                v = 0;
                for (int k : kids) {
                    v += values[k];
                }
            } else {
                v = Double.NEGATIVE_INFINITY;
                double[] lw = logWeights[i];
                for (int j = 0; j < kids.length; j++) {
                    if (lw[j] != Double.NEGATIVE_INFINITY) {
                        v = LogSumExp.add(v, lw[j] + values[kids[j]]);
                    }
                }
            }
            values[i] = v;
        }
        return values[g.root()];
    }

    /**
     * log N of the observed part of a normal vector: mean {@code meanSrc[0..d)}, covariance row-major
     * d x d in {@code covSrc} from {@code covOffset}, full-data Cholesky factor {@code fullL}.
     */
    private double normalVector(double[] data, int offset, int[] vars, double[] meanSrc,
            double[] covSrc, int covOffset, double[] fullL, double fullLogDetValue) {
        int d = vars.length;
        int k = 0;
        for (int a = 0; a < d; a++) {
            double xv = data[offset + vars[a]];
            if (!Double.isNaN(xv)) {
                observed[k] = a;
                x[k] = xv;
                mu[k] = meanSrc[a];
                k++;
            }
        }
        if (k == 0) {
            return 0;
        }
        if (k == d) {
            return GaussianMath.logDensity(x, mu, fullL, d, fullLogDetValue, work);
        }
        double[] sub = new double[k * k];
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                sub[a * k + b] = covSrc[covOffset + observed[a] * d + observed[b]];
            }
        }
        double[] l = GaussianMath.cholesky(sub, k);
        return GaussianMath.logDensity(x, mu, l, k, GaussianMath.logDet(l, k), work);
    }
}
