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
        for (int i = 0; i < n; i++) {
            byte k = g.kind(i);
            int a = g.childStart(i);
            int b = g.childEnd(i);
            if (k == Graph.INPUT) {
                if (g.document().nodeTable().family(i) == Family.CATEGORICAL) {
                    InputNode in = (InputNode) g.node(i);
                    z[i] = logSumExp(in.params(), in.logForm());
                }
            } else if (k == Graph.PRODUCT) {
                double s = 0;
                for (int e = a; e < b; e++) {
                    s += z[g.child(e)];
                }
                z[i] = s;
            } else {
                NodeTable t = g.document().nodeTable();
                int w0 = t.valueStart(i) - a;
                boolean log = t.logForm(i);
                double max = Double.NEGATIVE_INFINITY;
                for (int e = a; e < b; e++) {
                    double c = z[g.child(e)];
                    max = Math.max(max, log ? t.value(w0 + e) + c : c);
                }
                if (max == Double.NEGATIVE_INFINITY || max == Double.POSITIVE_INFINITY) {
                    z[i] = log || max == Double.POSITIVE_INFINITY ? max : Double.NEGATIVE_INFINITY;
                    continue;
                }
                // linear weights scale exp(z - max) directly: one exp per edge and no log per weight
                double s = 0;
                for (int e = a; e < b; e++) {
                    double c = z[g.child(e)];
                    double d = c - max;
                    // normalised sub-circuits have log Z = 0 everywhere: no exp needed then
                    s += log ? Math.exp(t.value(w0 + e) + d) : d == 0 ? t.value(w0 + e) : t.value(w0 + e) * Math.exp(d);
                }
                z[i] = max + Math.log(s);
            }
        }
        return z;
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
