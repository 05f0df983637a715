package dev.circa.validator;

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
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

/**
 * A seeded generator of random valid circuits: mixed families over mixed variable types, sums of
 * products over random splits of their scope (smooth and decomposable by construction, weights
 * and probabilities normalised), sub-circuits shared between parents, ids with gaps.
 */
final class RandomCircuits {
    private final Random rnd;
    private final List<Variable> vars = new ArrayList<>();
    private final List<Node> nodes = new ArrayList<>();
    private final Map<String, List<Integer>> byScope = new HashMap<>();
    private int nextId;
    private int branching;

    RandomCircuits(long seed) {
        this.rnd = new Random(seed);
    }

    /** A circuit over {@code nv} variables whose sums have 2..{@code branching} children. */
    CircuitDocument generate(int nv, int branching) {
        this.branching = branching;
        String[] names = {"inlet_pressure", "outlet_pressure", "motor_current", "valve", "alarm", "restarts",
            "flow_rate", "tank_level", "pump_on", "vibration"};
        for (int i = 0; i < nv; i++) {
            String name = names[i % names.length] + (i >= names.length ? "_" + i / names.length : "");
            VariableType t = VariableType.values()[rnd.nextInt(4)];
            if (t == VariableType.CATEGORICAL) {
                int k = 3 + rnd.nextInt(2);
                List<String> states = new ArrayList<>();
                for (int s = 0; s < k; s++) {
                    states.add("s" + s);
                }
                vars.add(new Variable(name, t, states, null, null));
            } else {
                vars.add(Variable.of(name, t));
            }
        }
        int[] all = new int[nv];
        for (int i = 0; i < nv; i++) {
            all[i] = i;
        }
        int root = build(all, true);
        return CircuitDocument.builder().variables(vars).nodes(nodes).outputs(List.of(new Output("joint", root))).build();
    }

    private int id() {
        int id = nextId;
        nextId += 1 + rnd.nextInt(3);
        return id;
    }

    private int add(Node n) {
        nodes.add(n);
        return n.id();
    }

    private int build(int[] scope, boolean root) {
        String key = Arrays.toString(scope);
        List<Integer> have = byScope.get(key);
        if (!root && have != null && rnd.nextDouble() < 0.4) {
            return have.get(rnd.nextInt(have.size()));
        }
        int id;
        if (scope.length == 1) {
            id = rnd.nextDouble() < 0.3 ? sum(new int[] {leaf(scope[0]), leaf(scope[0])}) : leaf(scope[0]);
        } else if (scope.length == 2 && vars.get(scope[0]).type() == VariableType.REAL
                && vars.get(scope[1]).type() == VariableType.REAL && rnd.nextDouble() < 0.5) {
            id = mvnormal(scope);
        } else if (!root && rnd.nextDouble() < 0.2) {
            id = product(scope);
        } else {
            int k = 2 + rnd.nextInt(branching - 1);
            int[] kids = new int[k];
            for (int j = 0; j < k; j++) {
                kids[j] = product(scope);
            }
            id = sum(kids);
        }
        byScope.computeIfAbsent(key, x -> new ArrayList<>()).add(id);
        return id;
    }

    private int product(int[] scope) {
        int[] s = scope.clone();
        for (int i = s.length - 1; i > 0; i--) {
            int j = rnd.nextInt(i + 1);
            int t = s[i];
            s[i] = s[j];
            s[j] = t;
        }
        int parts = Math.min(s.length, 2 + rnd.nextInt(2));
        int[] cuts = new int[parts + 1];
        cuts[parts] = s.length;
        // distinct cut points 1..len-1
        List<Integer> points = new ArrayList<>();
        for (int i = 1; i < s.length; i++) {
            points.add(i);
        }
        java.util.Collections.shuffle(points, rnd);
        List<Integer> chosen = new ArrayList<>(points.subList(0, parts - 1));
        chosen.sort(null);
        for (int i = 0; i < parts - 1; i++) {
            cuts[i + 1] = chosen.get(i);
        }
        int[] kids = new int[parts];
        for (int p = 0; p < parts; p++) {
            int[] part = Arrays.copyOfRange(s, cuts[p], cuts[p + 1]);
            Arrays.sort(part);
            kids[p] = build(part, false);
        }
        return add(new ProductNode(id(), null, kids));
    }

    private int sum(int[] kids) {
        double[] w = simplex(kids.length);
        if (rnd.nextDouble() < 0.3) {
            for (int j = 0; j < w.length; j++) {
                w[j] = Math.log(w[j]);
            }
            return add(new SumNode(id(), null, kids, w, true));
        }
        return add(new SumNode(id(), null, kids, w, false));
    }

    private double[] simplex(int k) {
        double[] w = new double[k];
        double s = 0;
        for (int j = 0; j < k; j++) {
            w[j] = 0.05 + rnd.nextDouble();
            s += w[j];
        }
        for (int j = 0; j < k; j++) {
            w[j] /= s;
        }
        return w;
    }

    private int mvnormal(int[] scope) {
        double a = 0.5 + rnd.nextDouble();
        double b = 0.5 + rnd.nextDouble();
        double c = rnd.nextDouble() * 0.4 * Math.sqrt(a * b);
        double[] p = {rnd.nextGaussian(), rnd.nextGaussian(), a, c, c, b};
        return add(new InputNode(id(), null, Family.MVNORMAL, scope.clone(), p, false));
    }

    private int leaf(int v) {
        Variable var = vars.get(v);
        int[] vs = {v};
        switch (var.type()) {
            case REAL -> {
                int f = rnd.nextInt(6);
                Family fam = new Family[] {Family.NORMAL, Family.LOGNORMAL, Family.EXPONENTIAL, Family.GAMMA,
                    Family.BETA, Family.UNIFORM}[f];
                double[] p = switch (fam) {
                    case NORMAL, LOGNORMAL -> new double[] {rnd.nextGaussian(), 0.3 + rnd.nextDouble()};
                    case EXPONENTIAL -> new double[] {0.2 + rnd.nextDouble()};
                    case UNIFORM -> {
                        double lo = rnd.nextGaussian();
                        yield new double[] {lo, lo + 0.5 + rnd.nextDouble()};
                    }
                    default -> new double[] {0.5 + 2 * rnd.nextDouble(), 0.5 + 2 * rnd.nextDouble()};
                };
                return add(new InputNode(id(), null, fam, vs, p, false));
            }
            case COUNT -> {
                if (rnd.nextBoolean()) {
                    return add(new InputNode(id(), null, Family.POISSON, vs, new double[] {0.5 + 3 * rnd.nextDouble()}, false));
                }
                return add(new InputNode(id(), null, Family.BINOMIAL, vs, new double[] {1 + rnd.nextInt(9), 0.1 + 0.8 * rnd.nextDouble()}, false));
            }
            default -> {
                int r = rnd.nextInt(3);
                if (r == 0) {
                    return add(new InputNode(id(), null, Family.INDICATOR, vs, new double[] {rnd.nextInt(var.stateCount())}, false));
                }
                if (r == 1 && var.type() == VariableType.BINARY) {
                    return add(new InputNode(id(), null, Family.BERNOULLI, vs, new double[] {0.05 + 0.9 * rnd.nextDouble()}, false));
                }
                return add(new InputNode(id(), null, Family.CATEGORICAL, vs, simplex(var.stateCount()), false));
            }
        }
    }
}
