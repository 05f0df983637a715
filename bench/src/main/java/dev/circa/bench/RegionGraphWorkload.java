package dev.circa.bench;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.Provenance;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Seeded region-graph circuits of a chosen size, compiled in memory by the rule of FORMAT.md section 3:
 * the pump-station variables of {@value #STATIONS} stations; R random binary region trees of depth
 * {@value #DEPTH} under one root region (each tree a random permutation of the variables halved level by
 * level: the random region-graph splits), K = {@value #K} sums per inner region, I = {@value #I} input
 * bundles per leaf region (a bundle is the product of one input per variable), one product per
 * combination of one node of each part (first part slowest), C = 1 output named {@code joint}; random
 * normalised weights and input parameters. R is chosen so that the edge count is close to the target.
 * Also seeded data rows for the circuit, with an optional share of missing cells.
 */
public final class RegionGraphWorkload {
    static final int STATIONS = 12;
    static final int DEPTH = 4;
    static final int K = 10;
    static final int I = 10;
    private static final String[] NAMES = {"inlet_pressure", "motor_current", "valve", "alarm", "restarts"};
    private static final VariableType[] TYPES = {VariableType.REAL, VariableType.REAL, VariableType.CATEGORICAL,
        VariableType.BINARY, VariableType.COUNT};

    private RegionGraphWorkload() {
    }

    /** Number of variables. */
    public static int variableCount() {
        return STATIONS * NAMES.length;
    }

    /** The variables: per station inlet_pressure, motor_current (real), valve (3 states), alarm, restarts. */
    public static List<Variable> variables() {
        List<Variable> vars = new ArrayList<>();
        for (int s = 0; s < STATIONS; s++) {
            for (int v = 0; v < NAMES.length; v++) {
                List<String> states = TYPES[v] == VariableType.CATEGORICAL ? List.of("closed", "half", "open") : List.of();
                vars.add(new Variable("s" + s + "_" + NAMES[v], TYPES[v], states, null, null));
            }
        }
        return vars;
    }

    /** Repetitions (region trees under the root) for about {@code edges} edges, at least 1. */
    public static int repetitionsFor(long edges) {
        long perTree = edgesOfOneTree();
        return (int) Math.max(1, Math.round((double) edges / perTree));
    }

    private static long edgesOfOneTree() {
        // inner regions below the root: 2^DEPTH - 2, each K sums over K x K (or I x I) products of 2 edges
        long leaves = 1L << DEPTH;
        long inner = leaves - 2;
        long leafParents = leaves / 2;
        long edges = 0;
        edges += leafParents * ((long) K * I * I + 2L * I * I);
        edges += (inner - leafParents) * ((long) K * K * K + 2L * K * K);
        edges += (long) K * K * 1 + 2L * K * K; // the root's partition: products of two K-sum regions, one root sum
        int varsPerLeaf = variableCount() / (int) leaves;
        edges += leaves * I * (varsPerLeaf > 1 ? varsPerLeaf : 0);
        return edges;
    }

    /** The circuit with {@code repetitions} region trees under the root, from {@code seed}. */
    public static CircuitDocument build(int repetitions, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        int nv = variableCount();
        List<Node> nodes = new ArrayList<>();
        int[] rootProducts = null;
        List<int[]> rootLists = new ArrayList<>();
        for (int rep = 0; rep < repetitions; rep++) {
            int[] perm = new int[nv];
            for (int v = 0; v < nv; v++) {
                perm[v] = v;
            }
            for (int v = nv - 1; v > 0; v--) {
                int j = random.nextInt(v + 1);
                int x = perm[v];
                perm[v] = perm[j];
                perm[j] = x;
            }
            // level DEPTH: leaves, consecutive slices of the permutation; then pairs merge level by level
            int leaves = 1 << DEPTH;
            int[][] level = new int[leaves][];
            for (int leaf = 0; leaf < leaves; leaf++) {
                int[] vars = Arrays.copyOfRange(perm, leaf * nv / leaves, (leaf + 1) * nv / leaves);
                Arrays.sort(vars);
                level[leaf] = bundles(vars, nodes, random);
            }
            for (int depth = DEPTH - 1; depth >= 0; depth--) {
                int[][] up = new int[level.length / 2][];
                for (int r = 0; r < up.length; r++) {
                    int[] products = crossProduct(level[2 * r], level[2 * r + 1], nodes);
                    if (depth == 0) {
                        rootLists.add(products);
                    } else {
                        up[r] = sums(products, K, nodes, random);
                    }
                }
                level = up;
            }
        }
        int total = 0;
        for (int[] list : rootLists) {
            total += list.length;
        }
        rootProducts = new int[total];
        int at = 0;
        for (int[] list : rootLists) {
            System.arraycopy(list, 0, rootProducts, at, list.length);
            at += list.length;
        }
        int[] root = sums(rootProducts, 1, nodes, random);
        return CircuitDocument.builder()
                .name("pump-stations-region-graph")
                .provenance(new Provenance("circa bench", null, "RegionGraphWorkload seed " + seed + ", " + repetitions
                        + " region trees of depth " + DEPTH + ", K " + K + ", I " + I))
                .variables(variables())
                .nodes(nodes)
                .outputs(List.of(new Output("joint", root[0])))
                .build();
    }

    private static int[] bundles(int[] vars, List<Node> nodes, SplittableRandom random) {
        int[] out = new int[I];
        for (int b = 0; b < I; b++) {
            int[] inputs = new int[vars.length];
            for (int a = 0; a < vars.length; a++) {
                inputs[a] = nodes.size();
                nodes.add(input(nodes.size(), vars[a], random));
            }
            if (vars.length == 1) {
                out[b] = inputs[0];
            } else {
                out[b] = nodes.size();
                nodes.add(new ProductNode(nodes.size(), null, inputs));
            }
        }
        return out;
    }

    private static InputNode input(int id, int var, SplittableRandom r) {
        int[] vars = {var};
        return switch (var % NAMES.length) {
            case 0 -> new InputNode(id, null, Family.NORMAL, vars, new double[] {2 + 2 * r.nextDouble(), 0.2 + r.nextDouble()}, false);
            case 1 -> new InputNode(id, null, Family.NORMAL, vars, new double[] {10 + 5 * r.nextDouble(), 0.5 + 2 * r.nextDouble()}, false);
            case 2 -> new InputNode(id, null, Family.CATEGORICAL, vars, simplex(3, r), false);
            case 3 -> new InputNode(id, null, Family.BERNOULLI, vars, new double[] {0.05 + 0.9 * r.nextDouble()}, false);
            default -> new InputNode(id, null, Family.POISSON, vars, new double[] {0.2 + 3 * r.nextDouble()}, false);
        };
    }

    private static int[] crossProduct(int[] a, int[] b, List<Node> nodes) {
        int[] out = new int[a.length * b.length];
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < b.length; j++) {
                out[i * b.length + j] = nodes.size();
                nodes.add(new ProductNode(nodes.size(), null, new int[] {a[i], b[j]}));
            }
        }
        return out;
    }

    private static int[] sums(int[] children, int count, List<Node> nodes, SplittableRandom random) {
        int[] out = new int[count];
        for (int s = 0; s < count; s++) {
            out[s] = nodes.size();
            nodes.add(new SumNode(nodes.size(), null, children, simplex(children.length, random), false));
        }
        return out;
    }

    private static double[] simplex(int k, SplittableRandom r) {
        double[] w = new double[k];
        double total = 0;
        for (int i = 0; i < k; i++) {
            w[i] = 0.05 + r.nextDouble();
            total += w[i];
        }
        for (int i = 0; i < k; i++) {
            w[i] /= total;
        }
        return w;
    }

    /**
     * {@code rows} seeded data rows: reals near the inputs' means, discrete values in range; each cell
     * missing (NaN) with probability {@code missing}.
     */
    public static double[] rows(int rows, double missing, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        int nv = variableCount();
        double[] data = new double[rows * nv];
        for (int i = 0; i < data.length; i++) {
            int v = i % nv;
            if (r.nextDouble() < missing) {
                data[i] = Double.NaN;
                continue;
            }
            data[i] = switch (v % NAMES.length) {
                case 0 -> 2 + 2 * r.nextDouble();
                case 1 -> 10 + 5 * r.nextDouble();
                case 2 -> r.nextInt(3);
                case 3 -> r.nextInt(2);
                default -> r.nextInt(5);
            };
        }
        return data;
    }
}
