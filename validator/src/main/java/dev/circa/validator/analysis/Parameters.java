package dev.circa.validator.analysis;

import dev.circa.engine.family.ParameterLimits;
import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.engine.internal.IntList;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.NodeTable;
import dev.circa.format.Variable;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.decomposition.chol.CholeskyDecompositionInner_DDRM;

/**
 * Facts about the numbers of a circuit: which parameters and weights are not finite, which parameters
 * are outside their family's limits ({@link ParameterLimits}), a categorical's length and total mass,
 * an mvnormal covariance's symmetry and positive definiteness; and, in one pass over the nodes, which
 * nodes have any such defect (then supports and partition functions are not computed). It says nothing
 * about how the defects are reported: each parameter rule asks these facts and words its own diagnostics.
 */
public final class Parameters {
    /** Nodes with a defect, in index order. */
    private final IntList defective = new IntList();
    /** Sums whose weights are finite but add to a total farther than the tolerance from 1, in index order. */
    private final IntList offOne = new IntList();
    /** The weight total of each sum of {@link #offOne}. */
    private double[] offOneTotal = new double[16];
    /** Sums with a linear weight of 0 (a child that adds nothing), in index order. */
    private final IntList zeroWeight = new IntList();

    private Parameters(CircuitDocument doc, double tol) {
        NodeTable t = doc.nodeTable();
        int n = t.size();
        for (int i = 0; i < n; i++) {
            byte k = t.kind(i);
            if (k == NodeTable.INPUT ? !soundInput(doc, t, i, tol) : k == NodeTable.SUM && !soundSum(t, i, tol)) {
                defective.add(i);
            }
        }
    }

    /** The facts of every node of {@code doc} with tolerance {@code tol}. */
    public static Parameters of(CircuitDocument doc, double tol) {
        return new Parameters(doc, tol);
    }

    /** Whether some node has a defect (then supports and partition functions are not computed). */
    public boolean anyProblem() {
        return !defective.isEmpty();
    }

    /** The number of nodes with a defect. */
    public int defectCount() {
        return defective.size();
    }

    /** The index of the {@code k}-th node with a defect (in index order): rules about defects visit only these. */
    public int defect(int k) {
        return defective.get(k);
    }

    /**
     * The number of sums with at least one weight whose total (of exp(logWeights) in log form, added
     * in their order) is not within the tolerance of 1 and not NaN.
     */
    public int offOneCount() {
        return offOne.size();
    }

    /** The index of the {@code k}-th sum counted by {@link #offOneCount()} (in index order). */
    public int offOne(int k) {
        return offOne.get(k);
    }

    /** The weight total of the {@code k}-th sum counted by {@link #offOneCount()}. */
    public double offOneTotal(int k) {
        return offOneTotal[k];
    }

    /**
     * The number of sums with a linear weight equal to 0. When no node has a defect, every other sum's
     * children all have a positive weight (linear weights finite and >= 0, log-weights finite).
     */
    public int zeroWeightCount() {
        return zeroWeight.size();
    }

    /** The index of the {@code k}-th sum counted by {@link #zeroWeightCount()} (in index order). */
    public int zeroWeight(int k) {
        return zeroWeight.get(k);
    }

    /**
     * Whether sum {@code i}'s weights are all finite (and >= 0 in linear form); records the sum when its
     * weights' total is off 1 by more than {@code tol}.
     */
    private boolean soundSum(NodeTable t, int i, double tol) {
        boolean log = t.logForm(i);
        boolean sound = true;
        boolean zero = false;
        double total = 0;
        int a = t.valueStart(i);
        int b = t.valueEnd(i);
        for (int k = a; k < b; k++) {
            double w = t.value(k);
            sound &= Double.isFinite(w) && (log || w >= 0);
            zero |= !log && w == 0;
            total += log ? Math.exp(w) : w;
        }
        if (zero) {
            zeroWeight.add(i);
        }
        if (b > a && !(Math.abs(total - 1) <= tol || Double.isNaN(total))) {
            if (offOne.size() == offOneTotal.length) {
                offOneTotal = java.util.Arrays.copyOf(offOneTotal, offOneTotal.length * 2);
            }
            offOneTotal[offOne.size()] = total;
            offOne.add(i);
        }
        return sound;
    }

    /**
     * Whether input {@code i} has sound parameters: read from the columns for a one-variable family with a
     * fixed number of parameters (no record made: most inputs of a large circuit); a categorical, an mvnormal
     * or an input with another number of parameters or variables as a record, by {@link #sound}.
     */
    private static boolean soundInput(CircuitDocument doc, NodeTable t, int i, double tol) {
        Family f = t.family(i);
        if (f == Family.CATEGORICAL || f == Family.MVNORMAL || t.valueEnd(i) - t.valueStart(i) != ParameterLimits.of(f).size()
                || t.varEnd(i) - t.varStart(i) != 1) {
            return sound(doc, (InputNode) t.node(i), tol);
        }
        int v = t.var(t.varStart(i));
        return ParameterLimits.holds(t, i, v >= 0 && v < doc.variables().size() ? states(doc.variables().get(v)) : Integer.MAX_VALUE);
    }

    private static boolean sound(CircuitDocument doc, InputNode in, double tol) {
        if (firstNonFinite(in) >= 0) {
            return false;
        }
        Family f = in.family();
        Variable var = variable(doc, in);
        if (f == Family.CATEGORICAL) {
            return !lengthMismatch(in, var) && firstNegativeProbability(in, 0) < 0
                    && Math.abs(probabilityMass(in) - 1) <= tol;
        }
        if (f == Family.MVNORMAL) {
            return asymmetry(in, tol) == null && positiveDefinite(in);
        }
        return firstOutOfRange(in, var, 0) < 0 && ParameterLimits.inOrder(f, in.params());
    }

    /** The index of the first parameter of {@code in} that is not a finite number, or -1. */
    public static int firstNonFinite(InputNode in) {
        double[] p = in.params();
        for (int k = 0; k < p.length; k++) {
            if (!Double.isFinite(p[k])) {
                return k;
            }
        }
        return -1;
    }

    /** The variable of a one-variable input, or {@code null} when its index is out of range. */
    public static Variable variable(CircuitDocument doc, InputNode in) {
        List<Variable> vars = doc.variables();
        int v = in.vars().length > 0 ? in.vars()[0] : -1;
        return v >= 0 && v < vars.size() ? vars.get(v) : null;
    }

    /** The number of states an indicator's value must stay below ({@code Integer.MAX_VALUE} when unknown). */
    public static int states(Variable var) {
        return var == null ? Integer.MAX_VALUE : var.stateCount();
    }

    /**
     * The index, from {@code from} on, of the first parameter of a one-variable, non-categorical input
     * outside its {@link ParameterLimits limit}, or -1.
     */
    public static int firstOutOfRange(InputNode in, Variable var, int from) {
        List<Limit> limits = ParameterLimits.of(in.family());
        double[] p = in.params();
        for (int k = from; k < limits.size(); k++) {
            if (!limits.get(k).holds(p[k], states(var))) {
                return k;
            }
        }
        return -1;
    }

    /** Whether a categorical over {@code var} has a number of probabilities other than its states. */
    public static boolean lengthMismatch(InputNode in, Variable var) {
        return var != null && var.stateCount() > 0 && in.params().length != var.stateCount();
    }

    /** The index, from {@code from} on, of the first negative probability of a linear-form categorical, or -1. */
    public static int firstNegativeProbability(InputNode in, int from) {
        if (in.logForm()) {
            return -1;
        }
        Limit limit = ParameterLimits.of(Family.CATEGORICAL).get(0);
        double[] p = in.params();
        for (int k = from; k < p.length; k++) {
            if (!limit.holds(p[k], Integer.MAX_VALUE)) {
                return k;
            }
        }
        return -1;
    }

    /** The total of a categorical's probabilities (of exp(logProbs) in log form). */
    public static double probabilityMass(InputNode in) {
        double sum = 0;
        for (double x : in.params()) {
            sum += in.logForm() ? Math.exp(x) : x;
        }
        return sum;
    }

    /** The largest |entry| of an mvnormal's covariance. */
    public static double covarianceScale(InputNode in) {
        double[] p = in.params();
        double max = 0;
        for (int k = in.vars().length; k < p.length; k++) {
            max = Math.max(max, Math.abs(p[k]));
        }
        return max;
    }

    /**
     * The first (row, column) of an mvnormal's covariance, row by row below the diagonal, whose mirror
     * entry differs by more than {@code tol} times {@link #covarianceScale}; {@code null} when symmetric.
     */
    public static int[] asymmetry(InputNode in, double tol) {
        int d = in.vars().length;
        double[] p = in.params();
        double max = covarianceScale(in);
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < r; c++) {
                if (!(Math.abs(p[d + r * d + c] - p[d + c * d + r]) <= tol * max)) {
                    return new int[] {r, c};
                }
            }
        }
        return null;
    }

    /** Whether the Cholesky factorisation of an mvnormal's covariance (its lower triangle) has only pivots > 0. */
    public static boolean positiveDefinite(InputNode in) {
        int d = in.vars().length;
        double[] p = in.params();
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
        return ok;
    }

    /** The document member of parameter {@code k} of {@code in}, e.g. {@code sd}, {@code probs/2}, {@code cov/0/1}. */
    public static String member(InputNode in, int k) {
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
}
