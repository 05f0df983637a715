package dev.circa.engine;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/** Builds small circuit documents in code for the engine tests. */
final class TestCircuits {
    private final List<Variable> variables = new ArrayList<>();
    private final List<Node> nodes = new ArrayList<>();
    private final List<Output> outputs = new ArrayList<>();

    TestCircuits variable(String name, VariableType type, String... states) {
        variables.add(new Variable(name, type, List.of(states), null, null));
        return this;
    }

    private int nextId() {
        return nodes.size();
    }

    int input(Family family, int var, double... params) {
        int id = nextId();
        nodes.add(new InputNode(id, null, family, new int[] {var}, params, false));
        return id;
    }

    int logCategorical(int var, double... logProbs) {
        int id = nextId();
        nodes.add(new InputNode(id, null, Family.CATEGORICAL, new int[] {var}, logProbs, true));
        return id;
    }

    int mvnormal(int[] vars, double[] mean, double[] cov) {
        double[] p = new double[mean.length + cov.length];
        System.arraycopy(mean, 0, p, 0, mean.length);
        System.arraycopy(cov, 0, p, mean.length, cov.length);
        int id = nextId();
        nodes.add(new InputNode(id, null, Family.MVNORMAL, vars, p, false));
        return id;
    }

    int product(int... children) {
        int id = nextId();
        nodes.add(new ProductNode(id, null, children));
        return id;
    }

    int sum(double[] weights, int... children) {
        int id = nextId();
        nodes.add(new SumNode(id, null, children, weights, false));
        return id;
    }

    int logSum(double[] logWeights, int... children) {
        int id = nextId();
        nodes.add(new SumNode(id, null, children, logWeights, true));
        return id;
    }

    TestCircuits output(String name, int node) {
        outputs.add(new Output(name, node));
        return this;
    }

    List<Node> nodes() {
        return nodes;
    }

    CircuitDocument document() {
        return CircuitDocument.builder().variables(List.copyOf(variables)).nodes(List.copyOf(nodes))
                .outputs(List.copyOf(outputs)).build();
    }

    CompiledCircuit compile() {
        try {
            return CompiledCircuit.compile(document());
        } catch (CompileException e) {
            throw new AssertionError(e.getMessage(), e);
        }
    }

    /** Random positive weights summing to 1. */
    static double[] simplex(Random random, int k) {
        double[] w = new double[k];
        double total = 0;
        for (int i = 0; i < k; i++) {
            w[i] = 0.05 + random.nextDouble();
            total += w[i];
        }
        for (int i = 0; i < k; i++) {
            w[i] /= total;
        }
        return w;
    }

    /**
     * A random smooth, decomposable circuit over a (binary), b (3 states), c (count, binomial with 2
     * trials), d (binary): a mixture of products of two mixtures of products of inputs. With
     * {@code scale}, every sum's weights are multiplied by random factors in [0.5, 2.5), so the
     * circuit is not normalised.
     */
    static TestCircuits randomDiscrete(long seed, boolean scale) {
        Random random = new Random(seed);
        TestCircuits t = new TestCircuits()
                .variable("alarm", VariableType.BINARY)
                .variable("valve", VariableType.CATEGORICAL, "closed", "half", "open")
                .variable("restarts", VariableType.COUNT)
                .variable("leak", VariableType.BINARY);
        int k = 3;
        int[] roots = new int[k];
        for (int r = 0; r < k; r++) {
            int[] left = new int[2];
            int[] right = new int[2];
            for (int j = 0; j < 2; j++) {
                left[j] = t.product(t.leafA(random), t.leafB(random));
                right[j] = t.product(t.input(Family.BINOMIAL, 2, 2, 0.1 + 0.8 * random.nextDouble()), t.leafA3(random));
            }
            int l = t.weighted(random, scale, left);
            int rr = t.weighted(random, scale, right);
            roots[r] = t.product(l, rr);
        }
        t.output("joint", t.weighted(random, scale, roots));
        return t;
    }

    private int weighted(Random random, boolean scale, int... children) {
        double[] w = simplex(random, children.length);
        if (!scale) {
            return sum(w, children);
        }
        double[] lw = new double[w.length];
        for (int j = 0; j < w.length; j++) {
            lw[j] = Math.log(w[j] * (0.5 + 2 * random.nextDouble()));
        }
        return logSum(lw, children);
    }

    private int leafA(Random random) {
        return switch (random.nextInt(3)) {
            case 0 -> input(Family.BERNOULLI, 0, 0.1 + 0.8 * random.nextDouble());
            case 1 -> input(Family.CATEGORICAL, 0, simplex(random, 2));
            default -> input(Family.INDICATOR, 0, random.nextInt(2));
        };
    }

    private int leafA3(Random random) {
        return random.nextBoolean() ? input(Family.BERNOULLI, 3, 0.1 + 0.8 * random.nextDouble())
                : input(Family.INDICATOR, 3, random.nextInt(2));
    }

    private int leafB(Random random) {
        double[] p = simplex(random, 3);
        return switch (random.nextInt(3)) {
            case 0 -> input(Family.CATEGORICAL, 1, p);
            case 1 -> logCategorical(1, Math.log(p[0]), Math.log(p[1]), Math.log(p[2]));
            default -> input(Family.INDICATOR, 1, random.nextInt(3));
        };
    }

    /** Number of values of each variable of {@link #randomDiscrete} (the count has 0..2). */
    static final int[] DISCRETE_SIZES = {2, 3, 3, 2};

    /** Every complete assignment of {@link #randomDiscrete}, row-major. */
    static double[] allAssignments() {
        int total = 1;
        for (int s : DISCRETE_SIZES) {
            total *= s;
        }
        double[] rows = new double[total * DISCRETE_SIZES.length];
        for (int a = 0; a < total; a++) {
            int rest = a;
            for (int v = DISCRETE_SIZES.length - 1; v >= 0; v--) {
                rows[a * DISCRETE_SIZES.length + v] = rest % DISCRETE_SIZES[v];
                rest /= DISCRETE_SIZES[v];
            }
        }
        return rows;
    }
}
