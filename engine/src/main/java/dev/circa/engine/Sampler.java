package dev.circa.engine;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.MvNormal;
import dev.circa.engine.internal.CircuitData;
import dev.circa.engine.random.Xoshiro256;
import java.util.Arrays;

/**
 * Ancestral sampling from an output of a {@link CompiledCircuit}. At sum i, child j is chosen with
 * probability proportional to w_ij Z_j, Z_j being child j's value with every variable missing, so an
 * output whose sums are not locally normalised still samples its normalised distribution; at a product
 * every child is visited; an input draws its variables. Exact for smooth, decomposable circuits.
 *
 * <p>Reproducible: the k-th row drawn by a sampler (counting from 0 over all its calls, or given
 * explicitly with {@link #sample(int, long, int, double[])}) uses its own {@link Xoshiro256} stream named
 * by (seed, k): xoshiro256** seeded by SplitMix64, with every transcendental function from
 * {@link StrictMath}. The same seed therefore gives the same rows on any machine and for any split of the
 * rows over threads. Not thread-safe: use one sampler per thread.
 */
public final class Sampler {
    private final CircuitData c;
    private final long seed;
    private final double[] logZ;
    private final double[] cumulative;
    private final int[] lastPositive;
    private final Xoshiro256 rng;
    private final double[] draw;
    private final int[] stack;
    private final int[] stamp;
    private int generation;
    private long nextRow;

    /**
     * A sampler for {@code circuit} with the given seed; computes every node's log Z and every sum's
     * running child probabilities once (one double per edge), so a draw at a sum is a binary search.
     */
    public Sampler(CompiledCircuit circuit, long seed) {
        this.c = circuit.data();
        this.seed = seed;
        this.logZ = partitions(c);
        this.cumulative = new double[c.childIndex.length];
        this.lastPositive = new int[c.nodeCount];
        precompute(c, logZ, cumulative, lastPositive);
        this.rng = new Xoshiro256(seed);
        this.draw = new double[Math.max(1, c.maxInputDimension)];
        this.stack = new int[c.nodeCount];
        this.stamp = new int[c.nodeCount];
    }

    /**
     * Draws the next {@code n} rows from {@code output}.
     *
     * @param output input: the output's index
     * @param n input: number of rows
     * @param out output: {@code n x variableCount()} cells, row-major; variables outside the output's
     *     scope are NaN
     * @throws IllegalArgumentException when the output's total mass is 0, infinite or undefined
     */
    public void sample(int output, int n, double[] out) {
        sample(output, nextRow, n, out);
        nextRow += n;
    }

    /**
     * Draws rows {@code firstRow .. firstRow + n - 1} of this seed's sequence from {@code output}, without
     * moving the position used by {@link #sample(int, int, double[])}. Use it to split one sequence over
     * several samplers.
     */
    public void sample(int output, long firstRow, int n, double[] out) {
        int nv = c.variableCount;
        if (output < 0 || output >= c.outputNode.length) {
            throw new IllegalArgumentException("no output " + output);
        }
        if (n < 0 || out.length < (long) n * nv) {
            throw new IllegalArgumentException("output has " + out.length + " cells (expected " + (long) n * nv + ")");
        }
        int root = c.outputNode[output];
        double z = logZ[root];
        if (!(z > Double.NEGATIVE_INFINITY && z < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("output " + c.outputName[output] + " has log Z = " + z
                    + " (expected a finite total mass to sample from)");
        }
        for (int r = 0; r < n; r++) {
            rng.reseed(seed, firstRow + r);
            int rowBase = r * nv;
            Arrays.fill(out, rowBase, rowBase + nv, Double.NaN);
            drawRow(root, out, rowBase);
        }
    }

    private void drawRow(int root, double[] out, int rowBase) {
        if (++generation == Integer.MAX_VALUE) {
            Arrays.fill(stamp, 0);
            generation = 1;
        }
        int mark = generation;
        int top = 0;
        stack[top++] = root;
        stamp[root] = mark;
        while (top > 0) {
            int i = stack[--top];
            int s = c.childStart[i];
            int end = c.childStart[i + 1];
            if (c.kind[i] == CircuitData.PRODUCT) {
                for (int e = end - 1; e >= s; e--) {
                    int child = c.childIndex[e];
                    if (stamp[child] != mark) {
                        stamp[child] = mark;
                        stack[top++] = child;
                    }
                }
            } else if (c.kind[i] == CircuitData.SUM) {
                int chosen = choose(i, s, end);
                if (stamp[chosen] != mark) {
                    stamp[chosen] = mark;
                    stack[top++] = chosen;
                }
            } else {
                drawInput(c.inputSlot[i], out, rowBase);
            }
        }
    }

    /**
     * The first child e whose running sum of probabilities w_ie Z_e / Z_i, in child order, passes a uniform
     * draw (the last child of positive probability when rounding leaves the total below it): a binary
     * search in the running sums computed once ({@link #cumulative}).
     */
    private int choose(int i, int s, int end) {
        double u = rng.nextDouble();
        int lo = s;
        int hi = end;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (u < cumulative[mid]) {
                hi = mid;
            } else {
                lo = mid + 1;
            }
        }
        return lo < end ? c.childIndex[lo] : lastPositive[i];
    }

    /**
     * Per sum edge, the running sum of StrictMath.exp(log w + log Z_child - log Z_sum) over the sum's
     * children up to and including it (children of probability 0 repeat the previous sum, so the first
     * edge whose running sum passes a draw always has positive probability); per sum, its last child of
     * positive probability (-1 if none). The same sums in the same order as a child-by-child scan, so the
     * choices are the same.
     */
    private static int precompute(CircuitData c, double[] logZ, double[] cumulative, int[] lastPositive) {
        int sums = 0;
        for (int i = 0; i < c.nodeCount; i++) {
            if (c.kind[i] != CircuitData.SUM) {
                continue;
            }
            sums++;
            double zi = logZ[i];
            double acc = 0;
            int last = -1;
            for (int e = c.childStart[i]; e < c.childStart[i + 1]; e++) {
                int child = c.childIndex[e];
                double t = c.logWeight[e] + logZ[child];
                if (t > Double.NEGATIVE_INFINITY) {
                    last = child;
                    acc += StrictMath.exp(t - zi);
                }
                cumulative[e] = acc;
            }
            lastPositive[i] = last;
        }
        return sums;
    }

    private void drawInput(int slot, double[] out, int rowBase) {
        int code = c.family[slot];
        int off = c.paramStart[slot];
        int vs = c.varStart[slot];
        if (code == Families.MVNORMAL) {
            int d = c.varStart[slot + 1] - vs;
            MvNormal.sample(c.params, off, d, c.factor, c.factorStart[slot], rng, draw);
            for (int a = 0; a < d; a++) {
                out[rowBase + c.varIndex[vs + a]] = checked(slot, code, vs + a, draw[a]);
            }
            return;
        }
        out[rowBase + c.varIndex[vs]] = checked(slot, code, vs,
                Families.sample(code, c.params, off, c.paramStart[slot + 1] - off, rng));
    }

    /** The draw, or a {@link DrawOverflowException} naming the input when no reader accepts it as a value. */
    private double checked(int slot, int code, int v, double x) {
        if (!Families.representable(code, x)) {
            throw new DrawOverflowException(c.nodeId[c.inputNode[slot]], Families.family(code).jsonName(),
                    c.varIndex[v], x);
        }
        return x;
    }

    /** log Z of every node (inputs integrate to 1), with StrictMath so that choices match on every machine. */
    private static double[] partitions(CircuitData c) {
        double[] z = new double[c.nodeCount];
        for (int i = 0; i < c.nodeCount; i++) {
            int s = c.childStart[i];
            int end = c.childStart[i + 1];
            if (c.kind[i] == CircuitData.PRODUCT) {
                double acc = 0;
                for (int e = s; e < end; e++) {
                    acc += z[c.childIndex[e]];
                }
                z[i] = acc;
            } else if (c.kind[i] == CircuitData.SUM) {
                double m = Double.NEGATIVE_INFINITY;
                for (int e = s; e < end; e++) {
                    m = Math.max(m, c.logWeight[e] + z[c.childIndex[e]]);
                }
                if (m > Double.NEGATIVE_INFINITY && m < Double.POSITIVE_INFINITY) {
                    double acc = 0;
                    for (int e = s; e < end; e++) {
                        double t = c.logWeight[e] + z[c.childIndex[e]];
                        if (t > Double.NEGATIVE_INFINITY) {
                            acc += StrictMath.exp(t - m);
                        }
                    }
                    m += StrictMath.log(acc);
                }
                z[i] = m;
            }
        }
        return z;
    }
}
