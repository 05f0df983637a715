package dev.circa.engine.internal;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.MvNormal;
import dev.circa.engine.family.MvNormalWorkspace;

/**
 * One upward pass over a chunk of rows in log space, nodes in children-first order. Values are node-major:
 * node i, row r of the chunk at {@code value[i * rows + r]}, so every inner loop runs over contiguous rows.
 * Sums use log-sum-exp (or the maximum, for max-product); products add. The kernel trusts its input.
 */
public final class ForwardKernel {
    private ForwardKernel() {
    }

    /**
     * @param c the circuit
     * @param data input: row-major cells, {@code c.variableCount} per row, NaN = missing
     * @param row0 input: first row of the chunk in {@code data}
     * @param rows input: rows in the chunk
     * @param hide optional input: per variable, treat the cell as missing (null: none)
     * @param max input: max-product (inputs over missing variables take their largest value) instead of sum-product
     * @param value output: node-major values, at least {@code c.nodeCount * rows}
     * @param scratch workspace: at least {@code rows} doubles
     * @param mvn workspace for multivariate inputs
     */
    public static void run(CircuitData c, double[] data, int row0, int rows, boolean[] hide, boolean max,
            double[] value, double[] scratch, MvNormalWorkspace mvn) {
        run(c, data, row0, rows, hide, max, value, null, scratch, mvn);
    }

    /**
     * The same; with {@code choice} (max-product only, node-major like {@code value}), each sum also records at
     * each row the child edge a backtrack takes: the first of the largest weighted children, or the first child
     * when its own weighted value is NaN (what a scan of the children in order with {@code >} keeps).
     */
    public static void run(CircuitData c, double[] data, int row0, int rows, boolean[] hide, boolean max,
            double[] value, int[] choice, double[] scratch, MvNormalWorkspace mvn) {
        for (int i = 0; i < c.nodeCount; i++) {
            node(c, i, data, row0, rows, hide, max, value, choice, scratch, mvn);
        }
    }

    /** Evaluates node {@code i} alone, its children being done; arguments as {@link #run}. */
    static void node(CircuitData c, int i, double[] data, int row0, int rows, boolean[] hide, boolean max,
            double[] value, int[] choice, double[] scratch, MvNormalWorkspace mvn) {
        final int[] childStart = c.childStart;
        final int[] childIndex = c.childIndex;
        final double[] logWeight = c.logWeight;
        final int base = i * rows;
        final int s = childStart[i];
        final int end = childStart[i + 1];
        if (c.kind[i] == CircuitData.PRODUCT) {
            int first = childIndex[s] * rows;
            System.arraycopy(value, first, value, base, rows);
            for (int e = s + 1; e < end; e++) {
                int cb = childIndex[e] * rows;
                for (int r = 0; r < rows; r++) {
                    value[base + r] += value[cb + r];
                }
            }
        } else if (c.kind[i] == CircuitData.SUM) {
            for (int r = 0; r < rows; r++) {
                value[base + r] = Double.NEGATIVE_INFINITY;
            }
            if (choice != null) {
                maxWithChoice(value, base, rows, s, end, childIndex, logWeight, choice, scratch);
                return;
            }
            for (int e = s; e < end; e++) {
                int cb = childIndex[e] * rows;
                double w = logWeight[e];
                for (int r = 0; r < rows; r++) {
                    double t = w + value[cb + r];
                    if (t > value[base + r]) {
                        value[base + r] = t;
                    }
                }
            }
            if (!max) {
                logSumExp(value, base, rows, s, end, childIndex, logWeight, scratch);
            }
        } else {
            input(c, data, row0, rows, hide, max, value, base, c.inputSlot[i], c.variableCount, mvn);
        }
    }

    /**
     * A sum's maxima (the same doubles as without a choice) and, per row, the edge of the child a backtrack
     * takes ({@link #run}); {@code nanFirst} marks the rows whose first weighted child is NaN.
     */
    private static void maxWithChoice(double[] value, int base, int rows, int s, int end, int[] childIndex,
            double[] logWeight, int[] choice, double[] nanFirst) {
        int cb0 = childIndex[s] * rows;
        double w0 = logWeight[s];
        for (int r = 0; r < rows; r++) {
            double t = w0 + value[cb0 + r];
            nanFirst[r] = t != t ? 1 : 0;
            choice[base + r] = s;
        }
        for (int e = s; e < end; e++) {
            int cb = childIndex[e] * rows;
            double w = logWeight[e];
            for (int r = 0; r < rows; r++) {
                double t = w + value[cb + r];
                if (t > value[base + r]) {
                    value[base + r] = t;
                    if (nanFirst[r] == 0) {
                        choice[base + r] = e;
                    }
                }
            }
        }
    }

    /** Replaces the maxima at {@code value[base..]} by log sum exp over the children. */
    static void logSumExp(double[] value, int base, int rows, int s, int end, int[] childIndex,
            double[] logWeight, double[] sum) {
        for (int r = 0; r < rows; r++) {
            sum[r] = 0;
        }
        for (int e = s; e < end; e++) {
            int cb = childIndex[e] * rows;
            double w = logWeight[e];
            for (int r = 0; r < rows; r++) {
                double m = value[base + r];
                double t = w + value[cb + r];
                if (t > Double.NEGATIVE_INFINITY) {
                    sum[r] += Math.exp(t - m);
                }
            }
        }
        for (int r = 0; r < rows; r++) {
            double m = value[base + r];
            if (m > Double.NEGATIVE_INFINITY && m < Double.POSITIVE_INFINITY) {
                value[base + r] = m + Math.log(sum[r]);
            }
        }
    }

    static void input(CircuitData c, double[] data, int row0, int rows, boolean[] hide, boolean max,
            double[] value, int base, int slot, int nv, MvNormalWorkspace mvn) {
        int code = c.family[slot];
        int off = c.paramStart[slot];
        int len = c.paramStart[slot + 1] - off;
        double[] p = c.params;
        if (code == Families.MVNORMAL) {
            int vs = c.varStart[slot];
            int d = c.varStart[slot + 1] - vs;
            int fOff = c.factorStart[slot];
            for (int r = 0; r < rows; r++) {
                int rowBase = (row0 + r) * nv;
                for (int a = 0; a < d; a++) {
                    int v = c.varIndex[vs + a];
                    mvn.value[a] = hide != null && hide[v] ? Double.NaN : data[rowBase + v];
                }
                value[base + r] = max ? MvNormal.maxLogDensity(p, off, d, c.factor, fOff, mvn)
                        : MvNormal.logDensity(p, off, d, c.factor, fOff, mvn);
            }
            return;
        }
        int v = c.varIndex[c.varStart[slot]];
        if (hide != null && hide[v]) {
            double missing = missingValue(code, p, off, len, max);
            for (int r = 0; r < rows; r++) {
                value[base + r] = missing;
            }
            return;
        }
        for (int r = 0; r < rows; r++) {
            double x = data[(row0 + r) * nv + v];
            value[base + r] = Double.isNaN(x) ? missingValue(code, p, off, len, max)
                    : Families.logDensity(code, p, off, len, x);
        }
    }

    /** An input's value over a missing variable: its largest log-density (max-product) or its log total mass. */
    private static double missingValue(int code, double[] p, int off, int len, boolean max) {
        return max ? Families.maxLogDensity(code, p, off, len) : Families.logTotalMass(code, p, off, len);
    }
}
