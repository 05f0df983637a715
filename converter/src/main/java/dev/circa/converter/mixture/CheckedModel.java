package dev.circa.converter.mixture;

import dev.circa.engine.family.ParameterLimits;
import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.format.Family;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.io.FormatException;
import dev.circa.format.mixture.Expression;
import dev.circa.format.mixture.GaussianMixtureExpr;
import dev.circa.format.mixture.InputExpr;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureEntry;
import dev.circa.format.mixture.MixtureExpr;
import dev.circa.format.mixture.ProductExpr;
import dev.circa.validator.analysis.Numbers;
import java.util.List;
import java.util.Locale;

/**
 * A mixture document judged fit to convert: no {@code use} cycle, every product decomposable, every
 * mixture smooth, weights adding to 1 (or rescaled on request), parameters valid, every declared
 * variable modelled. Holds the {@link ModelGraph}, each item's scope and the effective weights of
 * every mixture and Gaussian mixture. Not for application code.
 */
final class CheckedModel {
    /** Bound on |sum of weights - 1| and |sum of probabilities - 1| (the validator's default tolerance). */
    static final double SUM_TOLERANCE = 1e-9;

    private final ModelGraph graph;
    private final int[][] scopes;
    private final double[][] weights;

    private CheckedModel(ModelGraph graph, int[][] scopes, double[][] weights) {
        this.graph = graph;
        this.scopes = scopes;
        this.weights = weights;
    }

    /** Checks {@code doc}; the first authoring mistake ends the check with a located message. */
    static CheckedModel of(MixtureDocument doc, boolean normalizeWeights) throws FormatException {
        ModelGraph g = ModelGraph.of(doc);
        int n = g.size();
        int[][] scopes = new int[n][];
        double[][] weights = new double[n][];
        int varCount = doc.variables().size();
        int[] owner = new int[varCount];
        java.util.Arrays.fill(owner, -1);
        for (int i = 0; i < n; i++) {
            Expression e = g.items().get(i);
            int[] kids = g.children(i);
            if (e instanceof InputExpr in) {
                checkInput(doc, in);
                scopes[i] = sorted(in.vars());
            } else if (e instanceof GaussianMixtureExpr gm) {
                weights[i] = checkGaussianMixture(doc, gm, normalizeWeights);
                scopes[i] = sorted(gm.vars());
            } else if (e instanceof ProductExpr p) {
                int total = 0;
                for (int k : kids) {
                    total += scopes[k].length;
                }
                int[] s = new int[total];
                int filled = 0;
                for (int j = 0; j < kids.length; j++) {
                    for (int v : scopes[kids[j]]) {
                        if (owner[v] >= 0) {
                            Expression f = p.factors().get(j);
                            throw error(doc, f.location(), f.path(), "variable " + name(doc, v)
                                    + " is used twice in one product (by " + p.path() + ".product[" + owner[v]
                                    + "] and " + p.path() + ".product[" + j + "]); a product's factors must be over "
                                    + "disjoint variables (decomposable)");
                        }
                        owner[v] = j;
                        s[filled++] = v;
                    }
                }
                for (int v : s) {
                    owner[v] = -1;
                }
                java.util.Arrays.sort(s);
                scopes[i] = s;
            } else {
                MixtureExpr m = (MixtureExpr) e;
                String mp = m.path() + ".mixture";
                int[] first = scopes[kids[0]];
                for (int j = 1; j < kids.length; j++) {
                    int[] other = scopes[kids[j]];
                    if (!java.util.Arrays.equals(first, other)) {
                        Expression c = m.entries().get(j).expression();
                        int v = firstDifference(first, other);
                        boolean inFirst = java.util.Arrays.binarySearch(first, v) >= 0;
                        throw error(doc, c.location(), c.path(), "the components of " + mp
                                + " are over different variables: " + name(doc, v) + " is in " + mp
                                + (inFirst ? "[0] but not in " + mp + "[" + j + "]"
                                        : "[" + j + "] but not in " + mp + "[0]")
                                + "; every component of a mixture must be over the same variables (smooth)");
                    }
                }
                double[] w = new double[kids.length];
                SourceLocation[] at = new SourceLocation[kids.length];
                for (int j = 0; j < kids.length; j++) {
                    MixtureEntry entry = m.entries().get(j);
                    w[j] = entry.weight();
                    at[j] = entry.weightLocation();
                }
                weights[i] = checkWeights(doc, w, at, m.location(), mp, normalizeWeights);
                scopes[i] = first;
            }
        }
        int[] all = scopes[g.root()];
        if (all.length < varCount) {
            int v = 0;
            for (int k = 0; k < all.length && all[k] == v; k++) {
                v++;
            }
            Expression model = doc.model();
            throw error(doc, model.location(), model.path(), "variable " + name(doc, v)
                    + " is declared but the model never uses it; model it or remove it from variables");
        }
        return new CheckedModel(g, scopes, weights);
    }

    ModelGraph graph() {
        return graph;
    }

    /** Sorted variable indices of item {@code i}. */
    int[] scope(int i) {
        return scopes[i];
    }

    /** Effective weights of a mixture or Gaussian-mixture item (rescaled when asked), else {@code null}. */
    double[] weights(int i) {
        return weights[i];
    }

    private static double[] checkWeights(MixtureDocument doc, double[] w, SourceLocation[] at, SourceLocation whole,
            String path, boolean normalize) throws FormatException {
        double sum = 0;
        for (int j = 0; j < w.length; j++) {
            if (!(w[j] >= 0)) {
                throw error(doc, at[j], path + "[" + j + "].weight", "weight " + fmt(w[j]) + " is negative; "
                        + "expected a weight >= 0");
            }
            sum += w[j];
        }
        if (!(sum > 0)) {
            throw error(doc, whole, path, "the weights of " + path + " are all 0; expected weights adding to 1");
        }
        if (Math.abs(sum - 1) <= SUM_TOLERANCE) {
            return w.clone();
        }
        if (!normalize) {
            throw error(doc, whole, path, "the weights of " + path + " add to " + fmt(sum)
                    + " (expected 1 +/- " + fmt(SUM_TOLERANCE) + "); correct them, or rescale them on purpose with "
                    + "--normalize-weights");
        }
        double[] r = new double[w.length];
        for (int j = 0; j < w.length; j++) {
            r[j] = w[j] / sum;
        }
        return r;
    }

    private static double[] checkGaussianMixture(MixtureDocument doc, GaussianMixtureExpr gm, boolean normalize)
            throws FormatException {
        String path = gm.path() + ".gaussian-mixture";
        int d = gm.dimension();
        SourceLocation[] at = new SourceLocation[gm.components()];
        java.util.Arrays.fill(at, gm.location());
        double[] w = gm.weights();
        for (int j = 0; j < w.length; j++) {
            if (!(w[j] >= 0)) {
                throw error(doc, gm.location(), path + ".weights[" + j + "]", "weight " + fmt(w[j])
                        + " is negative; expected a weight >= 0");
            }
        }
        double[] eff = checkWeights(doc, w, at, gm.location(), path, normalize);
        String shape = gm.diagonal() ? ".variances" : ".covariances";
        for (int c = 0; c < gm.components(); c++) {
            SourceLocation l = gm.componentLocations()[c];
            String p = path + shape + "[" + c + "]";
            double[] cov = gm.covariances()[c];
            if (gm.diagonal()) {
                for (int i = 0; i < d; i++) {
                    if (!(cov[i * d + i] > 0)) {
                        throw error(doc, l, p, "variance " + fmt(cov[i * d + i]) + " of " + name(doc, gm.vars()[i])
                                + " is not positive; expected a variance > 0");
                    }
                }
            } else {
                checkCovariance(doc, cov, d, l, p);
            }
        }
        return eff;
    }

    private static void checkCovariance(MixtureDocument doc, double[] cov, int d, SourceLocation l, String p)
            throws FormatException {
        double max = 0;
        for (double v : cov) {
            max = Math.max(max, Math.abs(v));
        }
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < i; j++) {
                if (Math.abs(cov[i * d + j] - cov[j * d + i]) > SUM_TOLERANCE * max) {
                    throw error(doc, l, p, String.format(Locale.ROOT, "the covariance is not symmetric: "
                            + "entry [%d][%d] is %s but [%d][%d] is %s; expected a symmetric positive definite matrix",
                            i, j, fmt(cov[i * d + j]), j, i, fmt(cov[j * d + i])));
                }
            }
        }
        if (GaussianMath.cholesky(cov, d) == null) {
            throw error(doc, l, p, "the covariance is not positive definite (its Cholesky factorisation fails); "
                    + "expected a symmetric positive definite matrix");
        }
    }

    private static void checkInput(MixtureDocument doc, InputExpr in) throws FormatException {
        Family f = in.family();
        double[] p = in.params();
        String path = in.path() + "." + f.jsonName();
        SourceLocation l = in.paramsLocation();
        switch (f) {
            case CATEGORICAL -> {
                double sum = 0;
                Variable v = doc.variables().get(in.vars()[0]);
                for (int s = 0; s < p.length; s++) {
                    if (!ParameterLimits.of(Family.CATEGORICAL).get(0).holds(p[s], Integer.MAX_VALUE)) {
                        throw error(doc, l, path, "the probability of " + label(v, s) + " is " + fmt(p[s])
                                + "; expected probabilities >= 0");
                    }
                    sum += p[s];
                }
                if (Math.abs(sum - 1) > SUM_TOLERANCE) {
                    throw error(doc, l, path, "the probabilities over " + v.name() + " add to " + fmt(sum)
                            + " (expected 1 +/- " + fmt(SUM_TOLERANCE) + ")");
                }
            }
            case INDICATOR -> {
                // the reader has resolved the value to a state of the variable
            }
            case MVNORMAL -> checkCovariance(doc, java.util.Arrays.copyOfRange(p, in.vars().length, p.length),
                    in.vars().length, l, path + ".cov");
            default -> checkLimits(doc, f, p, l, path);
        }
    }

    /** Each parameter of a one-variable family but categorical and indicator against {@link ParameterLimits}. */
    private static void checkLimits(MixtureDocument doc, Family f, double[] p, SourceLocation l, String path)
            throws FormatException {
        List<Limit> limits = ParameterLimits.of(f);
        for (int k = 0; k < limits.size(); k++) {
            Limit limit = limits.get(k);
            String name = f.parameters().get(k);
            if (limit == Limit.COUNT && !limit.holds(p[k], Integer.MAX_VALUE)) {
                throw error(doc, l, path, "binomial trials " + fmt(p[k])
                        + " is not a whole number from 0 to 2^53 (9007199254740992)");
            }
            if (limit == Limit.POSITIVE) {
                positive(doc, p[k], name, l, path);
            } else if (limit == Limit.PROBABILITY) {
                probability(doc, p[k], name, l, path);
            }
        }
        if (!ParameterLimits.inOrder(f, p)) {
            throw error(doc, l, path, "uniform low " + fmt(p[0]) + " is not below high " + fmt(p[1])
                    + "; expected low < high");
        }
    }

    private static void positive(MixtureDocument doc, double v, String name, SourceLocation l, String path)
            throws FormatException {
        if (!Limit.POSITIVE.holds(v, Integer.MAX_VALUE)) {
            throw error(doc, l, path, name + " is " + fmt(v) + "; expected " + name + " > 0");
        }
    }

    private static void probability(MixtureDocument doc, double v, String name, SourceLocation l, String path)
            throws FormatException {
        if (!Limit.PROBABILITY.holds(v, Integer.MAX_VALUE)) {
            throw error(doc, l, path, name + " is " + fmt(v) + "; expected a probability in [0, 1]");
        }
    }

    private static int[] sorted(int[] vars) {
        int[] s = vars.clone();
        java.util.Arrays.sort(s);
        return s;
    }

    private static int firstDifference(int[] a, int[] b) {
        int i = 0;
        int j = 0;
        while (i < a.length && j < b.length) {
            if (a[i] == b[j]) {
                i++;
                j++;
            } else {
                return Math.min(a[i], b[j]);
            }
        }
        return i < a.length ? a[i] : b[j];
    }

    private static String name(MixtureDocument doc, int v) {
        return doc.variables().get(v).name();
    }

    private static String label(Variable v, int s) {
        return v.states().isEmpty() ? Integer.toString(s) : v.states().get(s);
    }

    static String fmt(double v) {
        return Numbers.format(v, 10);
    }

    static FormatException error(MixtureDocument doc, SourceLocation l, String path, String problem) {
        return new FormatException(doc.source(), l.line(), l.column(), path, problem);
    }
}
