package dev.circa.converter.regions;

import dev.circa.format.Counts;
import dev.circa.validator.ValidationOptions;
import dev.circa.converter.npz.NpyArray;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.engine.family.ParameterLimits;
import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.format.Family;
import dev.circa.format.Variable;
import dev.circa.format.io.FormatException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * Reads a region graph's parameters from a NumPy archive in the layout of FORMAT.md section 3 and
 * writes them back into one ({@link #toArchive}). One instance reads one archive against one layout.
 */
final class ArchiveParameters {
    /** See {@link RegionParameters#fromArchive}. */
    static RegionParameters read(RegionStructure s, CompileOptions o, NpzArchive a) throws FormatException {
        return new ArchiveParameters(s, o, a).read();
    }

    private final RegionStructure s;
    private final CompileOptions o;
    private final NpzArchive a;
    private final Layout layout;
    private final String file;
    private final Set<String> used = new HashSet<>();

    private ArchiveParameters(RegionStructure s, CompileOptions o, NpzArchive a) {
        this.s = s;
        this.o = o;
        this.a = a;
        this.layout = new Layout(s, o);
        this.file = a.source();
    }

    private RegionParameters read() throws FormatException {
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
                            + NpyArray.shapeText(new int[] {k, c}) + " (" + Counts.of(k, "sum") + " by " + Counts.of(c, "child", "children") + ")");
                }
                NpyArray arr = wa != null ? wa : la;
                logw[r] = wa == null;
                shape(arr, new int[] {k, c}, Counts.of(k, "sum") + " by " + Counts.of(c, "child", "children"));
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
                    checkAddsToOne(arr.name(), t, row, logw[r]);
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
                    shape(sh, new int[] {bundles, g, states}, Counts.of(bundles, "bundle") + " by " + Counts.of(g, "variable") + " by "
                            + Counts.of(states, "state"));
                } else {
                    shape(sh, new int[] {bundles, g}, Counts.of(bundles, "bundle") + " by " + Counts.of(g, "variable") + " in the order of vars");
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
                    shape(pa, want, probs ? Counts.of(bundles, "bundle") + " by " + Counts.of(want[1], "state") : Counts.of(bundles, "bundle"));
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
                Limit limit = ParameterLimits.of(f, name);
                int states = stateCount(var);
                boolean ok = limit.holds(x, states) && (limit != Limit.COUNT || x <= Integer.MAX_VALUE);
                problem = ok ? null : switch (limit) {
                    case PROBABILITY -> "p in [0, 1]";
                    case NON_NEGATIVE -> "probabilities >= 0";
                    case POSITIVE -> name + " > 0";
                    case COUNT -> "an integer number of trials >= 0";
                    case STATE -> "a state index from 0 to " + (states - 1);
                    case ANY -> null;
                };
            }
            if (problem != null) {
                throw fail(arr, "the " + name + " of variable " + var + ", bundle " + bundle + " is " + x
                        + "; expected " + problem);
            }
        }
        if (!ParameterLimits.inOrder(f, p)) {
            throw fail(arrayName(r, var, "low"), "low " + p[0] + " is not below high " + p[1] + at + " in " + base
                    + "low/high; expected low < high");
        }
    }

    private String arrayName(int r, int var, String param) {
        String per = "r" + s.id(r) + ".v" + var + "." + param;
        return a.contains(per) ? per : "r" + s.id(r) + "." + param;
    }

    /**
     * Refuses a sum whose weights do not add to 1 (log-weights: whose log-sum-exp is not 0) within the
     * validator's default tolerance, naming the array and the row, before a circuit is made of them.
     */
    private void checkAddsToOne(String array, int row, double[] x, boolean log) throws FormatException {
        double total;
        if (log) {
            double m = Double.NEGATIVE_INFINITY;
            for (double v : x) {
                m = Math.max(m, v);
            }
            double acc = 0;
            for (double v : x) {
                acc += Math.exp(v - m);
            }
            total = m + Math.log(acc);
        } else {
            total = 0;
            for (double v : x) {
                total += v;
            }
        }
        double off = log ? Math.abs(total) : Math.abs(total - 1);
        if (!(off <= ValidationOptions.DEFAULT_TOLERANCE)) {
            throw fail(array, String.format(Locale.ROOT, "row [%d, :] (the weights of sum %d of its region) %s %s; "
                    + "expected %s within %s", row, row, log ? "has log-sum-exp" : "adds to", total,
                    log ? "0 (weights adding to 1)" : "1", ValidationOptions.DEFAULT_TOLERANCE));
        }
    }

    private void shape(NpyArray arr, int[] want, String meaning) throws FormatException {
        if (!Arrays.equals(arr.shape(), want)) {
            throw fail(arr.name(), "has shape " + arr.shapeText() + "; expected " + NpyArray.shapeText(want) + " ("
                    + meaning + ", compiling with K=" + o.sums() + ", I=" + o.inputs() + ", C=" + o.outputs()
                    + "); check that --sums, --inputs and --outputs match those the archive was written for");
        }
    }

    private FormatException fail(String array, String problem) {
        return new FormatException(file, 0, 0, null, "array " + array + ": " + problem);
    }

    private static String list(List<String> names) {
        return String.join(", ", names.size() > 5 ? names.subList(0, 5) : names) + (names.size() > 5 ? ", ..." : "");
    }


    /**
     * These parameters as arrays in the layout of FORMAT.md section 3: {@code r<ID>.weights} (or
     * {@code r<ID>.logweights}) for each region with sums, and per-variable arrays
     * {@code r<ID>.v<VAR>.<param>} for each leaf region, regions in document order.
     */
    static NpzArchive toArchive(RegionParameters p) {
        List<NpyArray> out = new ArrayList<>();
        int bundles = p.options().inputs();
        for (int r = 0; r < p.structure().regionCount(); r++) {
            String id = "r" + p.structure().id(r);
            if (p.structure().isLeaf(r)) {
                int[] vars = p.structure().vars(r);
                for (int j = 0; j < vars.length; j++) {
                    Variable v = p.structure().variables().get(vars[j]);
                    Family f = p.options().family(v.type());
                    String base = id + ".v" + vars[j] + ".";
                    if (f == Family.CATEGORICAL) {
                        int st = v.stateCount();
                        double[] vals = new double[bundles * st];
                        for (int i = 0; i < bundles; i++) {
                            System.arraycopy(p.inputParams(r, i, j), 0, vals, i * st, st);
                        }
                        out.add(NpyArray.ofDoubles(base + "probs", new int[] {bundles, st}, vals));
                    } else {
                        List<String> names = f.parameters();
                        for (int q = 0; q < names.size(); q++) {
                            double[] vals = new double[bundles];
                            for (int i = 0; i < bundles; i++) {
                                vals[i] = p.inputParams(r, i, j)[q];
                            }
                            out.add(NpyArray.ofDoubles(base + names.get(q), new int[] {bundles}, vals));
                        }
                    }
                }
            }
            if (p.layout().hasSums(r)) {
                int k = p.layout().sums(r);
                int c = p.layout().children(r);
                double[] vals = new double[k * c];
                for (int t = 0; t < k; t++) {
                    System.arraycopy(p.weights(r, t), 0, vals, t * c, c);
                }
                out.add(NpyArray.ofDoubles(id + (p.logWeights(r) ? ".logweights" : ".weights"), new int[] {k, c}, vals));
            }
        }
        return NpzArchive.of(out);
    }
}
