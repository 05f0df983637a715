package dev.circa.engine.internal;

import dev.circa.engine.CompileException;
import dev.circa.engine.family.Families;
import dev.circa.engine.family.ParameterLimits;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;
import java.util.Locale;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;

/** Builds {@link CircuitData} from a document in two passes over its nodes, checking every reference. */
public final class CircuitCompiler {
    private CircuitCompiler() {
    }

    /** Compiles {@code doc}; throws when a reference, a count or a parameter is broken. */
    public static CircuitData compile(CircuitDocument doc) throws CompileException {
        List<Variable> variables = doc.variables();
        // products and sums are read from the table's columns; an input is made a record (its checks use one)
        NodeTable t = doc.nodeTable();
        int n = t.size();
        if (n == 0) {
            throw new CompileException(-1, "the circuit has no nodes (expected at least one)");
        }
        int[] nodeId = new int[n];
        boolean identity = true;
        long edges = 0;
        int inputs = 0;
        long varTotal = 0;
        long paramTotal = 0;
        long factorTotal = 0;
        for (int i = 0; i < n; i++) {
            int id = t.id(i);
            if (id < 0) {
                throw new CompileException(i, where(i, id) + " has a negative id (expected >= 0)");
            }
            nodeId[i] = id;
            identity &= id == i;
            edges += t.childEnd(i) - t.childStart(i);
            if (t.kind(i) == NodeTable.INPUT) {
                inputs++;
                long nv = t.varEnd(i) - t.varStart(i);
                varTotal += nv;
                paramTotal += t.valueEnd(i) - t.valueStart(i);
                if (t.family(i) == Family.MVNORMAL) {
                    factorTotal += nv * nv + 1;
                }
            }
        }
        if (edges > Integer.MAX_VALUE - 8 || paramTotal > Integer.MAX_VALUE - 8 || factorTotal > Integer.MAX_VALUE - 8) {
            throw new CompileException(-1, "the circuit is too large to compile (more than 2^31 edges or parameters)");
        }
        IdIndex ids = null;
        if (!identity) {
            ids = new IdIndex(nodeId);
            for (int i = 0; i < n; i++) {
                int previous = ids.putIfAbsent(nodeId[i], i);
                if (previous >= 0) {
                    throw new CompileException(i, where(i, nodeId[i]) + " repeats the id of /nodes/" + previous
                            + " (expected unique ids)");
                }
            }
        }
        byte[] kind = new byte[n];
        int[] childStart = new int[n + 1];
        int[] childIndex = new int[(int) edges];
        double[] logWeight = new double[(int) edges];
        int[] inputSlot = new int[n];
        byte[] family = new byte[inputs];
        int[] inputNode = new int[inputs];
        int[] varStart = new int[inputs + 1];
        int[] varIndex = new int[(int) varTotal];
        int[] paramStart = new int[inputs + 1];
        double[] params = new double[(int) paramTotal];
        int[] factorStart = new int[inputs];
        double[] factor = new double[(int) factorTotal];
        int maxDim = 0;
        int e = 0;
        int slot = 0;
        int vp = 0;
        int pp = 0;
        int fp = 0;
        for (int i = 0; i < n; i++) {
            byte k = t.kind(i);
            childStart[i] = e;
            inputSlot[i] = -1;
            if (k == NodeTable.INPUT) {
                kind[i] = CircuitData.INPUT;
                inputSlot[i] = slot;
                inputNode[slot] = i;
                varStart[slot] = vp;
                paramStart[slot] = pp;
                factorStart[slot] = -1;
                if (plainInput(t, i, variables)) {
                    // the usual input, read from the columns (no record): what the record's way below does with it
                    family[slot] = (byte) Families.code(t.family(i), t.logForm(i));
                    varIndex[vp++] = t.var(t.varStart(i));
                    for (int q = t.valueStart(i); q < t.valueEnd(i); q++) {
                        params[pp++] = t.value(q);
                    }
                    maxDim = Math.max(maxDim, 1);
                } else {
                    InputNode in = (InputNode) t.node(i);
                    checkInput(i, in, variables);
                    family[slot] = (byte) Families.code(in.family(), in.logForm());
                    for (int v : in.vars()) {
                        varIndex[vp++] = v;
                    }
                    System.arraycopy(in.params(), 0, params, pp, in.params().length);
                    pp += in.params().length;
                    maxDim = Math.max(maxDim, in.vars().length);
                    if (in.family() == Family.MVNORMAL) {
                        factorStart[slot] = fp;
                        fp = choleskyInto(i, in, factor, fp);
                    }
                }
                slot++;
            } else {
                int c0 = t.childStart(i);
                int count = t.childEnd(i) - c0;
                if (count == 0) {
                    throw new CompileException(i, where(i, nodeId[i]) + " has no children (expected at least one)");
                }
                boolean sum = k == NodeTable.SUM;
                kind[i] = sum ? CircuitData.SUM : CircuitData.PRODUCT;
                boolean logWeights = sum && t.logForm(i);
                int w0 = t.valueStart(i);
                int weights = t.valueEnd(i) - w0;
                if (sum && weights != count) {
                    throw new CompileException(i, String.format(Locale.ROOT,
                            "%s has %d %s for %d children (expected one per child)", where(i, nodeId[i]),
                            weights, logWeights ? "logWeights" : "weights", count));
                }
                for (int j = 0; j < count; j++) {
                    int child = t.childId(c0 + j);
                    int c = ids == null ? (child >= 0 && child < n ? child : -1) : ids.get(child);
                    if (c < 0) {
                        throw new CompileException(i, where(i, nodeId[i]) + " refers to child id " + child
                                + ", which no node has");
                    }
                    if (c >= i) {
                        throw new CompileException(i, where(i, nodeId[i]) + " refers to child id " + child
                                + " at /nodes/" + c + ", which does not come earlier (expected children first)");
                    }
                    childIndex[e] = c;
                    if (sum) {
                        double w = t.value(w0 + j);
                        if (logWeights ? Double.isNaN(w) || w == Double.POSITIVE_INFINITY : !(w >= 0) || Double.isInfinite(w)) {
                            throw new CompileException(i, String.format(Locale.ROOT, "%s has %s %s for child %d (expected %s)",
                                    where(i, nodeId[i]), logWeights ? "log-weight" : "weight", w, j,
                                    logWeights ? "a finite number" : "a finite number >= 0"));
                        }
                        logWeight[e] = logWeights ? w : Math.log(w);
                    }
                    e++;
                }
            }
        }
        childStart[n] = e;
        varStart[inputs] = vp;
        paramStart[inputs] = pp;
        List<Output> outputs = doc.outputs();
        if (outputs.isEmpty()) {
            throw new CompileException(-1, "the circuit has no outputs (expected at least one)");
        }
        int[] outputNode = new int[outputs.size()];
        String[] outputName = new String[outputs.size()];
        for (int o = 0; o < outputs.size(); o++) {
            Output out = outputs.get(o);
            int c = ids == null ? (out.node() >= 0 && out.node() < n ? out.node() : -1) : ids.get(out.node());
            if (c < 0) {
                throw new CompileException(-1, "output \"" + out.name() + "\" names node id " + out.node()
                        + ", which no node has");
            }
            outputNode[o] = c;
            outputName[o] = out.name();
        }
        return new CircuitData(n, variables.size(), kind, nodeId, childStart, childIndex, logWeight, inputSlot, family,
                inputNode, varStart, varIndex, paramStart, params, factorStart, factor, maxDim, outputNode, outputName, ids);
    }

    private static String where(int i, int id) {
        return "node " + id + " (/nodes/" + i + ")";
    }

    /**
     * Whether input {@code i} is one {@link #checkInput} accepts without a word, told from the columns: one
     * variable in range whose type its family accepts, a family other than categorical, indicator and mvnormal,
     * its number of parameters, each finite and within its limit, in order.
     */
    private static boolean plainInput(NodeTable t, int i, List<Variable> variables) {
        Family f = t.family(i);
        if (f == Family.MVNORMAL || f == Family.CATEGORICAL || f == Family.INDICATOR || t.varEnd(i) - t.varStart(i) != 1) {
            return false;
        }
        int v = t.var(t.varStart(i));
        if (v < 0 || v >= variables.size() || !f.accepts(variables.get(v).type())) {
            return false;
        }
        return ParameterLimits.holds(t, i, Integer.MAX_VALUE);
    }

    private static void checkInput(int i, InputNode in, List<Variable> variables) throws CompileException {
        Family f = in.family();
        String at = where(i, in.id());
        int[] vars = in.vars();
        if (f == Family.MVNORMAL ? vars.length < 2 : vars.length != 1) {
            throw new CompileException(i, String.format(Locale.ROOT, "%s (%s) has %d variables (expected %s)", at,
                    f.jsonName(), vars.length, f == Family.MVNORMAL ? "2 or more" : "1"));
        }
        for (int a = 0; a < vars.length; a++) {
            int v = vars[a];
            if (v < 0 || v >= variables.size()) {
                throw new CompileException(i, String.format(Locale.ROOT,
                        "%s refers to variable %d (expected an index 0..%d)", at, v, variables.size() - 1));
            }
            Variable var = variables.get(v);
            if (!f.accepts(var.type())) {
                throw new CompileException(i, String.format(Locale.ROOT,
                        "%s is %s over variable %s of type %s (expected a variable of type %s)", at, f.jsonName(),
                        var.name(), var.type().jsonName(), typeNames(f)));
            }
            for (int b = 0; b < a; b++) {
                if (vars[b] == v) {
                    throw new CompileException(i, at + " names variable " + var.name() + " twice (expected distinct variables)");
                }
            }
        }
        double[] p = in.params();
        int expected = switch (f) {
            case CATEGORICAL -> variables.get(vars[0]).stateCount();
            case MVNORMAL -> vars.length + vars.length * vars.length;
            default -> f.parameters().size();
        };
        if (p.length != expected) {
            throw new CompileException(i, String.format(Locale.ROOT, "%s (%s) has %d parameter values (expected %d)",
                    at, f.jsonName(), p.length, expected));
        }
        for (int k = 0; k < p.length; k++) {
            boolean logProb = f == Family.CATEGORICAL && in.logForm();
            if (logProb ? Double.isNaN(p[k]) || p[k] == Double.POSITIVE_INFINITY : !Double.isFinite(p[k])) {
                throw new CompileException(i, String.format(Locale.ROOT, "%s (%s) has parameter value %s (expected a finite number)",
                        at, f.jsonName(), p[k]));
            }
        }
        boolean within = f == Family.MVNORMAL || f == Family.CATEGORICAL && in.logForm() || ParameterLimits.holds(f, p,
                f == Family.INDICATOR ? Math.max(2, variables.get(vars[0]).stateCount()) : Integer.MAX_VALUE);
        String problem = within ? null : switch (f) {
            case BERNOULLI -> "p = " + num(p[0]) + " (expected 0 <= p <= 1)";
            case CATEGORICAL -> negativeProbability(p);
            case INDICATOR -> "value = " + num(p[0]) + " (expected a state index of " + variables.get(vars[0]).name() + ")";
            case NORMAL -> "sd = " + num(p[1]) + " (expected > 0)";
            case LOGNORMAL -> "sigma = " + num(p[1]) + " (expected > 0)";
            case EXPONENTIAL, POISSON -> "rate = " + num(p[0]) + " (expected > 0)";
            case GAMMA -> "shape = " + num(p[0]) + ", rate = " + num(p[1]) + " (expected both > 0)";
            case BETA -> "alpha = " + num(p[0]) + ", beta = " + num(p[1]) + " (expected both > 0)";
            case UNIFORM -> "low = " + num(p[0]) + ", high = " + num(p[1]) + " (expected low < high)";
            case BINOMIAL -> "trials = " + num(p[0]) + ", p = " + num(p[1]) + " (expected an integer >= 0 and 0 <= p <= 1)";
            case MVNORMAL -> null;
        };
        if (problem != null) {
            throw new CompileException(i, at + " (" + f.jsonName() + ") has " + problem);
        }
    }

    private static String negativeProbability(double[] p) {
        for (int k = 0; k < p.length; k++) {
            if (p[k] < 0) {
                return "probs[" + k + "] = " + num(p[k]) + " (expected >= 0)";
            }
        }
        return null;
    }

    private static String num(double v) {
        return String.format(Locale.ROOT, "%s", v);
    }

    private static String typeNames(Family f) {
        StringBuilder b = new StringBuilder();
        for (VariableType t : VariableType.values()) {
            if (f.accepts(t)) {
                b.append(b.length() == 0 ? "" : " or ").append(t.jsonName());
            }
        }
        return b.toString();
    }

    /** Writes the lower Cholesky factor (row-major) and sum(log L_ii) at {@code factor[at]}; returns the next free index. */
    private static int choleskyInto(int i, InputNode in, double[] factor, int at) throws CompileException {
        int d = in.vars().length;
        double[] p = in.params();
        DMatrixRMaj cov = new DMatrixRMaj(d, d);
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                // the lower triangle is the covariance; the validator checks symmetry
                cov.set(r, c, r >= c ? p[d + r * d + c] : p[d + c * d + r]);
            }
        }
        CholeskyDecomposition_F64<DMatrixRMaj> chol = DecompositionFactory_DDRM.chol(d, true);
        boolean ok = chol.decompose(cov);
        DMatrixRMaj l = ok ? chol.getT(null) : null;
        double logDiag = 0;
        for (int r = 0; ok && r < d; r++) {
            double pivot = l.get(r, r);
            ok = pivot > 0 && Double.isFinite(pivot);
            logDiag += Math.log(pivot);
        }
        if (!ok) {
            throw new CompileException(i, where(i, in.id()) + " (mvnormal) has a covariance that is not positive definite"
                    + " (expected a successful Cholesky factorisation)");
        }
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                factor[at + r * d + c] = c <= r ? l.get(r, c) : 0;
            }
        }
        factor[at + d * d] = logDiag;
        return at + d * d + 1;
    }
}
