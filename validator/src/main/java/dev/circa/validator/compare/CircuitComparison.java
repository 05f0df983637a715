package dev.circa.validator.compare;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.engine.Sampler;
import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;

/**
 * Numerical comparison of two compiled circuits over the same variables (matched by name; types
 * and states must agree). For each pair of corresponding outputs (by name, or the single output of
 * each), {@link CompareOptions#samples()} points are drawn from each circuit with the engine's
 * {@link Sampler}, and every point is evaluated under both as drawn and again with each variable
 * missing with probability 1/2 (at least one), so marginals are compared too. Points are drawn in
 * chunks of at most {@link #CHUNK} rows (fewer for very wide circuits), so memory stays bounded.
 * The same seed gives the same points.
 */
public final class CircuitComparison {
    /** Rows sampled at once. */
    public static final int CHUNK = 8192;

    private final CompiledCircuit a;
    private final CompiledCircuit b;
    private final CompareOptions options;
    private final int[] bOfA;
    private final int[] outA;
    private final int[] outB;

    private CircuitComparison(CompiledCircuit a, CompiledCircuit b, CompareOptions options) throws IncompatibleCircuitsException {
        this.a = a;
        this.b = b;
        this.options = options;
        this.bOfA = matchVariables(a, b);
        List<int[]> pairs = matchOutputs(a, b);
        outA = new int[pairs.size()];
        outB = new int[pairs.size()];
        for (int i = 0; i < pairs.size(); i++) {
            outA[i] = pairs.get(i)[0];
            outB[i] = pairs.get(i)[1];
        }
    }

    /**
     * Compares {@code a} with {@code b}.
     *
     * @throws IncompatibleCircuitsException when the variables differ by name, type or states, or
     *     the outputs do not correspond (the message says how)
     */
    public static ComparisonReport compare(CompiledCircuit a, CompiledCircuit b, CompareOptions options)
            throws IncompatibleCircuitsException {
        return new CircuitComparison(a, b, options).run();
    }

    /** The variable index in {@code b} of each variable of {@code a}. */
    static int[] matchVariables(CompiledCircuit a, CompiledCircuit b) throws IncompatibleCircuitsException {
        List<Variable> va = a.variables();
        List<Variable> vb = b.variables();
        Map<String, Integer> byName = new HashMap<>();
        for (int i = 0; i < vb.size(); i++) {
            byName.put(vb.get(i).name(), i);
        }
        int[] map = new int[va.size()];
        for (int i = 0; i < va.size(); i++) {
            Variable x = va.get(i);
            Integer j = byName.remove(x.name());
            if (j == null) {
                throw new IncompatibleCircuitsException("variable \"" + x.name() + "\" of the first circuit is not a variable of the second");
            }
            Variable y = vb.get(j);
            if (x.type() != y.type()) {
                throw new IncompatibleCircuitsException("variable \"" + x.name() + "\" is " + name(x) + " in the first circuit but "
                        + name(y) + " in the second");
            }
            if (x.stateCount() != y.stateCount()
                    || (!x.states().isEmpty() && !y.states().isEmpty() && !x.states().equals(y.states()))) {
                throw new IncompatibleCircuitsException("variable \"" + x.name() + "\" has states " + states(x)
                        + " in the first circuit but " + states(y) + " in the second");
            }
            map[i] = j;
        }
        if (!byName.isEmpty()) {
            throw new IncompatibleCircuitsException("variable \"" + byName.keySet().stream().sorted().findFirst().orElseThrow()
                    + "\" of the second circuit is not a variable of the first");
        }
        return map;
    }

    private static String name(Variable v) {
        return v.type().name().toLowerCase(java.util.Locale.ROOT);
    }

    private static String states(Variable v) {
        return v.states().isEmpty() ? Integer.toString(v.stateCount()) : v.states().toString();
    }

    private static List<int[]> matchOutputs(CompiledCircuit a, CompiledCircuit b) throws IncompatibleCircuitsException {
        Set<String> na = new HashSet<>();
        Set<String> nb = new HashSet<>();
        for (int o = 0; o < a.outputCount(); o++) {
            na.add(a.outputName(o));
        }
        for (int o = 0; o < b.outputCount(); o++) {
            nb.add(b.outputName(o));
        }
        List<int[]> pairs = new ArrayList<>();
        if (na.equals(nb)) {
            for (int o = 0; o < a.outputCount(); o++) {
                pairs.add(new int[] {o, b.outputIndex(a.outputName(o))});
            }
        } else if (a.outputCount() == 1 && b.outputCount() == 1) {
            pairs.add(new int[] {0, 0});
        } else {
            throw new IncompatibleCircuitsException("the outputs differ: " + sortedNames(na) + " in the first circuit, "
                    + sortedNames(nb) + " in the second");
        }
        return pairs;
    }

    private static String sortedNames(Set<String> s) {
        return s.stream().sorted().toList().toString();
    }

    private ComparisonReport run() {
        int nv = a.variableCount();
        int n = options.samples();
        Evaluator evA = new Evaluator(a);
        Evaluator evB = new Evaluator(b);
        double[] zA = evA.logPartition();
        double[] zB = evB.logPartition();
        int width = Math.max(1, nv + Math.max(a.outputCount(), b.outputCount()));
        int chunk = Math.max(1, Math.min(Math.min(CHUNK, n), (1 << 20) / width));
        double[] drawn = new double[chunk * Math.max(1, nv)];
        double[] pa = new double[2 * chunk * Math.max(1, nv)];
        double[] pb = new double[2 * chunk * Math.max(1, nv)];
        double[] la = new double[2 * chunk * a.outputCount()];
        double[] lb = new double[2 * chunk * b.outputCount()];
        Worst worst = new Worst();
        List<OutputComparison> outs = new ArrayList<>();
        long points = 0;
        long failures = 0;
        double maxAbs = 0;
        double maxRel = 0;
        for (int p = 0; p < outA.length; p++) {
            long oPoints = 0;
            long oFailures = 0;
            double oMaxAbs = 0;
            for (int side = 0; side < 2; side++) {
                CompiledCircuit src = side == 0 ? a : b;
                int srcOut = side == 0 ? outA[p] : outB[p];
                for (int start = 0, c = 0; start < n; start += chunk, c++) {
                    int m = Math.min(chunk, n - start);
                    long s = derive(options.seed(), p, side, c);
                    new Sampler(src, s).sample(srcOut, m, drawn);
                    SplittableRandom mask = new SplittableRandom(derive(s, 1, 2, 3));
                    for (int r = 0; r < m; r++) {
                        for (int v = 0; v < nv; v++) {
                            double x = drawn[r * nv + (side == 0 ? v : bOfA[v])];
                            pa[r * nv + v] = x;
                            pa[(m + r) * nv + v] = mask.nextBoolean() ? Double.NaN : x;
                        }
                        if (nv > 0) {
                            boolean any = false;
                            for (int v = 0; v < nv; v++) {
                                any |= Double.isNaN(pa[(m + r) * nv + v]);
                            }
                            if (!any) {
                                pa[(m + r) * nv + mask.nextInt(nv)] = Double.NaN;
                            }
                        }
                    }
                    for (int r = 0; r < 2 * m; r++) {
                        for (int v = 0; v < nv; v++) {
                            pb[r * nv + bOfA[v]] = pa[r * nv + v];
                        }
                    }
                    evA.logDensity(pa, 2 * m, la);
                    evB.logDensity(pb, 2 * m, lb);
                    for (int r = 0; r < 2 * m; r++) {
                        double x = la[r * a.outputCount() + outA[p]];
                        double y = lb[r * b.outputCount() + outB[p]];
                        boolean agree = options.agree(x, y);
                        double excess = options.excess(x, y);
                        double abs = x == y ? 0 : Math.abs(x - y);
                        oPoints++;
                        if (!agree) {
                            oFailures++;
                        }
                        oMaxAbs = maxNaN(oMaxAbs, abs);
                        if (Double.isFinite(y) && y != 0) {
                            maxRel = maxNaN(maxRel, abs / Math.abs(y));
                        }
                        long index = (long) side * 2 * n + (r < m ? start + r : n + start + (r - m));
                        worst.offer(a.outputName(outA[p]), side == 0 ? "A" : "B", index, pa, r * nv, nv, x, y, agree, excess);
                    }
                }
            }
            outs.add(new OutputComparison(a.outputName(outA[p]), b.outputName(outB[p]), oPoints, oFailures, oMaxAbs,
                    zA[outA[p]], zB[outB[p]]));
            points += oPoints;
            failures += oFailures;
            maxAbs = maxNaN(maxAbs, oMaxAbs);
        }
        boolean identical = StructuralIdentity.identical(a, b);
        return new ComparisonReport(options, a.variables(), identical, points, failures, maxAbs, maxRel, outs, worst.list());
    }

    private static double maxNaN(double x, double y) {
        return Double.isNaN(x) || Double.isNaN(y) ? Double.NaN : Math.max(x, y);
    }

    /** A seed for one chunk, mixed from the user's seed with SplitMix64 steps. */
    private static long derive(long seed, long p, long side, long chunk) {
        long z = seed;
        for (long x : new long[] {p, side, chunk}) {
            z += 0x9E3779B97F4A7C15L + x;
            z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
            z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
            z ^= z >>> 31;
        }
        return z;
    }

    /** The largest disagreements, kept in bounded memory. */
    private static final class Worst {
        private final Disagreement[] items = new Disagreement[ComparisonReport.WORST];
        private int count;

        void offer(String output, String from, long index, double[] pts, int off, int nv, double x, double y,
                   boolean agree, double excess) {
            if (count == items.length && !worse(agree, excess, items[count - 1])) {
                return;
            }
            double[] values = java.util.Arrays.copyOfRange(pts, off, off + nv);
            Disagreement d = new Disagreement(output, from, index, values, x, y, agree, excess);
            int i = count < items.length ? count++ : items.length - 1;
            while (i > 0 && worse(agree, excess, items[i - 1])) {
                items[i] = items[i - 1];
                i--;
            }
            items[i] = d;
        }

        private static boolean worse(boolean agree, double excess, Disagreement than) {
            if (agree != than.agree()) {
                return !agree;
            }
            return excess > than.excess();
        }

        List<Disagreement> list() {
            List<Disagreement> l = new ArrayList<>(count);
            for (int i = 0; i < count; i++) {
                l.add(items[i]);
            }
            return l;
        }
    }
}
