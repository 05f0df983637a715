package dev.circa.validator.analysis;

import dev.circa.format.InputNode;
import dev.circa.format.NodeTable;
import dev.circa.format.Family;

/**
 * log Z of every node of a smooth, decomposable circuit with valid parameters, children first in
 * one pass: an input's log Z is 0 except for a categorical (log of its probabilities' sum), a
 * product's is the sum of its children's, a sum's the log-sum-exp of log-weight plus child log Z.
 */
public final class LogPartition {
    private LogPartition() {
    }

    /** log Z per node index. */
    public static double[] of(Graph g) {
        int n = g.size();
        double[] z = new double[n];
        NodeTable t = g.document().nodeTable();
        // node by node in small steps, so that each is compiled on its own early
        for (int i = 0; i < n; i++) {
            byte k = g.kind(i);
            if (k == Graph.INPUT) {
                if (t.family(i) == Family.CATEGORICAL) {
                    InputNode in = (InputNode) g.node(i);
                    z[i] = logSumExp(in.params(), in.logForm());
                }
            } else if (k == Graph.PRODUCT) {
                z[i] = product(g, z, i);
            } else {
                z[i] = sum(g, t, z, i);
            }
        }
        return z;
    }

    /** The sum of product {@code i}'s children's log Z. */
    private static double product(Graph g, double[] z, int i) {
        int b = g.childEnd(i);
        double s = 0;
        for (int e = g.childStart(i); e < b; e++) {
            s += z[g.child(e)];
        }
        return s;
    }

    /** The log-sum-exp of sum {@code i}'s log-weights plus its children's log Z. */
    private static double sum(Graph g, NodeTable t, double[] z, int i) {
        int a = g.childStart(i);
        int b = g.childEnd(i);
        int w0 = t.valueStart(i) - a;
        boolean log = t.logForm(i);
        double max = Double.NEGATIVE_INFINITY;
        for (int e = a; e < b; e++) {
            double c = z[g.child(e)];
            max = Math.max(max, log ? t.value(w0 + e) + c : c);
        }
        if (max == Double.NEGATIVE_INFINITY || max == Double.POSITIVE_INFINITY) {
            return log || max == Double.POSITIVE_INFINITY ? max : Double.NEGATIVE_INFINITY;
        }
        // linear weights scale exp(z - max) directly: one exp per edge and no log per weight
        double s = 0;
        for (int e = a; e < b; e++) {
            double c = z[g.child(e)];
            double d = c - max;
            // normalised sub-circuits have log Z = 0 everywhere: no exp needed then
            s += log ? Math.exp(t.value(w0 + e) + d) : d == 0 ? t.value(w0 + e) : t.value(w0 + e) * Math.exp(d);
        }
        return max + Math.log(s);
    }

    private static double logSumExp(double[] p, boolean log) {
        if (!log) {
            double s = 0;
            for (double x : p) {
                s += x;
            }
            return Math.log(s);
        }
        double max = Double.NEGATIVE_INFINITY;
        for (double x : p) {
            max = Math.max(max, x);
        }
        if (max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        double s = 0;
        for (double x : p) {
            s += Math.exp(x - max);
        }
        return max + Math.log(s);
    }
}
