package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;

import dev.circa.engine.family.Families;
import dev.circa.engine.random.Xoshiro256;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * The sampler's choice at a sum (a binary search in running sums computed once) is the plain
 * child-by-child scan of the definition: add w_ij Z_j / Z_i in child order, skipping children of
 * probability 0, and take the first child where the sum passes the uniform draw. Checked draw for draw
 * against that scan, written here from the definition, on unnormalised random circuits with zero weights.
 */
class SamplerChoiceTest {
    @Test
    void sample_binarySearchChoices_equalChildByChildScan() {
        for (long seed = 1; seed <= 6; seed++) {
            CompiledCircuit circuit = TestCircuits.randomDiscrete(seed, seed % 2 == 0).compile();
            int nv = circuit.variableCount();
            int rows = 500;
            double[] fast = new double[rows * nv];
            new Sampler(circuit, 1000 + seed).sample(0, rows, fast);
            double[] scan = new double[rows * nv];
            scanSample(circuit, 1000 + seed, rows, scan);
            assertArrayEquals(scan, fast, "seed " + seed);
        }
    }

    @Test
    void sample_regionGraphWithZeroAndTinyWeights_equalChildByChildScan() {
        for (long seed = 40; seed < 44; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 7, 3, 2, 1, 0.3, true);
            CompiledCircuit circuit = rc.compile();
            int nv = circuit.variableCount();
            double[] fast = new double[300 * nv];
            new Sampler(circuit, seed).sample(0, 300, fast);
            double[] scan = new double[300 * nv];
            scanSample(circuit, seed, 300, scan);
            assertArrayEquals(scan, fast, "seed " + seed);
        }
    }

    /** Ancestral sampling by the definition, one row at a time; univariate inputs only. */
    private static void scanSample(CompiledCircuit c, long seed, int rows, double[] out) {
        int n = c.nodeCount();
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        double[] lw = c.logWeight();
        double[] z = new double[n];
        for (int i = 0; i < n; i++) {
            if (c.kind(i) == NodeKind.PRODUCT) {
                double acc = 0;
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    acc += z[ci[e]];
                }
                z[i] = acc;
            } else if (c.kind(i) == NodeKind.SUM) {
                double m = Double.NEGATIVE_INFINITY;
                for (int e = cs[i]; e < cs[i + 1]; e++) {
                    m = Math.max(m, lw[e] + z[ci[e]]);
                }
                if (m > Double.NEGATIVE_INFINITY && m < Double.POSITIVE_INFINITY) {
                    double acc = 0;
                    for (int e = cs[i]; e < cs[i + 1]; e++) {
                        double t = lw[e] + z[ci[e]];
                        if (t > Double.NEGATIVE_INFINITY) {
                            acc += StrictMath.exp(t - m);
                        }
                    }
                    m += StrictMath.log(acc);
                }
                z[i] = m;
            }
        }
        Xoshiro256 rng = new Xoshiro256(seed);
        int nv = c.variableCount();
        int[] stack = new int[n];
        boolean[] seen = new boolean[n];
        for (int r = 0; r < rows; r++) {
            rng.reseed(seed, r);
            Arrays.fill(out, r * nv, (r + 1) * nv, Double.NaN);
            Arrays.fill(seen, false);
            int top = 0;
            int root = c.outputNode(0);
            stack[top++] = root;
            seen[root] = true;
            while (top > 0) {
                int i = stack[--top];
                if (c.kind(i) == NodeKind.PRODUCT) {
                    for (int e = cs[i + 1] - 1; e >= cs[i]; e--) {
                        if (!seen[ci[e]]) {
                            seen[ci[e]] = true;
                            stack[top++] = ci[e];
                        }
                    }
                } else if (c.kind(i) == NodeKind.SUM) {
                    double u = rng.nextDouble();
                    double acc = 0;
                    int chosen = -1;
                    for (int e = cs[i]; e < cs[i + 1]; e++) {
                        double t = lw[e] + z[ci[e]];
                        if (t > Double.NEGATIVE_INFINITY) {
                            chosen = ci[e];
                            acc += StrictMath.exp(t - z[i]);
                            if (u < acc) {
                                break;
                            }
                        }
                    }
                    if (!seen[chosen]) {
                        seen[chosen] = true;
                        stack[top++] = chosen;
                    }
                } else {
                    double[] p = c.inputParams(i);
                    int code = Families.code(c.inputFamily(i), c.inputLogForm(i));
                    out[r * nv + c.inputVars(i)[0]] = Families.sample(code, p, 0, p.length, rng);
                }
            }
        }
    }
}
