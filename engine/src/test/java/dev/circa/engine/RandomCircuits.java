package dev.circa.engine;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;

/**
 * Seeded random circuits for comparing the evaluation paths: region-graph circuits compiled by the rule of
 * FORMAT.md section 3 (K sums per inner region over the cross products of each partition's parts, I
 * bundles per leaf region), circuits of random sums and products over earlier nodes with no block
 * structure, and mixtures of both; and data rows with missing cells and values outside the inputs'
 * supports.
 */
final class RandomCircuits {
    /** Variable types cycle real, binary, categorical (3 states). */
    static final int STATES = 3;

    final TestCircuits t = new TestCircuits();
    final int variables;
    /** Per inner region, the products of its partitions, in the sums' child order. */
    final List<int[]> regionProducts = new ArrayList<>();
    /** Per inner region, its sums. */
    final List<int[]> regionSums = new ArrayList<>();
    private final Random random;
    private final boolean extremes;
    private boolean indicators = true;

    private RandomCircuits(long seed, int variables, boolean extremes) {
        this.random = new Random(seed);
        this.variables = variables;
        this.extremes = extremes;
        for (int v = 0; v < variables; v++) {
            switch (v % 3) {
                case 0 -> t.variable("inlet_pressure_" + v, VariableType.REAL);
                case 1 -> t.variable("alarm_" + v, VariableType.BINARY);
                default -> t.variable("valve_" + v, VariableType.CATEGORICAL, "closed", "half", "open");
            }
        }
    }

    /**
     * A region-graph circuit: random splits of the variables into 2 or 3 parts down to leaf regions of one or
     * two variables, a second partition for some regions (with probability {@code second}), K sums per
     * inner region, I bundles per leaf, {@code outputs} sums at the root. With {@code extremes}, some weights
     * are 0, some sums carry log-weights shifted by large amounts, and some weights are tiny (1e-250).
     */
    static RandomCircuits regionGraph(long seed, int variables, int k, int bundles, int outputs, double second,
            boolean extremes) {
        RandomCircuits rc = new RandomCircuits(seed, variables, extremes);
        int[] all = new int[variables];
        for (int v = 0; v < variables; v++) {
            all[v] = v;
        }
        int[] root = rc.region(all, k, bundles, outputs, second, 0);
        for (int o = 0; o < root.length; o++) {
            rc.t.output(outputs == 1 ? "joint" : "out" + o, root[o]);
        }
        return rc;
    }

    /** Builds a region and everything below it, children first, with explicit work lists; returns its nodes. */
    private int[] region(int[] vars, int k, int bundles, int count, double second, int depth) {
        // regions are created top-down into a list, then built in reverse so children come first
        List<int[]> regionVars = new ArrayList<>();
        List<List<int[]>> partitions = new ArrayList<>();
        List<Integer> depths = new ArrayList<>();
        regionVars.add(vars);
        depths.add(depth);
        partitions.add(null);
        for (int r = 0; r < regionVars.size(); r++) {
            int[] rv = regionVars.get(r);
            if (rv.length <= 2 && (rv.length == 1 || random.nextBoolean())) {
                continue;
            }
            List<int[]> parts = new ArrayList<>();
            int splits = random.nextDouble() < second && depths.get(r) < 2 ? 2 : 1;
            for (int p = 0; p < splits; p++) {
                int[] shuffled = rv.clone();
                shuffle(shuffled);
                int pieces = rv.length >= 3 && random.nextInt(4) == 0 ? 3 : 2;
                int[] cuts = cuts(rv.length, pieces);
                int[] children = new int[pieces];
                for (int q = 0; q < pieces; q++) {
                    int[] piece = Arrays.copyOfRange(shuffled, cuts[q], cuts[q + 1]);
                    Arrays.sort(piece);
                    children[q] = regionVars.size();
                    regionVars.add(piece);
                    depths.add(depths.get(r) + 1);
                    partitions.add(null);
                }
                parts.add(children);
            }
            partitions.set(r, parts);
        }
        int[][] nodes = new int[regionVars.size()][];
        for (int r = regionVars.size() - 1; r >= 0; r--) {
            List<int[]> parts = partitions.get(r);
            int want = r == 0 ? count : k;
            if (parts == null) {
                int[] leaf = new int[bundles];
                for (int b = 0; b < bundles; b++) {
                    int[] rv = regionVars.get(r);
                    int[] inputs = new int[rv.length];
                    for (int a = 0; a < rv.length; a++) {
                        inputs[a] = input(rv[a]);
                    }
                    leaf[b] = inputs.length == 1 ? inputs[0] : t.product(inputs);
                }
                nodes[r] = r == 0 ? sums(leaf, want) : leaf;
                continue;
            }
            List<Integer> products = new ArrayList<>();
            for (int[] partition : parts) {
                int[][] groups = new int[partition.length][];
                for (int q = 0; q < partition.length; q++) {
                    groups[q] = nodes[partition[q]];
                }
                crossProduct(groups, products);
            }
            int[] list = products.stream().mapToInt(Integer::intValue).toArray();
            regionProducts.add(list);
            int[] sums = sums(list, want);
            regionSums.add(sums);
            nodes[r] = sums;
        }
        return nodes[0];
    }

    /** Appends one product per combination of one node of each group, the first group varying slowest. */
    private void crossProduct(int[][] groups, List<Integer> out) {
        int[] digit = new int[groups.length];
        while (true) {
            int[] children = new int[groups.length];
            for (int q = 0; q < groups.length; q++) {
                children[q] = groups[q][digit[q]];
            }
            out.add(t.product(children));
            int q = groups.length - 1;
            while (q >= 0 && ++digit[q] == groups[q].length) {
                digit[q] = 0;
                q--;
            }
            if (q < 0) {
                return;
            }
        }
    }

    private int[] sums(int[] children, int count) {
        int[] sums = new int[count];
        for (int s = 0; s < count; s++) {
            sums[s] = sum(children);
        }
        return sums;
    }

    /** A sum over {@code children} with random weights (some zero, shifted or tiny with extremes). */
    int sum(int... children) {
        double[] w = TestCircuits.simplex(random, children.length);
        if (!extremes) {
            return random.nextInt(4) == 0 ? t.logSum(logs(w, 0), children) : t.sum(w, children);
        }
        switch (random.nextInt(5)) {
            case 0 -> {
                if (w.length > 1) {
                    w[random.nextInt(w.length)] = 0;
                }
                return t.sum(w, children);
            }
            case 1 -> {
                return t.logSum(logs(w, 300 * (random.nextDouble() - 0.5)), children);
            }
            case 2 -> {
                for (int j = 0; j < w.length; j++) {
                    if (random.nextBoolean()) {
                        w[j] *= 1e-250;
                    }
                }
                return t.sum(w, children);
            }
            case 3 -> {
                double[] lw = logs(w, 0);
                lw[random.nextInt(lw.length)] = -800;
                return t.logSum(lw, children);
            }
            default -> {
                return t.sum(w, children);
            }
        }
    }

    private static double[] logs(double[] w, double shift) {
        double[] lw = new double[w.length];
        for (int j = 0; j < w.length; j++) {
            lw[j] = Math.log(w[j]) + shift;
        }
        return lw;
    }

    /** An input over variable v: normal for real; bernoulli, categorical or indicator for discrete. */
    int input(int v) {
        if (v % 3 == 0) {
            return t.input(Family.NORMAL, v, 3 * random.nextDouble(), 0.3 + random.nextDouble());
        }
        int states = v % 3 == 1 ? 2 : STATES;
        return switch (random.nextInt(indicators ? 3 : 2)) {
            case 0 -> states == 2 ? t.input(Family.BERNOULLI, v, 0.05 + 0.9 * random.nextDouble())
                    : t.input(Family.CATEGORICAL, v, TestCircuits.simplex(random, states));
            case 1 -> t.input(Family.CATEGORICAL, v, TestCircuits.simplex(random, states));
            default -> t.input(Family.INDICATOR, v, random.nextInt(states));
        };
    }

    /**
     * A circuit of {@code inputs} inputs then four layers of {@code inner / 4} sums and products, each over
     * 1 to 6 (sums) or 1 to 3 (products) random nodes of the layer below (not smooth, not decomposable: the
     * evaluation rules still define its value), last node the output; no indicators, so that not every row
     * is 0. Shallow, so that the number of paths, and with it the rounding of either path, stays small.
     */
    static RandomCircuits unstructured(long seed, int variables, int inputs, int inner, boolean extremes) {
        RandomCircuits rc = new RandomCircuits(seed, variables, extremes);
        rc.indicators = false;
        int below = rc.t.nodes().size();
        for (int i = 0; i < inputs; i++) {
            rc.input(rc.random.nextInt(variables));
        }
        int width = Math.max(1, inner / 4);
        for (int layer = 0; layer < 4; layer++) {
            int from = below;
            int to = rc.t.nodes().size();
            below = to;
            for (int i = 0; i < width; i++) {
                boolean product = rc.random.nextBoolean();
                int[] children = new int[1 + rc.random.nextInt(product ? 3 : 6)];
                for (int j = 0; j < children.length; j++) {
                    children[j] = from + rc.random.nextInt(to - from);
                }
                if (product) {
                    rc.t.product(children);
                } else {
                    rc.sum(children);
                }
            }
        }
        rc.t.output("joint", rc.t.nodes().size() - 1);
        return rc;
    }

    /**
     * A region-graph circuit with extra nodes that break the block pattern around it: products of the blocks
     * also used by other nodes, sums over a block's products in another order, over a block's products
     * plus an input, over products shared by two blocks, and an output naming a block's product.
     */
    static RandomCircuits mixed(long seed, int variables, int k, int bundles) {
        RandomCircuits rc = regionGraph(seed, variables, k, bundles, 1, 0.3, true);
        Random random = rc.random;
        List<Integer> extra = new ArrayList<>();
        for (int r = 0; r < rc.regionProducts.size(); r++) {
            int[] products = rc.regionProducts.get(r);
            int pick = products[random.nextInt(products.length)];
            switch (random.nextInt(4)) {
                case 0 -> extra.add(rc.t.product(pick, rc.input(random.nextInt(variables))));
                case 1 -> {
                    int[] reversed = products.clone();
                    for (int a = 0, b = reversed.length - 1; a < b; a++, b--) {
                        int x = reversed[a];
                        reversed[a] = reversed[b];
                        reversed[b] = x;
                    }
                    extra.add(rc.sum(reversed));
                    extra.add(rc.sum(reversed));
                }
                case 2 -> {
                    int[] plus = Arrays.copyOf(products, products.length + 1);
                    plus[products.length] = rc.input(random.nextInt(variables));
                    extra.add(rc.sum(plus));
                }
                default -> rc.t.output("product" + r, pick);
            }
        }
        int[] kids = extra.stream().mapToInt(Integer::intValue).toArray();
        if (kids.length > 0) {
            rc.t.output("extra", rc.sum(kids));
        }
        return rc;
    }

    /**
     * Random rows: real cells around the inputs' means, discrete cells mostly in range; with probability
     * {@code missing} a cell is NaN, with probability 0.03 a discrete cell is outside its support
     * (log-density -inf), and every tenth row is entirely missing.
     */
    double[] rows(int rows, double missing) {
        double[] data = new double[rows * variables];
        for (int r = 0; r < rows; r++) {
            for (int v = 0; v < variables; v++) {
                double x;
                if (r % 10 == 9 || random.nextDouble() < missing) {
                    x = Double.NaN;
                } else if (v % 3 == 0) {
                    x = 1.5 + 2 * random.nextGaussian();
                } else if (random.nextDouble() < 0.03) {
                    x = 7;
                } else {
                    x = random.nextInt(v % 3 == 1 ? 2 : STATES);
                }
                data[r * variables + v] = x;
            }
        }
        return data;
    }

    CompiledCircuit compile() {
        return t.compile();
    }

    private void shuffle(int[] a) {
        for (int i = a.length - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int x = a[i];
            a[i] = a[j];
            a[j] = x;
        }
    }

    private int[] cuts(int n, int pieces) {
        int[] cuts = new int[pieces + 1];
        cuts[pieces] = n;
        List<Integer> points = new ArrayList<>();
        for (int i = 1; i < n; i++) {
            points.add(i);
        }
        java.util.Collections.shuffle(points, random);
        List<Integer> chosen = new ArrayList<>(points.subList(0, pieces - 1));
        java.util.Collections.sort(chosen);
        for (int q = 1; q < pieces; q++) {
            cuts[q] = chosen.get(q - 1);
        }
        return cuts;
    }
}
