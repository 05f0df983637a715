package dev.circa.converter.regions;

import dev.circa.converter.npz.NpyArray;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SourceLocation;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * The parameters of a compiled region graph: each sum's weights (or log-weights) and each input's
 * parameters, laid out as FORMAT.md section 3 says, for one {@link RegionStructure} and
 * {@link CompileOptions}. They come from a seed, from a NumPy archive, or from a compiled circuit
 * (for export), and go to a circuit ({@link RegionCompiler}) or to an archive ({@link #toArchive()}).
 *
 * <p><b>Seeded parameters</b> are drawn with one {@link SplitMix64}, regions children first,
 * in node order: each sum's weights from a symmetric Dirichlet with alpha = {@value #DIRICHLET_ALPHA}
 * (Gamma(alpha) draws normalised); each input's parameters uniformly from a range that suits its
 * family: normal mean in [-2, 2), sd in [0.5, 1.5); lognormal mu in [-1, 1), sigma in [0.25, 1);
 * exponential rate in [0.5, 2); gamma shape in [1, 5), rate in [0.5, 2); beta alpha and beta in
 * [0.5, 5); uniform low in [-2, 0), high = low + [1, 3); poisson rate in [0.5, 10); binomial
 * trials 10, p in [0.05, 0.95); bernoulli p in [0.05, 0.95); categorical probs from a
 * Dirichlet(1); indicator value = bundle index modulo the number of states.
 *
 * <p>Immutable; the arrays it hands out must not be modified.
 */
public final class RegionParameters {
    /** The concentration of the symmetric Dirichlet that seeded weights are drawn from. */
    public static final double DIRICHLET_ALPHA = 1.0;

    private final RegionStructure structure;
    private final CompileOptions options;
    private final Layout layout;
    private final double[][][] weights;
    private final boolean[] logWeights;
    private final double[][][] inputs;

    private RegionParameters(RegionStructure structure, CompileOptions options, double[][][] weights,
            boolean[] logWeights, double[][][] inputs) {
        this.structure = structure;
        this.options = options;
        this.layout = new Layout(structure, options);
        this.weights = weights;
        this.logWeights = logWeights;
        this.inputs = inputs;
    }

    /** The structure these parameters belong to. */
    public RegionStructure structure() {
        return structure;
    }

    /** The options these parameters belong to. */
    public CompileOptions options() {
        return options;
    }

    Layout layout() {
        return layout;
    }

    /** Whether region {@code r} has sums (an inner region, or the root). */
    public boolean hasSums(int r) {
        return layout.hasSums(r);
    }

    /** Number of sums of region {@code r}. */
    public int sumCount(int r) {
        return layout.sums(r);
    }

    /** Number of children of each sum of region {@code r}. */
    public int childCount(int r) {
        return layout.children(r);
    }

    /** The weights (log-weights when {@link #logWeights(int)}) of sum {@code k} of region {@code r}. */
    public double[] weights(int r, int k) {
        return weights[r][k];
    }

    /** Whether region {@code r}'s weights are log-weights. */
    public boolean logWeights(int r) {
        return logWeights[r];
    }

    /** The parameters (in {@link Family} layout) of the input for variable position {@code j} of bundle {@code i} of leaf {@code r}. */
    public double[] inputParams(int r, int i, int j) {
        return inputs[r][i * structure.vars(r).length + j];
    }

    /** The family of variable {@code var}. */
    public Family family(int var) {
        return options.family(structure.variables().get(var).type());
    }

    // ---------------------------------------------------------------- seeded

    /** Random, valid, normalised parameters drawn from {@code seed} (see the class comment). */
    public static RegionParameters seeded(RegionStructure s, CompileOptions o, long seed) {
        SplitMix64 rng = new SplitMix64(seed);
        Layout layout = new Layout(s, o);
        int nr = s.regionCount();
        double[][][] w = new double[nr][][];
        double[][][] in = new double[nr][][];
        for (int r : s.order()) {
            if (s.isLeaf(r)) {
                int[] vars = s.vars(r);
                in[r] = new double[o.inputs() * vars.length][];
                for (int i = 0; i < o.inputs(); i++) {
                    for (int j = 0; j < vars.length; j++) {
                        Variable v = s.variables().get(vars[j]);
                        in[r][i * vars.length + j] = draw(rng, o.family(v.type()), v, i);
                    }
                }
            }
            if (layout.hasSums(r)) {
                int k = layout.sums(r);
                int c = layout.children(r);
                w[r] = new double[k][];
                for (int t = 0; t < k; t++) {
                    w[r][t] = new double[c];
                    rng.dirichlet(DIRICHLET_ALPHA, w[r][t], 0, c);
                }
            }
        }
        return new RegionParameters(s, o, w, new boolean[nr], in);
    }

    private static double[] draw(SplitMix64 rng, Family f, Variable v, int bundle) {
        return switch (f) {
            case NORMAL -> new double[] {rng.uniform(-2, 2), rng.uniform(0.5, 1.5)};
            case LOGNORMAL -> new double[] {rng.uniform(-1, 1), rng.uniform(0.25, 1)};
            case EXPONENTIAL -> new double[] {rng.uniform(0.5, 2)};
            case GAMMA -> new double[] {rng.uniform(1, 5), rng.uniform(0.5, 2)};
            case BETA -> new double[] {rng.uniform(0.5, 5), rng.uniform(0.5, 5)};
            case UNIFORM -> {
                double low = rng.uniform(-2, 0);
                yield new double[] {low, low + rng.uniform(1, 3)};
            }
            case POISSON -> new double[] {rng.uniform(0.5, 10)};
            case BINOMIAL -> new double[] {10, rng.uniform(0.05, 0.95)};
            case BERNOULLI -> new double[] {rng.uniform(0.05, 0.95)};
            case CATEGORICAL -> {
                double[] p = new double[v.stateCount()];
                rng.dirichlet(1.0, p, 0, p.length);
                yield p;
            }
            case INDICATOR -> new double[] {bundle % v.stateCount()};
            case MVNORMAL -> throw new IllegalArgumentException("mvnormal is not a compile family");
        };
    }

    // ---------------------------------------------------------------- from an archive

    /**
     * Parameters from a NumPy archive in the layout of FORMAT.md section 3.
     *
     * @throws FormatException when an array is missing, extra, misshapen, given both per variable
     *     and per region, or holds a value outside its parameter's range; the message names the array
     */
    public static RegionParameters fromArchive(RegionStructure s, CompileOptions o, NpzArchive a) throws FormatException {
        return new ArchiveReader(s, o, a).read();
    }

    /** Reads one archive against one layout. */
    private static final class ArchiveReader {
        private final RegionStructure s;
        private final CompileOptions o;
        private final NpzArchive a;
        private final Layout layout;
        private final String file;
        private final Set<String> used = new HashSet<>();

        ArchiveReader(RegionStructure s, CompileOptions o, NpzArchive a) {
            this.s = s;
            this.o = o;
            this.a = a;
            this.layout = new Layout(s, o);
            this.file = a.source();
        }

        RegionParameters read() throws FormatException {
            int nr = s.regionCount();
            double[][][] w = new double[nr][][];
            boolean[] logw = new boolean[nr];
            double[][][] in = new double[nr][][];
            for (int r = 0; r < nr; r++) {
                if (s.isLeaf(r)) {
                    in[r] = readInputs(r);
                }
                if (layout.hasSums(r)) {
                    String lin = "r" + s.id(r) + ".weights";
                    String log = "r" + s.id(r) + ".logweights";
                    NpyArray wa = a.get(lin);
                    NpyArray la = a.get(log);
                    if (wa != null && la != null) {
                        throw fail(lin, "region " + s.id(r) + "'s weights are given twice, as " + lin + " and as " + log
                                + "; expected one of them");
                    }
                    int k = layout.sums(r);
                    int c = layout.children(r);
                    if (wa == null && la == null) {
                        throw fail(lin, "missing: region " + s.id(r) + " needs " + lin + " (or " + log + ") of shape "
                                + NpyArray.shapeText(new int[] {k, c}) + " (" + k + " sums by " + c + " children)");
                    }
                    NpyArray arr = wa != null ? wa : la;
                    logw[r] = wa == null;
                    shape(arr, new int[] {k, c}, k + " sums by " + c + " children");
                    used.add(arr.name());
                    w[r] = new double[k][];
                    for (int t = 0; t < k; t++) {
                        double[] row = new double[c];
                        for (int j = 0; j < c; j++) {
                            int at = t * c + j;
                            double x = arr.value(at);
                            if (logw[r] && x == Double.NEGATIVE_INFINITY) {
                                throw fail(arr.name(), String.format(Locale.ROOT,
                                        "value at [%d, %d] is -inf, which a circuit file cannot hold; give a zero weight in %s",
                                        t, j, lin));
                            }
                            boolean ok = logw[r] ? Double.isFinite(x) : Double.isFinite(x) && x >= 0;
                            if (!ok) {
                                throw fail(arr.name(), String.format(Locale.ROOT, "value at [%d, %d] is %s; expected %s",
                                        t, j, x, logw[r] ? "a finite log-weight" : "a finite weight >= 0"));
                            }
                            row[j] = x;
                        }
                        w[r][t] = row;
                    }
                }
            }
            List<String> extra = new ArrayList<>();
            for (String n : a.names()) {
                if (!used.contains(n)) {
                    extra.add(n);
                }
            }
            if (!extra.isEmpty()) {
                throw fail(extra.get(0), "unexpected: no region or parameter of this region graph with K=" + o.sums()
                        + ", I=" + o.inputs() + ", C=" + o.outputs() + " and these families has this name"
                        + (extra.size() > 1 ? " (" + extra.size() + " unexpected arrays: " + list(extra) + ")" : ""));
            }
            return new RegionParameters(s, o, w, logw, in);
        }

        private double[][] readInputs(int r) throws FormatException {
            int[] vars = s.vars(r);
            int n = vars.length;
            int bundles = o.inputs();
            String id = "r" + s.id(r);
            Family[] fam = new Family[n];
            Set<String> names = new LinkedHashSet<>();
            for (int j = 0; j < n; j++) {
                fam[j] = o.family(s.variables().get(vars[j]).type());
                names.addAll(fam[j].parameters());
            }
            double[][][] values = new double[n][][];
            for (int j = 0; j < n; j++) {
                values[j] = new double[fam[j].parameters().size()][];
            }
            for (String q : names) {
                int[] group = new int[n];
                int g = 0;
                for (int j = 0; j < n; j++) {
                    if (fam[j].parameters().contains(q)) {
                        group[g++] = j;
                    }
                }
                group = Arrays.copyOf(group, g);
                boolean probs = q.equals("probs");
                String shorthand = id + "." + q;
                NpyArray sh = a.get(shorthand);
                if (sh != null) {
                    used.add(shorthand);
                    for (int j : group) {
                        String per = id + ".v" + vars[j] + "." + q;
                        if (a.contains(per)) {
                            throw fail(per, "the " + q + " of variable " + vars[j] + " in region " + s.id(r)
                                    + " is given twice, as " + per + " and in " + shorthand + "; expected one of them");
                        }
                    }
                    int states = 0;
                    if (probs) {
                        states = stateCount(vars[group[0]]);
                        for (int j : group) {
                            if (stateCount(vars[j]) != states) {
                                throw fail(shorthand, "the categorical variables of region " + s.id(r)
                                        + " have different numbers of states, so their probs cannot share one array;"
                                        + " expected " + id + ".v<VAR>.probs per variable");
                            }
                        }
                        shape(sh, new int[] {bundles, g, states}, bundles + " bundles by " + g + " variables by "
                                + states + " states");
                    } else {
                        shape(sh, new int[] {bundles, g}, bundles + " bundles by " + g + " variables in the order of vars");
                    }
                    for (int gi = 0; gi < g; gi++) {
                        int j = group[gi];
                        double[] col = new double[probs ? bundles * states : bundles];
                        for (int i = 0; i < bundles; i++) {
                            if (probs) {
                                for (int t = 0; t < states; t++) {
                                    col[i * states + t] = sh.value((i * g + gi) * states + t);
                                }
                            } else {
                                col[i] = sh.value(i * g + gi);
                            }
                        }
                        values[j][fam[j].parameters().indexOf(q)] = col;
                    }
                } else {
                    for (int j : group) {
                        String per = id + ".v" + vars[j] + "." + q;
                        NpyArray pa = a.get(per);
                        int[] want = probs ? new int[] {bundles, stateCount(vars[j])} : new int[] {bundles};
                        if (pa == null) {
                            int[] alt = probs ? new int[] {bundles, g, stateCount(vars[j])} : new int[] {bundles, g};
                            throw fail(per, "missing: the " + q + " of variable " + vars[j] + " ("
                                    + s.variables().get(vars[j]).name() + ") in region " + s.id(r) + " needs " + per
                                    + " of shape " + NpyArray.shapeText(want) + " or " + shorthand + " of shape "
                                    + NpyArray.shapeText(alt));
                        }
                        used.add(per);
                        shape(pa, want, probs ? bundles + " bundles by " + want[1] + " states" : bundles + " bundles");
                        values[j][fam[j].parameters().indexOf(q)] = pa.values();
                    }
                }
            }
            double[][] out = new double[bundles * n][];
            for (int j = 0; j < n; j++) {
                Variable v = s.variables().get(vars[j]);
                Family f = fam[j];
                for (int i = 0; i < bundles; i++) {
                    double[] p;
                    if (f == Family.CATEGORICAL) {
                        int st = v.stateCount();
                        p = Arrays.copyOfRange(values[j][0], i * st, (i + 1) * st);
                    } else {
                        p = new double[f.parameters().size()];
                        for (int q = 0; q < p.length; q++) {
                            p[q] = values[j][q][i];
                        }
                    }
                    check(r, vars[j], i, f, p);
                    out[i * n + j] = p;
                }
            }
            return out;
        }

        private int stateCount(int var) {
            return s.variables().get(var).stateCount();
        }

        private void check(int r, int var, int bundle, Family f, double[] p) throws FormatException {
            String base = "r" + s.id(r) + ".v" + var + ".";
            String at = " (variable " + var + ", bundle " + bundle + ")";
            List<String> names = f.parameters();
            for (int q = 0; q < p.length; q++) {
                String name = f == Family.CATEGORICAL ? "probs" : names.get(q);
                String arr = arrayName(r, var, name);
                double x = p[q];
                String problem = null;
                if (!Double.isFinite(x)) {
                    problem = "a finite number";
                } else {
                    switch (name) {
                        case "p" -> problem = x >= 0 && x <= 1 ? null : "p in [0, 1]";
                        case "probs" -> problem = x >= 0 ? null : "probabilities >= 0";
                        case "sd", "sigma", "rate", "shape", "alpha", "beta" -> problem = x > 0 ? null : name + " > 0";
                        case "trials" -> problem = x >= 0 && x == Math.rint(x) && x <= Integer.MAX_VALUE ? null
                                : "an integer number of trials >= 0";
                        case "value" -> problem = x >= 0 && x == Math.rint(x) && x < stateCount(var) ? null
                                : "a state index from 0 to " + (stateCount(var) - 1);
                        default -> problem = null;
                    }
                }
                if (problem != null) {
                    throw fail(arr, "the " + name + " of variable " + var + ", bundle " + bundle + " is " + x
                            + "; expected " + problem);
                }
            }
            if (f == Family.UNIFORM && !(p[0] < p[1])) {
                throw fail(arrayName(r, var, "low"), "low " + p[0] + " is not below high " + p[1] + at + " in " + base
                        + "low/high; expected low < high");
            }
        }

        private String arrayName(int r, int var, String param) {
            String per = "r" + s.id(r) + ".v" + var + "." + param;
            return a.contains(per) ? per : "r" + s.id(r) + "." + param;
        }

        private void shape(NpyArray arr, int[] want, String meaning) throws FormatException {
            if (!Arrays.equals(arr.shape(), want)) {
                throw fail(arr.name(), "has shape " + arr.shapeText() + "; expected " + NpyArray.shapeText(want) + " ("
                        + meaning + ")");
            }
        }

        private FormatException fail(String array, String problem) {
            return new FormatException(file, 0, 0, null, "array " + array + ": " + problem);
        }

        private static String list(List<String> names) {
            return String.join(", ", names.size() > 5 ? names.subList(0, 5) : names) + (names.size() > 5 ? ", ..." : "");
        }
    }

    // ---------------------------------------------------------------- from a circuit

    /**
     * The parameters of a circuit compiled from {@code s}, for export. K, I, C and the families are
     * read off the circuit; every node must be where compiling the graph with them puts it.
     *
     * @throws FormatException located at the first node that does not match the layout
     */
    public static RegionParameters fromCircuit(RegionStructure s, CircuitDocument c) throws FormatException {
        List<Node> nodes = c.nodes();
        String file = c.source();
        int inputs = 0;
        int sums = 0;
        Map<VariableType, Family> fam = new EnumMap<>(VariableType.class);
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            if (n instanceof InputNode in) {
                inputs++;
                if (in.vars().length != 1 || in.vars()[0] < 0 || in.vars()[0] >= s.variables().size()) {
                    throw notCompiled(c, i, "an input over one variable of the region graph");
                }
                VariableType t = s.variables().get(in.var()).type();
                Family prev = fam.putIfAbsent(t, in.family());
                if (prev != null && prev != in.family()) {
                    throw notCompiled(c, i, "a " + prev.jsonName() + " input, as for the other " + t.jsonName()
                            + " variables");
                }
            } else if (n instanceof SumNode) {
                sums++;
            }
        }
        int outputs = c.outputs().size();
        long leafVars = 0;
        int innerBelowRoot = 0;
        for (int r = 0; r < s.regionCount(); r++) {
            if (s.isLeaf(r)) {
                leafVars += s.vars(r).length;
            } else if (r != s.root()) {
                innerBelowRoot++;
            }
        }
        if (outputs < 1 || inputs == 0 || inputs % leafVars != 0) {
            throw new FormatException(file, 0, 0, null, "the circuit has " + inputs + " inputs and " + outputs
                    + " outputs, which compiling the region graph (" + leafVars
                    + " variables in leaf regions) cannot give; expected a circuit compiled from this region graph");
        }
        int bundles = (int) (inputs / leafVars);
        int k = 1;
        if (innerBelowRoot > 0) {
            if ((sums - outputs) <= 0 || (sums - outputs) % innerBelowRoot != 0) {
                throw new FormatException(file, 0, 0, null, "the circuit has " + sums + " sums and " + outputs
                        + " outputs, which compiling the region graph (" + innerBelowRoot
                        + " inner regions below the root) cannot give; expected a circuit compiled from this region graph");
            }
            k = (sums - outputs) / innerBelowRoot;
        }
        CompileOptions o;
        try {
            o = new CompileOptions(k, bundles, outputs, fam);
        } catch (IllegalArgumentException e) {
            throw new FormatException(file, 0, 0, null, e.getMessage());
        }
        Map<Integer, Integer> positionOfId = new HashMap<>();
        boolean identity = true;
        for (int i = 0; i < nodes.size(); i++) {
            if (nodes.get(i).id() != i) {
                identity = false;
                break;
            }
        }
        if (!identity) {
            for (int i = 0; i < nodes.size(); i++) {
                positionOfId.put(nodes.get(i).id(), i);
            }
        }
        int nr = s.regionCount();
        double[][][] w = new double[nr][][];
        boolean[] logw = new boolean[nr];
        double[][][] in = new double[nr][][];
        Layout layout = new Layout(s, o);
        for (int r = 0; r < nr; r++) {
            if (s.isLeaf(r)) {
                in[r] = new double[bundles * s.vars(r).length][];
            }
            if (layout.hasSums(r)) {
                w[r] = new double[layout.sums(r)][];
            }
        }
        final boolean ident = identity;
        int[] count = {0};
        Layout.Visitor v = new Layout.Visitor() {
            private int position(int childId, int at) throws FormatException {
                if (ident) {
                    return childId;
                }
                Integer p = positionOfId.get(childId);
                if (p == null) {
                    throw notCompiled(c, at, "children that exist");
                }
                return p;
            }

            private Node at(int position) throws FormatException {
                if (position >= nodes.size()) {
                    throw new FormatException(file, 0, 0, "/nodes", "the circuit has " + nodes.size()
                            + " nodes; compiling the region graph with K=" + o.sums() + ", I=" + o.inputs() + ", C="
                            + o.outputs() + " gives more");
                }
                count[0]++;
                return nodes.get(position);
            }

            private void children(int position, int[] got, int[] want, String what) throws FormatException {
                if (got.length != want.length) {
                    throw notCompiled(c, position, what);
                }
                for (int j = 0; j < want.length; j++) {
                    if (position(got[j], position) != want[j]) {
                        throw notCompiled(c, position, what);
                    }
                }
            }

            @Override
            public void input(int position, int region, int bundle, int varPos) throws FormatException {
                Node n = at(position);
                int var = s.vars(region)[varPos];
                if (!(n instanceof InputNode inNode) || inNode.var() != var) {
                    throw notCompiled(c, position, "an input of variable " + var + " (region " + s.id(region)
                            + ", bundle " + bundle + ")");
                }
                double[] p = inNode.params();
                if (inNode.logForm()) {
                    p = p.clone();
                    for (int j = 0; j < p.length; j++) {
                        p[j] = Math.exp(p[j]);
                    }
                }
                in[region][bundle * s.vars(region).length + varPos] = p;
            }

            @Override
            public void product(int position, int region, int[] kids) throws FormatException {
                Node n = at(position);
                if (!(n instanceof ProductNode p)) {
                    throw notCompiled(c, position, "a product of region " + s.id(region));
                }
                children(position, p.children(), kids, "a product of region " + s.id(region)
                        + " with the children the layout gives");
            }

            @Override
            public void sum(int position, int region, int k2, int[] kids) throws FormatException {
                Node n = at(position);
                if (!(n instanceof SumNode sn)) {
                    throw notCompiled(c, position, "sum " + k2 + " of region " + s.id(region));
                }
                children(position, sn.children(), kids, "sum " + k2 + " of region " + s.id(region)
                        + " with the children the layout gives");
                if (k2 == 0) {
                    logw[region] = sn.logWeights();
                }
                double[] ws = sn.weights();
                if (sn.logWeights() != logw[region]) {
                    ws = new double[kids.length];
                    for (int j = 0; j < ws.length; j++) {
                        ws[j] = logw[region] ? sn.logWeight(j) : sn.weight(j);
                    }
                }
                w[region][k2] = ws;
            }
        };
        int[] roots;
        try {
            roots = layout.walk(v);
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, e.getMessage());
        }
        if (count[0] != nodes.size()) {
            throw notCompiled(c, count[0], "no further node (compiling the region graph gives " + count[0] + " nodes)");
        }
        for (int t = 0; t < outputs; t++) {
            int node = c.outputs().get(t).node();
            int p = identity ? node : positionOfId.getOrDefault(node, -1);
            if (p != roots[t]) {
                throw new FormatException(file, 0, 0, "/outputs/" + t, "output " + c.outputs().get(t).name()
                        + " is not sum " + t + " of the root region; expected a circuit compiled from this region graph");
            }
        }
        return new RegionParameters(s, o, w, logw, in);
    }

    private static FormatException notCompiled(CircuitDocument c, int position, String expected) {
        SourceLocation l = c.nodeLocation(position);
        return new FormatException(c.source(), l.line(), l.column(), l.pointer(), "node " + position
                + " is not what compiling the region graph gives there; expected " + expected);
    }

    // ---------------------------------------------------------------- to an archive

    /**
     * These parameters as arrays in the layout of FORMAT.md section 3: {@code r<ID>.weights} (or
     * {@code r<ID>.logweights}) for each region with sums, and per-variable arrays
     * {@code r<ID>.v<VAR>.<param>} for each leaf region, regions in document order.
     */
    public NpzArchive toArchive() {
        List<NpyArray> out = new ArrayList<>();
        int bundles = options.inputs();
        for (int r = 0; r < structure.regionCount(); r++) {
            String id = "r" + structure.id(r);
            if (structure.isLeaf(r)) {
                int[] vars = structure.vars(r);
                for (int j = 0; j < vars.length; j++) {
                    Variable v = structure.variables().get(vars[j]);
                    Family f = options.family(v.type());
                    String base = id + ".v" + vars[j] + ".";
                    if (f == Family.CATEGORICAL) {
                        int st = v.stateCount();
                        double[] vals = new double[bundles * st];
                        for (int i = 0; i < bundles; i++) {
                            System.arraycopy(inputParams(r, i, j), 0, vals, i * st, st);
                        }
                        out.add(NpyArray.ofDoubles(base + "probs", new int[] {bundles, st}, vals));
                    } else {
                        List<String> names = f.parameters();
                        for (int q = 0; q < names.size(); q++) {
                            double[] vals = new double[bundles];
                            for (int i = 0; i < bundles; i++) {
                                vals[i] = inputParams(r, i, j)[q];
                            }
                            out.add(NpyArray.ofDoubles(base + names.get(q), new int[] {bundles}, vals));
                        }
                    }
                }
            }
            if (layout.hasSums(r)) {
                int k = layout.sums(r);
                int c = layout.children(r);
                double[] vals = new double[k * c];
                for (int t = 0; t < k; t++) {
                    System.arraycopy(weights[r][t], 0, vals, t * c, c);
                }
                out.add(NpyArray.ofDoubles(id + (logWeights[r] ? ".logweights" : ".weights"), new int[] {k, c}, vals));
            }
        }
        return NpzArchive.of(out);
    }
}
