package dev.circa.converter.regions;

import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import java.util.BitSet;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.apache.commons.math3.distribution.UniformRealDistribution;

/**
 * Test-side reference: evaluates a circuit document node by node in log space with the
 * densities of commons-math3 3.6.1 (an outside library), and computes scopes to check
 * smoothness, decomposability and structured decomposability directly.
 */
final class CircuitMath {
    private CircuitMath() {
    }

    /** Log-value of every output at {@code row} (NaN = missing), with commons-math3 densities. */
    static double[] logDensity(CircuitDocument doc, double[] row) {
        List<Node> nodes = doc.nodes();
        Map<Integer, Integer> pos = new HashMap<>();
        double[] val = new double[nodes.size()];
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            pos.put(n.id(), i);
            if (n instanceof InputNode in) {
                double x = row[in.var()];
                val[i] = Double.isNaN(x) ? 0 : input(in, x);
            } else if (n instanceof ProductNode p) {
                double s = 0;
                for (int c : p.children()) {
                    s += val[pos.get(c)];
                }
                val[i] = s;
            } else if (n instanceof SumNode s) {
                int[] ch = s.children();
                double m = Double.NEGATIVE_INFINITY;
                double[] t = new double[ch.length];
                for (int j = 0; j < ch.length; j++) {
                    t[j] = s.logWeight(j) + val[pos.get(ch[j])];
                    m = Math.max(m, t[j]);
                }
                double acc = 0;
                for (double v : t) {
                    acc += m == Double.NEGATIVE_INFINITY ? 0 : Math.exp(v - m);
                }
                val[i] = m == Double.NEGATIVE_INFINITY ? m : m + Math.log(acc);
            }
        }
        double[] out = new double[doc.outputs().size()];
        for (int o = 0; o < out.length; o++) {
            out[o] = val[pos.get(doc.outputs().get(o).node())];
        }
        return out;
    }

    /** A {@link RegionVerifier.CircuitEvaluation} over {@code doc} built on {@link #logDensity}. */
    static RegionVerifier.CircuitEvaluation evaluation(CircuitDocument doc) {
        int nv = doc.variables().size();
        int c = doc.outputs().size();
        return (data, rows, out) -> {
            double[] row = new double[nv];
            for (int r = 0; r < rows; r++) {
                System.arraycopy(data, r * nv, row, 0, nv);
                System.arraycopy(logDensity(doc, row), 0, out, r * c, c);
            }
        };
    }

    private static double input(InputNode in, double x) {
        double[] p = in.params();
        switch (in.family()) {
            case NORMAL:
                return new NormalDistribution(null, p[0], p[1]).logDensity(x);
            case LOGNORMAL:
                return new LogNormalDistribution(null, p[0], p[1]).logDensity(x);
            case EXPONENTIAL:
                return new ExponentialDistribution(null, 1 / p[0]).logDensity(x);
            case GAMMA:
                return new GammaDistribution(null, p[0], 1 / p[1]).logDensity(x);
            case BETA:
                return new BetaDistribution(null, p[0], p[1]).logDensity(x);
            case UNIFORM:
                return new UniformRealDistribution(null, p[0], p[1]).logDensity(x);
            case POISSON:
                return new PoissonDistribution(null, p[0], 1e-12, 10_000_000).logProbability((int) x);
            case BINOMIAL:
                return new BinomialDistribution(null, (int) p[0], p[1]).logProbability((int) x);
            case BERNOULLI:
                return Math.log(x == 1 ? p[0] : 1 - p[0]);
            case CATEGORICAL:
                return Math.log(p[(int) x]);
            case INDICATOR:
                return x == p[0] ? 0 : Double.NEGATIVE_INFINITY;
            default:
                throw new IllegalArgumentException(in.family().jsonName());
        }
    }

    /** Scope of every node, by position. */
    static BitSet[] scopes(CircuitDocument doc) {
        List<Node> nodes = doc.nodes();
        Map<Integer, Integer> pos = new HashMap<>();
        BitSet[] scope = new BitSet[nodes.size()];
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            pos.put(n.id(), i);
            BitSet b = new BitSet();
            if (n instanceof InputNode in) {
                for (int v : in.vars()) {
                    b.set(v);
                }
            } else {
                for (int c : n.children()) {
                    b.or(scope[pos.get(c)]);
                }
            }
            scope[i] = b;
        }
        return scope;
    }

    /** Every sum's children have one scope. */
    static boolean smooth(CircuitDocument doc) {
        BitSet[] scope = scopes(doc);
        Map<Integer, Integer> pos = positions(doc);
        for (int i = 0; i < scope.length; i++) {
            if (doc.nodes().get(i) instanceof SumNode s) {
                for (int c : s.children()) {
                    if (!scope[pos.get(c)].equals(scope[i])) {
                        return false;
                    }
                }
            }
        }
        return true;
    }

    /** Every product's children have pairwise disjoint scopes. */
    static boolean decomposable(CircuitDocument doc) {
        BitSet[] scope = scopes(doc);
        Map<Integer, Integer> pos = positions(doc);
        for (int i = 0; i < scope.length; i++) {
            if (doc.nodes().get(i) instanceof ProductNode p) {
                BitSet seen = new BitSet();
                for (int c : p.children()) {
                    if (seen.intersects(scope[pos.get(c)])) {
                        return false;
                    }
                    seen.or(scope[pos.get(c)]);
                }
            }
        }
        return true;
    }

    /**
     * Whether a variable tree exists as FORMAT.md defines it: product scopes must form a laminar family
     * (with the singletons and the full set, they make the coarsest candidate tree), and each product's
     * children's scopes must be unions of that tree node's children.
     */
    static boolean structuredDecomposable(CircuitDocument doc) {
        BitSet[] scope = scopes(doc);
        Map<Integer, Integer> pos = positions(doc);
        Map<BitSet, Boolean> family = new HashMap<>();
        BitSet all = new BitSet();
        all.set(0, doc.variables().size());
        family.put(all, true);
        for (int v = 0; v < doc.variables().size(); v++) {
            BitSet b = new BitSet();
            b.set(v);
            family.put(b, true);
        }
        for (int i = 0; i < scope.length; i++) {
            if (doc.nodes().get(i) instanceof ProductNode) {
                family.put(scope[i], true);
            }
        }
        List<BitSet> sets = List.copyOf(family.keySet());
        for (BitSet a : sets) {
            for (BitSet b : sets) {
                if (a.intersects(b) && !contains(a, b) && !contains(b, a)) {
                    return false;
                }
            }
        }
        for (int i = 0; i < scope.length; i++) {
            if (!(doc.nodes().get(i) instanceof ProductNode p)) {
                continue;
            }
            BitSet s = scope[i];
            List<BitSet> kids = new java.util.ArrayList<>();
            for (BitSet t : sets) {
                if (!t.equals(s) && contains(s, t)) {
                    boolean maximal = true;
                    for (BitSet u : sets) {
                        if (!u.equals(s) && !u.equals(t) && contains(s, u) && contains(u, t)) {
                            maximal = false;
                            break;
                        }
                    }
                    if (maximal) {
                        kids.add(t);
                    }
                }
            }
            for (int c : p.children()) {
                BitSet cs = scope[pos.get(c)];
                for (BitSet k : kids) {
                    if (k.intersects(cs) && !contains(cs, k)) {
                        return false;
                    }
                }
            }
        }
        return true;
    }

    private static boolean contains(BitSet outer, BitSet inner) {
        BitSet t = (BitSet) inner.clone();
        t.andNot(outer);
        return t.isEmpty();
    }

    private static Map<Integer, Integer> positions(CircuitDocument doc) {
        Map<Integer, Integer> pos = new HashMap<>();
        for (int i = 0; i < doc.nodes().size(); i++) {
            pos.put(doc.nodes().get(i).id(), i);
        }
        return pos;
    }
}
