package dev.circa.engine;

import dev.circa.engine.family.Families;
import dev.circa.format.Family;
import java.util.Arrays;

/**
 * Every variable's exact one-variable marginal under every output of a smooth, decomposable circuit, from
 * one forward pass with every variable missing and one backward pass per output.
 *
 * <p>With every other variable missing, an output is a linear function of the values of the inputs over a
 * variable x (every induced tree of a smooth, decomposable circuit holds exactly one of them), so
 * p(x, rest missing) = sum over the inputs j over x of dOutput/dValue_j * f_j(x), where the derivative is
 * taken with every input at its missing value (its total mass). The marginal is thus a mixture of x's
 * inputs (an {@code mvnormal} input contributes the normal of its coordinate x); its components, their
 * log-weights per output and the log-partition are what this class holds. The values it gives are those
 * of {@link Evaluator#logDensity} on a row where only x is observed, to rounding; divide by the partition
 * function for the normalised marginal.
 *
 * <p>Layout: the components of variable v are entries {@code componentStart[v] .. componentStart[v+1]-1};
 * entry e has a family code, its parameters at {@code params[paramStart[e] .. paramStart[e+1]-1]} (an
 * {@code mvnormal} coordinate as {@code normal(mean, sd)}) and, for output o, the log-weight
 * {@code logWeight[o * entries + e]}. Both passes walk the node arrays by index, children before parents,
 * without recursion; memory is one double per node during a pass and per output and component after.
 * Immutable and thread-safe once built.
 */
public final class ExactMarginals {
    private final CompiledCircuit circuit;
    private final double[] logPartition;
    private final int[] componentStart;
    private final int[] componentNode;
    private final int[] code;
    private final int[] paramStart;
    private final double[] params;
    private final double[] logWeight;
    /** Every node's log-value with every variable missing (the forward pass). */
    private final double[] missing;

    private ExactMarginals(CompiledCircuit circuit, double[] logPartition, int[] componentStart, int[] componentNode,
            int[] code, int[] paramStart, double[] params, double[] logWeight, double[] missing) {
        this.circuit = circuit;
        this.missing = missing;
        this.logPartition = logPartition;
        this.componentStart = componentStart;
        this.componentNode = componentNode;
        this.code = code;
        this.paramStart = paramStart;
        this.params = params;
        this.logWeight = logWeight;
    }

    /**
     * The marginals of {@code circuit}, which the caller has proven smooth and decomposable (for other
     * circuits the mixtures are not the marginals).
     */
    public static ExactMarginals of(CompiledCircuit circuit) {
        int n = circuit.nodeCount();
        int nv = circuit.variableCount();
        int[] start = circuit.childStart();
        int[] child = circuit.childIndex();
        double[] w = circuit.logWeight();

        // components per variable, CSR by counting
        int[] componentStart = new int[nv + 1];
        for (int i = 0; i < n; i++) {
            if (circuit.kind(i) == NodeKind.INPUT) {
                for (int v : circuit.inputVars(i)) {
                    componentStart[v + 1]++;
                }
            }
        }
        for (int v = 0; v < nv; v++) {
            componentStart[v + 1] += componentStart[v];
        }
        int entries = componentStart[nv];
        int[] fill = Arrays.copyOf(componentStart, nv);
        int[] componentNode = new int[entries];
        int[] code = new int[entries];
        int[] paramLength = new int[entries];
        double[][] entryParams = new double[entries][];
        double[] value = new double[n];
        for (int i = 0; i < n; i++) {
            switch (circuit.kind(i)) {
                case INPUT -> {
                    int c = Families.code(circuit.inputFamily(i), circuit.inputLogForm(i));
                    double[] p = circuit.inputParams(i);
                    int[] vars = circuit.inputVars(i);
                    value[i] = c == Families.MVNORMAL ? 0 : Families.logTotalMass(c, p, 0, p.length);
                    for (int a = 0; a < vars.length; a++) {
                        int e = fill[vars[a]]++;
                        componentNode[e] = i;
                        if (c == Families.MVNORMAL) {
                            int d = vars.length;
                            code[e] = Families.NORMAL;
                            entryParams[e] = new double[] {p[a], Math.sqrt(p[d + a * d + a])};
                        } else {
                            code[e] = c;
                            entryParams[e] = p;
                        }
                        paramLength[e] = entryParams[e].length;
                    }
                }
                case PRODUCT -> {
                    double s = 0;
                    for (int e = start[i]; e < start[i + 1]; e++) {
                        s += value[child[e]];
                    }
                    value[i] = start[i] == start[i + 1] ? 0 : s;
                }
                case SUM -> {
                    double s = Double.NEGATIVE_INFINITY;
                    for (int e = start[i]; e < start[i + 1]; e++) {
                        s = logAdd(s, w[e] + value[child[e]]);
                    }
                    value[i] = s;
                }
            }
        }
        int[] paramStart = new int[entries + 1];
        for (int e = 0; e < entries; e++) {
            paramStart[e + 1] = paramStart[e] + paramLength[e];
        }
        double[] params = new double[paramStart[entries]];
        for (int e = 0; e < entries; e++) {
            System.arraycopy(entryParams[e], 0, params, paramStart[e], paramLength[e]);
        }

        int outputs = circuit.outputCount();
        double[] logPartition = new double[outputs];
        double[] logWeight = new double[outputs * entries];
        double[] d = new double[n];
        for (int o = 0; o < outputs; o++) {
            int root = circuit.outputNode(o);
            logPartition[o] = value[root];
            backward(circuit, value, root, d);
            for (int e = 0; e < entries; e++) {
                logWeight[o * entries + e] = d[componentNode[e]];
            }
        }
        return new ExactMarginals(circuit, logPartition, componentStart, componentNode, code, paramStart, params,
                logWeight, value);
    }

    /**
     * Log of the derivative of the root's value with respect to each node's value, every input at its
     * missing value; nodes are visited from the last to the first, so each parent is done before its children.
     */
    private static void backward(CompiledCircuit circuit, double[] value, int root, double[] d) {
        int[] start = circuit.childStart();
        int[] child = circuit.childIndex();
        double[] w = circuit.logWeight();
        Arrays.fill(d, Double.NEGATIVE_INFINITY);
        d[root] = 0;
        for (int i = root; i >= 0; i--) {
            double di = d[i];
            if (di == Double.NEGATIVE_INFINITY) {
                continue;
            }
            NodeKind kind = circuit.kind(i);
            if (kind == NodeKind.SUM) {
                for (int e = start[i]; e < start[i + 1]; e++) {
                    d[child[e]] = logAdd(d[child[e]], di + w[e]);
                }
            } else if (kind == NodeKind.PRODUCT) {
                // the product of the other children: the finite sum minus the child's own log-value, or, when
                // exactly one child is zero, the finite sum for that child and zero for the rest
                double finite = 0;
                int zeros = 0;
                for (int e = start[i]; e < start[i + 1]; e++) {
                    double v = value[child[e]];
                    if (v == Double.NEGATIVE_INFINITY) {
                        zeros++;
                    } else {
                        finite += v;
                    }
                }
                for (int e = start[i]; e < start[i + 1]; e++) {
                    double v = value[child[e]];
                    double others;
                    if (v == Double.NEGATIVE_INFINITY) {
                        others = zeros == 1 ? finite : Double.NEGATIVE_INFINITY;
                    } else {
                        others = zeros == 0 ? finite - v : Double.NEGATIVE_INFINITY;
                    }
                    d[child[e]] = logAdd(d[child[e]], di + others);
                }
            }
        }
    }

    /** The forward pass over the inner nodes, the inputs' log-values already in {@code value}. */
    private static void forwardInner(CompiledCircuit circuit, double[] value) {
        int[] start = circuit.childStart();
        int[] child = circuit.childIndex();
        double[] w = circuit.logWeight();
        for (int i = 0; i < value.length; i++) {
            NodeKind kind = circuit.kind(i);
            if (kind == NodeKind.PRODUCT) {
                double s = 0;
                for (int e = start[i]; e < start[i + 1]; e++) {
                    s += value[child[e]];
                }
                value[i] = s;
            } else if (kind == NodeKind.SUM) {
                double s = Double.NEGATIVE_INFINITY;
                for (int e = start[i]; e < start[i + 1]; e++) {
                    s = logAdd(s, w[e] + value[child[e]]);
                }
                value[i] = s;
            }
        }
    }

    /**
     * log p(x_a = xa[i], x_b = xb[j], every other variable missing) under every output, unnormalised (as the
     * evaluator gives it), for a != b. One forward and one backward pass per value of a: with a observed, the
     * output is linear in the inputs over b, so each row of the grid is a mixture of b's inputs; an input over
     * both (an {@code mvnormal}) contributes its two-coordinate normal at (xa[i], xb[j]).
     *
     * @param a input: the first variable
     * @param xa input: {@code na} values of a
     * @param na input: number of values of a
     * @param b input: the second variable
     * @param xb input: {@code nb} values of b
     * @param nb input: number of values of b
     * @param out output: {@code out[(i * nb + j) * outputCount + o]}
     */
    public void pairLogDensity(int a, double[] xa, int na, int b, double[] xb, int nb, double[] out) {
        int outputs = circuit.outputCount();
        if (a == b || xa.length < na || xb.length < nb || out.length < (long) na * nb * outputs) {
            throw new IllegalArgumentException("two different variables, na values of a, nb of b and na x nb x outputs"
                    + " entries of out are needed");
        }
        int n = circuit.nodeCount();
        double[] value = new double[n];
        double[] d = new double[n];
        double[] f = new double[nb];
        boolean[] overA = new boolean[n];
        for (int e = componentStart[a]; e < componentStart[a + 1]; e++) {
            overA[componentNode[e]] = true;
        }
        Arrays.fill(out, 0, na * nb * outputs, Double.NEGATIVE_INFINITY);
        for (int i = 0; i < na; i++) {
            System.arraycopy(missing, 0, value, 0, n);
            for (int e = componentStart[a]; e < componentStart[a + 1]; e++) {
                int off = paramStart[e];
                value[componentNode[e]] = Families.logDensity(code[e], params, off, paramStart[e + 1] - off, xa[i]);
            }
            forwardInner(circuit, value);
            for (int o = 0; o < outputs; o++) {
                backward(circuit, value, circuit.outputNode(o), d);
                for (int e = componentStart[b]; e < componentStart[b + 1]; e++) {
                    int node = componentNode[e];
                    if (d[node] == Double.NEGATIVE_INFINITY) {
                        continue;
                    }
                    if (overA[node]) {
                        bivariate(node, a, xa[i], b, xb, nb, f);
                    } else {
                        int off = paramStart[e];
                        for (int j = 0; j < nb; j++) {
                            f[j] = Families.logDensity(code[e], params, off, paramStart[e + 1] - off, xb[j]);
                        }
                    }
                    for (int j = 0; j < nb; j++) {
                        int k = (i * nb + j) * outputs + o;
                        out[k] = logAdd(out[k], d[node] + f[j]);
                    }
                }
            }
        }
    }

    /** The log-density of the normal of an mvnormal input's coordinates (a, b) at (x, y[j]) for every j. */
    private void bivariate(int node, int a, double x, int b, double[] y, int nb, double[] out) {
        int[] vars = circuit.inputVars(node);
        double[] p = circuit.inputParams(node);
        int dim = vars.length;
        int ia = -1;
        int ib = -1;
        for (int k = 0; k < dim; k++) {
            ia = vars[k] == a ? k : ia;
            ib = vars[k] == b ? k : ib;
        }
        double sa = p[dim + ia * dim + ia];
        double sb = p[dim + ib * dim + ib];
        double sab = p[dim + ia * dim + ib];
        double det = sa * sb - sab * sab;
        for (int j = 0; j < nb; j++) {
            double u = x - p[ia];
            double v = y[j] - p[ib];
            double q = (sb * u * u - 2 * sab * u * v + sa * v * v) / det;
            out[j] = -0.5 * q - 0.5 * Math.log(det) - Math.log(2 * Math.PI);
        }
    }

    private static double logAdd(double a, double b) {
        if (a == Double.NEGATIVE_INFINITY) {
            return b;
        }
        if (b == Double.NEGATIVE_INFINITY || Double.isNaN(b)) {
            return Double.isNaN(b) ? b : a;
        }
        return a > b ? a + Math.log1p(Math.exp(b - a)) : b + Math.log1p(Math.exp(a - b));
    }

    /** The circuit these marginals are of. */
    public CompiledCircuit circuit() {
        return circuit;
    }

    /** log Z of output {@code o}: its value with every variable missing. */
    public double logPartition(int o) {
        return logPartition[o];
    }

    /** Number of mixture components (inputs over the variable) of variable {@code v}. */
    public int componentCount(int v) {
        return componentStart[v + 1] - componentStart[v];
    }

    /** The family of component {@code k} of variable {@code v} ({@code normal} for an mvnormal coordinate). */
    public Family componentFamily(int v, int k) {
        return Families.family(code[componentStart[v] + k]);
    }

    /** Whether component {@code k} of variable {@code v} is a categorical given by log-probabilities. */
    public boolean componentLogForm(int v, int k) {
        return code[componentStart[v] + k] == Families.CATEGORICAL_LOG;
    }

    /** A copy of the parameters of component {@code k} of variable {@code v}, in {@link Family#parameters()} order. */
    public double[] componentParams(int v, int k) {
        int e = componentStart[v] + k;
        return Arrays.copyOfRange(params, paramStart[e], paramStart[e + 1]);
    }

    /** The input node (index) of component {@code k} of variable {@code v}. */
    public int componentNode(int v, int k) {
        return componentNode[componentStart[v] + k];
    }

    /** log dOutput/dValue of component {@code k} of variable {@code v} under output {@code o} (-inf when unreached). */
    public double componentLogWeight(int o, int v, int k) {
        return logWeight[o * componentStart[componentStart.length - 1] + componentStart[v] + k];
    }

    /** Whether some component of {@code v} is reached from output {@code o} with a weight above 0. */
    public boolean inScope(int o, int v) {
        for (int k = 0; k < componentCount(v); k++) {
            if (componentLogWeight(o, v, k) > Double.NEGATIVE_INFINITY) {
                return true;
            }
        }
        return false;
    }

    /**
     * log p(x_v = x, every other variable missing) under output {@code o}, unnormalised (as the evaluator
     * gives it): subtract {@link #logPartition(int)} for the normalised marginal.
     *
     * @param o input: the output
     * @param v input: the variable
     * @param x input: {@code n} values of v (state indices or counts for a discrete variable; NaN gives log Z)
     * @param n input: number of values
     * @param out output: {@code n} log-values
     */
    public void logDensity(int o, int v, double[] x, int n, double[] out) {
        if (x.length < n || out.length < n) {
            throw new IllegalArgumentException("x and out need " + n + " entries");
        }
        int entries = componentStart[componentStart.length - 1];
        Arrays.fill(out, 0, n, Double.NEGATIVE_INFINITY);
        for (int e = componentStart[v]; e < componentStart[v + 1]; e++) {
            double lw = logWeight[o * entries + e];
            if (lw == Double.NEGATIVE_INFINITY) {
                continue;
            }
            int off = paramStart[e];
            int len = paramStart[e + 1] - off;
            double mass = Families.logTotalMass(code[e], params, off, len);
            for (int r = 0; r < n; r++) {
                double f = Double.isNaN(x[r]) ? mass : Families.logDensity(code[e], params, off, len, x[r]);
                out[r] = logAdd(out[r], lw + f);
            }
        }
    }
}
