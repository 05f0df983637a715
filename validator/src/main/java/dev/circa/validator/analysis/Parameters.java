package dev.circa.validator.analysis;

import dev.circa.engine.family.ParameterLimits;
import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.decomposition.chol.CholeskyDecompositionInner_DDRM;

/**
 * Checks every input's parameters against its family's constraints (FORMAT.md's input table),
 * every number for finiteness and every sum weight for sign, in one pass over the nodes. Each
 * problem carries the code of the rule that reports it.
 */
public final class Parameters {
    public static final String NOT_FINITE = "NumberNotFinite";
    public static final String OUT_OF_RANGE = "ParameterOutOfRange";
    public static final String LENGTH = "CategoricalLengthMismatch";
    public static final String PROBABILITIES = "ProbabilitiesNotNormalized";
    public static final String ASYMMETRIC = "CovarianceNotSymmetric";
    public static final String NOT_PD = "CovarianceNotPositiveDefinite";
    public static final String NEGATIVE_WEIGHT = "WeightNegative";

    /**
     * One problem.
     *
     * @param code the rule code
     * @param node the node index
     * @param member the member of the node, e.g. {@code sd}
     * @param message what was seen and expected
     */
    public record Problem(String code, int node, String member, String message) {
    }

    private final List<Problem> problems = new ArrayList<>();
    private final boolean[] inputBad;
    private boolean anyBad;

    private Parameters(CircuitDocument doc, double tol) {
        List<Node> nodes = doc.nodes();
        inputBad = new boolean[nodes.size()];
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            int before = problems.size();
            if (n instanceof InputNode in) {
                checkInput(doc, i, in, tol);
            } else if (n instanceof SumNode s) {
                checkSum(i, s);
            }
            if (problems.size() > before) {
                inputBad[i] = true;
                anyBad = true;
            }
        }
    }

    /** Checks every node of {@code doc} with tolerance {@code tol}. */
    public static Parameters of(CircuitDocument doc, double tol) {
        return new Parameters(doc, tol);
    }

    public List<Problem> problems() {
        return problems;
    }

    /** Whether some node has a problem (then supports and partition functions are not computed). */
    public boolean anyProblem() {
        return anyBad;
    }

    /** Whether node {@code i} has a problem. */
    public boolean bad(int i) {
        return inputBad[i];
    }

    private void add(String code, int node, String member, String fmt, Object... args) {
        problems.add(new Problem(code, node, member, String.format(Locale.ROOT, fmt, args)));
    }

    private void checkSum(int i, SumNode s) {
        double[] w = s.weights();
        String member = s.logWeights() ? "logWeights" : "weights";
        for (int j = 0; j < w.length; j++) {
            if (Double.isNaN(w[j]) || Double.isInfinite(w[j])) {
                add(NOT_FINITE, i, member + "/" + j, "%s %d of sum %d is %s; expected a finite number",
                        s.logWeights() ? "log-weight" : "weight", j, s.id(), num(w[j]));
            } else if (!s.logWeights() && w[j] < 0) {
                add(NEGATIVE_WEIGHT, i, member + "/" + j, "weight %d of sum %d is %s; expected a weight >= 0",
                        j, s.id(), num(w[j]));
            }
        }
    }

    private void checkInput(CircuitDocument doc, int i, InputNode in, double tol) {
        Family f = in.family();
        double[] p = in.params();
        int id = in.id();
        String fam = f.jsonName();
        for (int k = 0; k < p.length; k++) {
            if (Double.isNaN(p[k]) || Double.isInfinite(p[k])) {
                add(NOT_FINITE, i, memberOf(in, k), "parameter %s of %s node %d is %s; expected a finite number",
                        memberOf(in, k), fam, id, num(p[k]));
                return;
            }
        }
        List<Variable> vars = doc.variables();
        int v = in.vars().length > 0 ? in.vars()[0] : -1;
        Variable var = v >= 0 && v < vars.size() ? vars.get(v) : null;
        if (f == Family.CATEGORICAL) {
            categorical(i, in, var, tol);
        } else if (f == Family.MVNORMAL) {
            mvnormal(i, in, tol);
        } else {
            List<Limit> limits = ParameterLimits.of(f);
            int states = var == null ? Integer.MAX_VALUE : var.stateCount();
            for (int k = 0; k < limits.size(); k++) {
                if (!limits.get(k).holds(p[k], states)) {
                    outOfRange(i, in, limits.get(k), f.parameters().get(k), p[k], states, var);
                }
            }
            if (!ParameterLimits.inOrder(f, p)) {
                add(OUT_OF_RANGE, i, "low", "uniform node %d has low %s and high %s; expected low < high",
                        id, num(p[0]), num(p[1]));
            }
        }
    }

    private static String memberOf(InputNode in, int k) {
        Family f = in.family();
        if (f == Family.CATEGORICAL) {
            return (in.logForm() ? "logProbs/" : "probs/") + k;
        }
        if (f == Family.MVNORMAL) {
            int d = in.vars().length;
            return k < d ? "mean/" + k : "cov/" + ((k - d) / d) + "/" + ((k - d) % d);
        }
        return f.parameters().get(k);
    }

    private static String num(double x) {
        return Numbers.text(x);
    }

    private void outOfRange(int i, InputNode in, Limit limit, String name, double x, int states, Variable var) {
        String fam = in.family().jsonName();
        switch (limit) {
            case PROBABILITY -> add(OUT_OF_RANGE, i, name, "%s of %s node %d is %s; expected a probability in [0, 1]",
                    name, fam, in.id(), num(x));
            case POSITIVE -> add(OUT_OF_RANGE, i, name, "%s of %s node %d is %s; expected a number > 0",
                    name, fam, in.id(), num(x));
            case COUNT -> add(OUT_OF_RANGE, i, name, "%s of %s node %d is %s; expected an integer >= 0",
                    name, fam, in.id(), num(x));
            case STATE -> add(OUT_OF_RANGE, i, name, "%s of %s node %d is %s; expected a state index 0..%d of %s",
                    name, fam, in.id(), num(x), states - 1, var == null ? "its variable" : var.name());
            default -> add(OUT_OF_RANGE, i, name, "%s of %s node %d is %s; expected %s", name, fam, in.id(), num(x),
                    limit.name().toLowerCase(Locale.ROOT));
        }
    }

    private void categorical(int i, InputNode in, Variable var, double tol) {
        double[] p = in.params();
        String member = in.logForm() ? "logProbs" : "probs";
        if (var != null && var.stateCount() > 0 && p.length != var.stateCount()) {
            add(LENGTH, i, member, "categorical node %d has %d %s; expected one per state of %s (%d)",
                    in.id(), p.length, in.logForm() ? "log-probabilities" : "probabilities", var.name(), var.stateCount());
        }
        double sum = 0;
        boolean negative = false;
        for (int k = 0; k < p.length; k++) {
            if (in.logForm()) {
                sum += Math.exp(p[k]);
            } else if (!ParameterLimits.of(Family.CATEGORICAL).get(0).holds(p[k], Integer.MAX_VALUE)) {
                negative = true;
                add(OUT_OF_RANGE, i, member + "/" + k, "probability %d of categorical node %d is %s; expected >= 0",
                        k, in.id(), num(p[k]));
            } else {
                sum += p[k];
            }
        }
        if (!negative && !(Math.abs(sum - 1) <= tol)) {
            add(PROBABILITIES, i, member, "%s of categorical node %d add to %s (expected 1 +/- %s, set by --tolerance)",
                    in.logForm() ? "exp(logProbs)" : "probabilities", in.id(), num(sum), num(tol));
        }
    }

    private void mvnormal(int i, InputNode in, double tol) {
        int d = in.vars().length;
        double[] p = in.params();
        double max = 0;
        for (int k = d; k < p.length; k++) {
            max = Math.max(max, Math.abs(p[k]));
        }
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < r; c++) {
                double lower = p[d + r * d + c];
                double upper = p[d + c * d + r];
                if (!(Math.abs(lower - upper) <= tol * max)) {
                    add(ASYMMETRIC, i, "cov/" + c + "/" + r,
                            "covariance of mvnormal node %d has cov[%d][%d] = %s but cov[%d][%d] = %s "
                                    + "(expected equal within %s * max|cov| = %s, set by --tolerance)",
                            in.id(), r, c, num(lower), c, r, num(upper), num(tol), num(tol * max));
                    return;
                }
            }
        }
        DMatrixRMaj a = new DMatrixRMaj(d, d);
        for (int r = 0; r < d; r++) {
            for (int c = 0; c <= r; c++) {
                double x = p[d + r * d + c];
                a.set(r, c, x);
                a.set(c, r, x);
            }
        }
        CholeskyDecompositionInner_DDRM chol = new CholeskyDecompositionInner_DDRM(true);
        boolean ok = chol.decompose(a);
        if (ok) {
            DMatrixRMaj l = chol.getT(null);
            for (int k = 0; k < d && ok; k++) {
                ok = l.get(k, k) > 0 && Double.isFinite(l.get(k, k));
            }
        }
        if (!ok) {
            add(NOT_PD, i, "cov", "covariance of mvnormal node %d is not positive definite: its Cholesky "
                    + "factorisation (of the lower triangle) has a pivot <= 0", in.id());
        }
    }
}
