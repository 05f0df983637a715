package dev.circa.converter.regions;

import dev.circa.converter.reference.ReferenceDensities;
import dev.circa.format.Family;

/**
 * The region-by-region evaluation as it was before rows were evaluated in blocks, kept as the test's
 * reference: one row at a time, each region a vector of log-values, each sum a scaled dot product with
 * a per-edge log-sum-exp fallback when that underflows. Not thread-safe.
 */
final class PerPointTensorEvaluation {
    private static final int CHUNK_ROWS = 1;

    private final RegionParameters p;
    private final RegionStructure s;
    private final Layout layout;
    private final double[][] logw;
    private final double[][] scaled;
    private final double[][] shift;
    private double[] expChild = new double[0];
    private double[][] tensor;
    private int capacity;

    PerPointTensorEvaluation(RegionParameters params) {
        this.p = params;
        this.s = params.structure();
        this.layout = params.layout();
        int nr = s.regionCount();
        this.logw = new double[nr][];
        this.scaled = new double[nr][];
        this.shift = new double[nr][];
        for (int r = 0; r < nr; r++) {
            if (layout.hasSums(r)) {
                int k = layout.sums(r);
                int c = layout.children(r);
                double[] lw = new double[k * c];
                double[] sw = new double[k * c];
                double[] sh = new double[k];
                for (int t = 0; t < k; t++) {
                    double[] w = params.weights(r, t);
                    double max = Double.NEGATIVE_INFINITY;
                    for (int j = 0; j < c; j++) {
                        lw[t * c + j] = params.logWeights(r) ? w[j] : Math.log(w[j]);
                        max = Math.max(max, lw[t * c + j]);
                    }
                    sh[t] = max;
                    for (int j = 0; j < c; j++) {
                        sw[t * c + j] = max == Double.NEGATIVE_INFINITY ? 0 : Math.exp(lw[t * c + j] - max);
                    }
                }
                logw[r] = lw;
                scaled[r] = sw;
                shift[r] = sh;
            }
        }
    }

    /** Number of outputs (C). */
    int outputCount() {
        return p.options().outputs();
    }

    /**
     * Log-values of every output for each row.
     *
     * @param data input: row-major rows x variables, NaN = missing, discrete values as doubles
     * @param rows number of rows
     * @param out output: {@code out[row * outputCount() + o]}
     */
    void logDensity(double[] data, int rows, double[] out) {
        int nv = s.variables().size();
        int co = outputCount();
        double[] chunkData = new double[Math.min(rows, CHUNK_ROWS) * nv];
        double[] chunkOut = new double[Math.min(rows, CHUNK_ROWS) * co];
        for (int from = 0; from < rows; from += CHUNK_ROWS) {
            int n = Math.min(CHUNK_ROWS, rows - from);
            System.arraycopy(data, from * nv, chunkData, 0, n * nv);
            chunk(chunkData, n, chunkOut);
            System.arraycopy(chunkOut, 0, out, from * co, n * co);
        }
    }

    private void chunk(double[] data, int rows, double[] out) {
        int nv = s.variables().size();
        int nr = s.regionCount();
        if (tensor == null || capacity < rows) {
            tensor = new double[nr][];
            capacity = rows;
        }
        double[] child = new double[0];
        for (int r : s.order()) {
            int size = layout.size(r);
            double[] t = tensor[r];
            if (t == null || t.length < rows * size) {
                t = new double[capacity * size];
                tensor[r] = t;
            }
            double[] base;
            int baseSize;
            if (s.isLeaf(r)) {
                int[] vars = s.vars(r);
                int bundles = p.options().inputs();
                base = r == s.root() ? new double[rows * bundles] : t;
                baseSize = bundles;
                for (int row = 0; row < rows; row++) {
                    for (int i = 0; i < bundles; i++) {
                        double sum = 0;
                        for (int j = 0; j < vars.length; j++) {
                            double x = data[row * nv + vars[j]];
                            if (!Double.isNaN(x)) {
                                Family f = p.family(vars[j]);
                                sum += ReferenceDensities.logValue(f, p.inputParams(r, i, j), x);
                            }
                        }
                        base[row * bundles + i] = sum;
                    }
                }
                if (r != s.root()) {
                    continue;
                }
            } else {
                base = null;
                baseSize = 0;
            }
            int c = layout.children(r);
            if (child.length < c) {
                child = new double[c];
            }
            int k = layout.sums(r);
            double[] lw = logw[r];
            for (int row = 0; row < rows; row++) {
                if (base != null) {
                    System.arraycopy(base, row * baseSize, child, 0, baseSize);
                } else {
                    fillProducts(r, row, child);
                }
                // fast path: log(sum_j w_j e^(v_j)) = vmax + shift + log(sum_j (w_j / wmax) e^(v_j - vmax)); the
                // exact per-edge log-sum-exp below is used when the scaled sum underflows
                double vmax = Double.NEGATIVE_INFINITY;
                for (int j = 0; j < c; j++) {
                    vmax = Math.max(vmax, child[j]);
                }
                if (expChild.length < c) {
                    expChild = new double[c];
                }
                if (vmax != Double.NEGATIVE_INFINITY) {
                    for (int j = 0; j < c; j++) {
                        expChild[j] = Math.exp(child[j] - vmax);
                    }
                }
                double[] sw = scaled[r];
                double[] sh = shift[r];
                for (int q = 0; q < k; q++) {
                    if (vmax == Double.NEGATIVE_INFINITY) {
                        t[row * size + q] = vmax;
                        continue;
                    }
                    double dot = 0;
                    for (int j = 0, at = q * c; j < c; j++, at++) {
                        dot += sw[at] * expChild[j];
                    }
                    if (dot >= 0x1p-900) {
                        t[row * size + q] = vmax + sh[q] + Math.log(dot);
                        continue;
                    }
                    double m = Double.NEGATIVE_INFINITY;
                    for (int j = 0; j < c; j++) {
                        double v = lw[q * c + j] + child[j];
                        if (v > m) {
                            m = v;
                        }
                    }
                    double acc = 0;
                    if (m != Double.NEGATIVE_INFINITY) {
                        for (int j = 0; j < c; j++) {
                            acc += Math.exp(lw[q * c + j] + child[j] - m);
                        }
                    }
                    t[row * size + q] = m == Double.NEGATIVE_INFINITY ? m : m + Math.log(acc);
                }
            }
        }
        int root = s.root();
        int co = outputCount();
        for (int row = 0; row < rows; row++) {
            System.arraycopy(tensor[root], row * co, out, row * co, co);
        }
    }

    private void fillProducts(int r, int row, double[] child) {
        int c = 0;
        for (int part : s.partitionsOf(r)) {
            int[] parts = s.parts(part);
            int m = parts.length;
            int[] digit = new int[m];
            long combos = 1;
            for (int q : parts) {
                combos *= layout.size(q);
            }
            // product number i in mixed radix, the last part's digit varying fastest
            for (long i = 0; i < combos; i++) {
                long rest = i;
                for (int t = m - 1; t >= 0; t--) {
                    digit[t] = (int) (rest % layout.size(parts[t]));
                    rest /= layout.size(parts[t]);
                }
                double v = 0;
                for (int t = 0; t < m; t++) {
                    int q = parts[t];
                    v += tensor[q][row * layout.size(q) + digit[t]];
                }
                child[c++] = v;
            }
        }
    }
}
