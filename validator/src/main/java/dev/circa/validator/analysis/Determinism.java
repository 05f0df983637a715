package dev.circa.validator.analysis;

import dev.circa.engine.internal.IntList;
import dev.circa.format.Family;
import dev.circa.format.NodeTable;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;

/**
 * Decides, sum by sum, whether at most one child is positive at every complete assignment (up to a
 * set of measure zero). Proofs, cheapest first: the children's supports on one variable are
 * pairwise disjoint (each node carries a small box over-approximating where it is positive);
 * two children whose boxes are exact overlap with positive measure (false, with the witness);
 * or the sum's scope is discrete and small enough to enumerate, all assignments at once as bit sets.
 * Children with weight 0 are left out: they add nothing to the sum.
 */
public final class Determinism {
    /** Most variables a node's box keeps. */
    static final int BOX_VARS = 8;
    /** Total bit-set words the enumerations of one circuit may touch. */
    static final long WORD_BUDGET = 200_000_000L;
    /** Most words one enumeration may hold. */
    static final long WORDS_PER_SUM = 8_000_000L;

    /** Verdict on one sum. */
    public static final byte TRUE = 1;
    public static final byte FALSE = 0;
    public static final byte UNKNOWN = -1;

    private final Graph g;
    private final Scopes s;
    private final Parameters facts;
    /** The position in the facts' sums with a zero weight of the first one not before the sum being decided. */
    private int zeroAt;
    private final int maxEnumeration;
    private final Box[] box;
    private final byte[] verdict;
    private final List<int[]> falseSums = new ArrayList<>();
    private final List<String> falseWitness = new ArrayList<>();
    private int unknownSums;
    private Box lastP;
    private Box lastQ;
    private Box lastMerged;
    private long wordsUsed;
    private int[] stamp;
    private final NodeTable table;
    /** The positive children of the sum being decided, in order (reused from sum to sum). */
    private final IntList kids = new IntList();
    /** Whether every child in {@link #kids} has the very same box object (set by {@link #sumBox}). */
    private boolean sameBoxes;
    /** Per-kid supports on one variable (reused by {@link #separated}). */
    private Support[] per = new Support[16];

    /** Where a node can be positive: per variable a support; {@code exact} when it is exactly that box over the node's scope. */
    record Box(int[] vars, Support[] sup, boolean exact) {
        int find(int v) {
            return Arrays.binarySearch(vars, v);
        }
    }

    private Determinism(Graph g, Scopes s, Parameters facts, int maxEnumeration) {
        this.g = g;
        this.s = s;
        this.facts = facts;
        this.maxEnumeration = maxEnumeration;
        this.table = g.document().nodeTable();
        int n = g.size();
        box = new Box[n];
        verdict = new byte[n];
        for (int i = 0; i < n; i++) {
            byte k = g.kind(i);
            if (k == Graph.INPUT) {
                box[i] = inputBox(i);
            } else if (k == Graph.PRODUCT) {
                box[i] = productBox(i);
            } else {
                sum(i);
            }
        }
    }

    /** Sum {@code i}'s box and verdict. */
    private void sum(int i) {
        box[i] = positiveChildren(i) ? sameBox() : sumBox();
        verdict[i] = decide(i);
        if (verdict[i] == UNKNOWN) {
            unknownSums++;
        }
    }

    /** Decides every sum of a usable graph whose parameters are valid ({@code facts} found no defect). */
    public static Determinism of(Graph g, Scopes s, Parameters facts, int maxEnumeration) {
        if (facts.anyProblem()) {
            throw new IllegalArgumentException("the circuit's parameters have defects");
        }
        return new Determinism(g, s, facts, maxEnumeration);
    }

    /** Sums proven not deterministic: pairs {sum index, first child index, second child index}. */
    public List<int[]> falseSums() {
        return falseSums;
    }

    /** The witness assignment of {@link #falseSums()} entry {@code k}, e.g. {@code {valve=open}}. */
    public String witness(int k) {
        String w = falseWitness.get(k);
        if (w == null) {
            int[] f = falseSums.get(k);
            w = meet(box[f[1]], box[f[2]]);
            falseWitness.set(k, w);
        }
        return w;
    }

    /** Number of sums neither proven nor refuted. */
    public int unknownSums() {
        return unknownSums;
    }

    /** The verdict on sum {@code i}: {@link #TRUE}, {@link #FALSE} or {@link #UNKNOWN}. */
    public byte verdict(int i) {
        return verdict[i];
    }

    /** Per broad support (real line, non-negative, counts), the box of each variable over it, made when first needed. */
    private final Box[][] broadBoxes = new Box[3][];

    private Box single(int v, Support sp) {
        int broad = sp == Support.REAL_LINE ? 0 : sp == Support.NON_NEGATIVE ? 1 : sp == Support.COUNTS ? 2 : -1;
        if (broad >= 0) {
            // shared, so that boxes built from them can be recognised as the same by identity
            Box[] byVar = broadBoxes[broad];
            if (byVar == null) {
                byVar = new Box[g.document().variables().size()];
                broadBoxes[broad] = byVar;
            }
            if (byVar[v] == null) {
                byVar[v] = new Box(new int[] {v}, new Support[] {sp}, true);
            }
            return byVar[v];
        }
        return new Box(new int[] {v}, new Support[] {sp}, true);
    }

    /** Input {@code i}'s box, read from the table's columns (no record made). */
    private Box inputBox(int i) {
        NodeTable t = table;
        int at = t.valueStart(i);
        int n = t.valueEnd(i) - at;
        double[] p = new double[Math.min(n, 2)];
        for (int k = 0; k < p.length; k++) {
            p[k] = t.value(at + k);
        }
        int v = t.var(t.varStart(i));
        Family family = t.family(i);
        switch (family) {
            case BERNOULLI -> {
                return single(v, Support.ofStates(new boolean[] {p[0] < 1, p[0] > 0}));
            }
            case CATEGORICAL -> {
                boolean log = t.logForm(i);
                boolean[] mask = new boolean[n];
                for (int k = 0; k < n; k++) {
                    double x = t.value(at + k);
                    mask[k] = log ? x > Double.NEGATIVE_INFINITY : x > 0;
                }
                return single(v, Support.ofStates(mask));
            }
            case INDICATOR -> {
                return single(v, Support.interval(p[0], p[0], true));
            }
            case NORMAL -> {
                return single(v, Support.REAL_LINE);
            }
            case LOGNORMAL, EXPONENTIAL, GAMMA -> {
                return single(v, Support.NON_NEGATIVE);
            }
            case BETA -> {
                return single(v, Support.interval(0, 1, false));
            }
            case UNIFORM -> {
                return single(v, Support.interval(p[0], p[1], false));
            }
            case POISSON -> {
                return single(v, Support.COUNTS);
            }
            case BINOMIAL -> {
                double lo = p[1] == 1 ? p[0] : 0;
                double hi = p[1] == 0 ? 0 : p[0];
                return single(v, Support.interval(lo, hi, true));
            }
            case MVNORMAL -> {
                int[] vars = new int[t.varEnd(i) - t.varStart(i)];
                for (int k = 0; k < vars.length; k++) {
                    vars[k] = t.var(t.varStart(i) + k);
                }
                Arrays.sort(vars);
                Support[] sp = new Support[vars.length];
                Arrays.fill(sp, Support.REAL_LINE);
                return new Box(vars, sp, true);
            }
            default -> throw new IllegalStateException(family.name());
        }
    }

    private Box productBox(int i) {
        int a = g.childStart(i);
        int b = g.childEnd(i);
        if (b - a == 1) {
            return box[g.child(a)];
        }
        if (b - a == 2 && box[g.child(a)] != null && box[g.child(a + 1)] != null) {
            Box p = box[g.child(a)];
            Box q = box[g.child(a + 1)];
            // products over the same pair of boxes (a partition's cross product) come in runs
            if (p != lastP || q != lastQ) {
                lastP = p;
                lastQ = q;
                lastMerged = trim(merge(p, q));
            }
            return lastMerged;
        }
        boolean exact = true;
        int total = 0;
        for (int e = a; e < b; e++) {
            Box c = box[g.child(e)];
            if (c == null) {
                exact = false;
            } else {
                total += c.vars.length;
                exact &= c.exact;
            }
        }
        long[] entries = new long[total];
        Support[] sups = new Support[total];
        int m = 0;
        for (int e = a; e < b; e++) {
            Box c = box[g.child(e)];
            if (c != null) {
                for (int k = 0; k < c.vars.length; k++) {
                    entries[m] = ((long) c.vars[k] << 32) | m;
                    sups[m] = c.sup[k];
                    m++;
                }
            }
        }
        Arrays.sort(entries);
        int[] vars = new int[m];
        Support[] sp = new Support[m];
        int r = 0;
        for (int k = 0; k < m; k++) {
            int v = (int) (entries[k] >>> 32);
            Support x = sups[(int) entries[k]];
            if (r > 0 && vars[r - 1] == v) {
                sp[r - 1] = sp[r - 1].intersect(x);
            } else {
                vars[r] = v;
                sp[r] = x;
                r++;
            }
        }
        if (r > BOX_VARS) {
            return trim(new Box(Arrays.copyOf(vars, r), Arrays.copyOf(sp, r), false));
        }
        return new Box(Arrays.copyOf(vars, r), Arrays.copyOf(sp, r), exact);
    }

    /** A box with nothing in it that could separate children: positive anywhere, as far as is known. */
    private static final Box UNINFORMATIVE = new Box(new int[0], new Support[0], false);

    private static boolean broad(Support x) {
        return x == Support.REAL_LINE || x == Support.COUNTS || x == Support.NON_NEGATIVE;
    }

    /** Two children's boxes merged by variable (supports on a shared variable intersected). */
    private static Box merge(Box p, Box q) {
        int[] vars = new int[p.vars.length + q.vars.length];
        Support[] sp = new Support[vars.length];
        int i = 0;
        int j = 0;
        int r = 0;
        while (i < p.vars.length || j < q.vars.length) {
            if (j >= q.vars.length || (i < p.vars.length && p.vars[i] < q.vars[j])) {
                vars[r] = p.vars[i];
                sp[r++] = p.sup[i++];
            } else if (i >= p.vars.length || q.vars[j] < p.vars[i]) {
                vars[r] = q.vars[j];
                sp[r++] = q.sup[j++];
            } else {
                vars[r] = p.vars[i];
                sp[r++] = p.sup[i++].intersect(q.sup[j++]);
            }
        }
        boolean exact = p.exact && q.exact;
        return r == vars.length ? new Box(vars, sp, exact) : new Box(Arrays.copyOf(vars, r), Arrays.copyOf(sp, r), exact);
    }

    /**
     * Keeps a box within {@value #BOX_VARS} variables: an exact box that fits stays; otherwise the box
     * becomes inexact and keeps only supports narrower than their whole type (the only ones that can
     * separate children), at most {@value #BOX_VARS} of them.
     */
    private static Box trim(Box x) {
        if (x.vars.length <= BOX_VARS) {
            return x;
        }
        int keep = 0;
        for (Support sp : x.sup) {
            keep += broad(sp) ? 0 : 1;
        }
        keep = Math.min(keep, BOX_VARS);
        if (keep == 0) {
            return UNINFORMATIVE;
        }
        int[] kv = new int[keep];
        Support[] ks = new Support[keep];
        int m = 0;
        for (int k = 0; k < x.vars.length && m < keep; k++) {
            if (!broad(x.sup[k])) {
                kv[m] = x.vars[k];
                ks[m++] = x.sup[k];
            }
        }
        return new Box(kv, ks, false);
    }

    /** Whether weight {@code j} of sum {@code i} is positive. */
    private boolean positive(int i, int j) {
        NodeTable t = table;
        return positive(t, t.valueStart(i) + j, t.logForm(i));
    }

    /** Whether the weight at position {@code k} of the table's numbers, a log-weight when {@code log}, is positive. */
    private static boolean positive(NodeTable t, int k, boolean log) {
        double x = t.value(k);
        return log ? x > Double.NEGATIVE_INFINITY : x > 0;
    }

    /**
     * Fills {@link #kids} with the children of sum {@code i} whose weight is positive, in order; whether
     * there is at least one and all have the very same box object (the common case of a sum over the
     * products of one partition), which {@link #sameBox} then makes the sum's box without another pass.
     */
    private boolean positiveChildren(int i) {
        NodeTable t = table;
        int a = g.childStart(i);
        int b = g.childEnd(i);
        int w = t.valueStart(i);
        boolean log = t.logForm(i);
        // sums are met in index order; one without a zero weight has only positive ones (no defects)
        while (zeroAt < facts.zeroWeightCount() && facts.zeroWeight(zeroAt) < i) {
            zeroAt++;
        }
        boolean allPositive = zeroAt == facts.zeroWeightCount() || facts.zeroWeight(zeroAt) != i;
        kids.clear();
        Box first = null;
        boolean same = true;
        for (int e = a; e < b; e++) {
            if (allPositive || positive(t, w + e - a, log)) {
                int c = g.child(e);
                if (kids.isEmpty()) {
                    first = box[c];
                } else {
                    same &= box[c] == first;
                }
                kids.add(c);
            }
        }
        return same && !kids.isEmpty();
    }

    /** What {@link #sumBox} gives when every child in {@link #kids} has one and the same box. */
    private Box sameBox() {
        Box first = box[kids.get(0)];
        sameBoxes = first != null;
        return first;
    }

    /** The box of the sum whose positive children are in {@link #kids}. */
    private Box sumBox() {
        sameBoxes = false;
        Box first = null;
        boolean exact = true;
        boolean allSame = true;
        int[] vars = null;
        Support[] sp = null;
        for (int q = 0; q < kids.size(); q++) {
            Box c = box[kids.get(q)];
            if (c == null) {
                return null;
            }
            if (first == null) {
                first = c;
                vars = c.vars;
                sp = c.sup;
                exact = c.exact;
                continue;
            }
            if (c == first) {
                continue;
            }
            if (allSame) {
                // the first child's arrays are shared: copied only when another box narrows them
                vars = vars.clone();
                sp = sp.clone();
                allSame = false;
            }
            exact &= c.exact && Arrays.equals(c.vars, first.vars);
            // children over the same variables as those kept so far (the common case) need no search
            boolean aligned = Arrays.equals(c.vars, vars);
            int m = 0;
            for (int k = 0; k < vars.length; k++) {
                int at = aligned ? k : c.find(vars[k]);
                if (at >= 0) {
                    vars[m] = vars[k];
                    sp[m] = sp[k].union(c.sup[at]);
                    m++;
                }
            }
            if (m < vars.length) {
                vars = Arrays.copyOf(vars, m);
                sp = Arrays.copyOf(sp, m);
            }
        }
        if (first == null) {
            return new Box(new int[0], new Support[0], false);
        }
        sameBoxes = allSame;
        if (allSame) {
            return first;
        }
        return new Box(vars, sp, exact && countDiffering() <= 1);
    }

    /** Number of variables on which the exact boxes of the positive children in {@link #kids} differ. */
    private int countDiffering() {
        Box first = null;
        boolean[] diff = null;
        for (int q = 0; q < kids.size(); q++) {
            Box c = box[kids.get(q)];
            if (first == null) {
                first = c;
                diff = new boolean[c.vars.length];
                continue;
            }
            if (!Arrays.equals(c.vars, first.vars)) {
                return Integer.MAX_VALUE;
            }
            for (int k = 0; k < c.vars.length; k++) {
                diff[k] |= !c.sup[k].sameAs(first.sup[k]);
            }
        }
        int d = 0;
        if (diff != null) {
            for (boolean x : diff) {
                d += x ? 1 : 0;
            }
        }
        return d;
    }

    /** The verdict on sum {@code i}, whose positive children are in {@link #kids}. */
    private byte decide(int i) {
        if (kids.size() <= 1) {
            return TRUE;
        }
        if (separated(kids)) {
            return TRUE;
        }
        if (overlapWitness(i, kids)) {
            return FALSE;
        }
        int[] card = cardinalities(s.vars(i));
        return card == null ? UNKNOWN : enumerate(i, kids, card);
    }

    /**
     * The number of states of each variable of {@code vars} when all are discrete and their assignments
     * are at most {@code maxEnumeration}; otherwise {@code null} (the sum stays unknown).
     */
    private int[] cardinalities(int[] vars) {
        List<Variable> vs = g.document().variables();
        long count = 1;
        int[] card = null;
        for (int p = 0; p < vars.length; p++) {
            Variable v = vs.get(vars[p]);
            if (v.type() != VariableType.BINARY && v.type() != VariableType.CATEGORICAL) {
                return null;
            }
            int states = v.stateCount();
            if (states <= 0) {
                return null;
            }
            count *= states;
            if (count > maxEnumeration) {
                return null;
            }
            if (card == null) {
                card = new int[vars.length];
            }
            card[p] = states;
        }
        return card == null ? new int[0] : card;
    }

    /** Whether on some variable every pair of children's supports is disjoint. */
    private boolean separated(IntList kids) {
        Box b0 = box[kids.get(0)];
        if (b0 == null) {
            return false;
        }
        for (int k = 0; k < kids.size() && !sameBoxes; k++) {
            if (box[kids.get(k)] == null) {
                return false;
            }
        }
        int n = kids.size();
        if (per.length < n) {
            per = new Support[Math.max(n, per.length * 2)];
        }
        for (int v : b0.vars) {
            boolean all = true;
            // two children with the very same non-empty support object overlap on v: a cheap common case
            // (shared inputs, whole lines) that settles the variable without looking at the other children
            boolean shared = false;
            for (int k = 0; k < n && all && !shared; k++) {
                Box c = box[kids.get(k)];
                int at = c.find(v);
                all = at >= 0;
                if (all) {
                    per[k] = c.sup[at];
                    shared = k > 0 && per[k] == per[0] && !per[0].isEmpty();
                }
            }
            if (all && !shared && pairwiseDisjoint(per, n)) {
                return true;
            }
        }
        return false;
    }

    /** Whether the first {@code n} supports of {@code per} are pairwise disjoint. */
    private static boolean pairwiseDisjoint(Support[] per, int n) {
        int total = 0;
        for (int k = 0; k < n; k++) {
            total += per[k].intervals();
        }
        double[] lo = new double[total];
        double[] hi = new double[total];
        int[] owner = new int[total];
        Integer[] idx = new Integer[total];
        int m = 0;
        for (int k = 0; k < n; k++) {
            for (int j = 0; j < per[k].intervals(); j++) {
                lo[m] = per[k].lo(j);
                hi[m] = per[k].hi(j);
                owner[m] = k;
                idx[m] = m;
                m++;
            }
        }
        Arrays.sort(idx, (x, y) -> Double.compare(lo[x], lo[y]));
        boolean discrete = per[0].discrete();
        double hi1 = Double.NEGATIVE_INFINITY;
        int own1 = -1;
        double hi2 = Double.NEGATIVE_INFINITY;
        for (Integer x : idx) {
            double reach = owner[x] == own1 ? hi2 : hi1;
            if (discrete ? lo[x] <= reach : lo[x] < reach) {
                return false;
            }
            if (owner[x] == own1) {
                hi1 = Math.max(hi1, hi[x]);
            } else if (hi[x] > hi1) {
                hi2 = hi1;
                hi1 = hi[x];
                own1 = owner[x];
            } else if (hi[x] > hi2) {
                hi2 = hi[x];
            }
        }
        return true;
    }

    /** Looks for two children with exact boxes that overlap with positive measure; records the witness. */
    private boolean overlapWitness(int sum, IntList kids) {
        int k = kids.size();
        if (sameBoxes) {
            // every pair has the same two boxes: the first pair, tried first below as well, decides for all
            return tryPair(sum, kids.get(0), kids.get(1));
        }
        // all pairs of a small sum; for a large one each child with the first and with its neighbour
        if (k <= 16) {
            for (int x = 0; x < k; x++) {
                for (int y = x + 1; y < k; y++) {
                    if (tryPair(sum, kids.get(x), kids.get(y))) {
                        return true;
                    }
                }
            }
            return false;
        }
        for (int y = 1; y < k; y++) {
            if (tryPair(sum, kids.get(0), kids.get(y)) || (y > 1 && tryPair(sum, kids.get(y - 1), kids.get(y)))) {
                return true;
            }
        }
        return false;
    }

    private boolean tryPair(int sum, int a, int b) {
        Box p = box[a];
        Box q = box[b];
        if (p == null || q == null || !p.exact || !q.exact || !meets(p, q)) {
            return false;
        }
        falseSums.add(new int[] {sum, a, b});
        // the witness text is made only when reported
        falseWitness.add(null);
        return true;
    }

    /** Whether two exact boxes meet with positive measure. */
    private static boolean meets(Box p, Box q) {
        int i = 0;
        int j = 0;
        while (i < p.vars.length && j < q.vars.length) {
            if (p.vars[i] < q.vars[j]) {
                if (p.sup[i++].isEmpty()) {
                    return false;
                }
            } else if (q.vars[j] < p.vars[i]) {
                if (q.sup[j++].isEmpty()) {
                    return false;
                }
            } else if (p.sup[i++].intersect(q.sup[j++]).isEmpty()) {
                return false;
            }
        }
        for (; i < p.vars.length; i++) {
            if (p.sup[i].isEmpty()) {
                return false;
            }
        }
        for (; j < q.vars.length; j++) {
            if (q.sup[j].isEmpty()) {
                return false;
            }
        }
        return true;
    }

    private String meet(Box p, Box q) {
        List<Variable> vs = g.document().variables();
        StringBuilder sb = new StringBuilder("{");
        int i = 0;
        int j = 0;
        while (i < p.vars.length || j < q.vars.length) {
            int v;
            Support x;
            if (j >= q.vars.length || (i < p.vars.length && p.vars[i] < q.vars[j])) {
                v = p.vars[i];
                x = p.sup[i++];
            } else if (i >= p.vars.length || q.vars[j] < p.vars[i]) {
                v = q.vars[j];
                x = q.sup[j++];
            } else {
                v = p.vars[i];
                x = p.sup[i++].intersect(q.sup[j++]);
            }
            if (x.isEmpty()) {
                return null;
            }
            if (sb.length() > 1) {
                sb.append(", ");
            }
            sb.append(valueText(vs.get(v), x.pick()));
        }
        return sb.append('}').toString();
    }

    private static String valueText(Variable v, double value) {
        if (v.type() == VariableType.CATEGORICAL || (v.type() == VariableType.BINARY && !v.states().isEmpty())) {
            int s = (int) value;
            if (s >= 0 && s < v.states().size()) {
                return v.name() + "=" + v.states().get(s);
            }
        }
        if (value == Math.rint(value) && Math.abs(value) < 1e15) {
            return v.name() + "=" + (long) value;
        }
        return v.name() + "=" + String.format(Locale.ROOT, "%s", value);
    }

    /**
     * Enumerates the sum's scope, discrete and small (its variables' numbers of states in {@code card});
     * all assignments at once, one bit each.
     */
    private byte enumerate(int sum, IntList kids, int[] card) {
        int[] vars = s.vars(sum);
        List<Variable> vs = g.document().variables();
        long count = 1;
        for (int c : card) {
            count *= c;
        }
        int bits = (int) count;
        int words = (bits + 63) >>> 6;
        if (stamp == null) {
            stamp = new int[g.size()];
            Arrays.fill(stamp, -1);
        }
        long room = Math.min(WORDS_PER_SUM, WORD_BUDGET - wordsUsed) / words;
        if (room <= 0) {
            return UNKNOWN;
        }
        IntList sub = new IntList();
        IntList stack = new IntList();
        for (int k = 0; k < kids.size(); k++) {
            push(kids.get(k), sum, sub, stack);
        }
        while (!stack.isEmpty() && sub.size() <= room) {
            int top = stack.pop();
            for (int e = g.childStart(top); e < g.childEnd(top); e++) {
                push(g.child(e), sum, sub, stack);
            }
        }
        // the walk itself counts, so that a budget spent on large sub-circuits stops further walks
        wordsUsed += sub.size();
        if (sub.size() > room) {
            return UNKNOWN;
        }
        long need = (long) sub.size() * words;
        wordsUsed += need;
        int[] nodes = sub.toArray();
        Arrays.sort(nodes);
        long[][] bitsOf = new long[nodes.length][];
        int[] stride = new int[vars.length];
        int st = 1;
        for (int p = vars.length - 1; p >= 0; p--) {
            stride[p] = st;
            st *= card[p];
        }
        java.util.HashMap<Integer, Integer> pos = new java.util.HashMap<>();
        for (int k = 0; k < nodes.length; k++) {
            pos.put(nodes[k], k);
        }
        for (int k = 0; k < nodes.length; k++) {
            int i = nodes[k];
            long[] w = new long[words];
            byte kind = g.kind(i);
            if (kind == Graph.INPUT) {
                Box bx = box[i];
                int v = bx.vars[0];
                int p = Arrays.binarySearch(vars, v);
                Support sp = bx.sup[0];
                boolean[] on = new boolean[card[p]];
                for (int q = 0; q < card[p]; q++) {
                    on[q] = contains(sp, q);
                }
                for (int x = 0; x < bits; x++) {
                    if (on[(x / stride[p]) % card[p]]) {
                        w[x >>> 6] |= 1L << x;
                    }
                }
            } else if (kind == Graph.PRODUCT) {
                Arrays.fill(w, -1L);
                for (int e = g.childStart(i); e < g.childEnd(i); e++) {
                    long[] c = bitsOf[pos.get(g.child(e))];
                    for (int t = 0; t < words; t++) {
                        w[t] &= c[t];
                    }
                }
            } else {
                for (int e = g.childStart(i); e < g.childEnd(i); e++) {
                    if (positive(i, e - g.childStart(i))) {
                        long[] c = bitsOf[pos.get(g.child(e))];
                        for (int t = 0; t < words; t++) {
                            w[t] |= c[t];
                        }
                    }
                }
            }
            bitsOf[k] = w;
        }
        long[] acc = new long[words];
        long last = bits % 64 == 0 ? -1L : (1L << (bits % 64)) - 1;
        for (int k = 0; k < kids.size(); k++) {
            int c = kids.get(k);
            long[] w = bitsOf[pos.get(c)];
            for (int t = 0; t < words; t++) {
                long both = acc[t] & w[t] & (t == words - 1 ? last : -1L);
                if (both != 0) {
                    int x = (t << 6) + Long.numberOfTrailingZeros(both);
                    int other = -1;
                    for (int k2 = 0; k2 < k && other < 0; k2++) {
                        long[] w2 = bitsOf[pos.get(kids.get(k2))];
                        if ((w2[x >>> 6] & (1L << x)) != 0) {
                            other = kids.get(k2);
                        }
                    }
                    StringBuilder sb = new StringBuilder("{");
                    for (int p = 0; p < vars.length; p++) {
                        if (p > 0) {
                            sb.append(", ");
                        }
                        sb.append(valueText(vs.get(vars[p]), (x / stride[p]) % card[p]));
                    }
                    falseSums.add(new int[] {sum, other, c});
                    falseWitness.add(sb.append('}').toString());
                    return FALSE;
                }
                acc[t] |= w[t];
            }
        }
        return TRUE;
    }

    private static boolean contains(Support sp, int q) {
        for (int k = 0; k < sp.intervals(); k++) {
            if (q >= sp.lo(k) && q <= sp.hi(k)) {
                return true;
            }
        }
        return false;
    }

    private void push(int node, int sum, IntList sub, IntList stack) {
        if (stamp[node] != sum) {
            stamp[node] = sum;
            sub.add(node);
            stack.add(node);
        }
    }
}
