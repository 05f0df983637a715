package dev.circa.engine;

import static dev.circa.engine.Tolerances.assertClose;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * The mixture form of the one-variable marginals against the engine's direct evaluation of a row where only
 * that variable is observed (the reference: one forward pass, no derivatives).
 */
class ExactMarginalsTest {
    private static final double[] REAL_POINTS = {-3.5, -1, -0.25, 0, 0.6, 1.9, 4.2};

    @Test
    void logDensity_regionGraphCircuits_matchesDirectEvaluation() {
        for (long seed = 1; seed <= 12; seed++) {
            boolean extremes = seed % 3 == 0;
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 3 + (int) (seed % 6), 3, 2, 1 + (int) (seed % 3), 0.3,
                    extremes);
            assertAgreesWithEvaluator(rc.t.compile(), "seed " + seed);
        }
    }

    @Test
    void logDensity_mvnormalInMixture_usesItsCoordinateNormal() {
        TestCircuits t = new TestCircuits();
        t.variable("inlet_pressure", VariableType.REAL);
        t.variable("motor_current", VariableType.REAL);
        t.variable("valve", VariableType.CATEGORICAL, "closed", "half", "open");
        int mv = t.mvnormal(new int[] {0, 1}, new double[] {2.0, -1.0}, new double[] {1.5, 0.4, 0.4, 0.8});
        int c1 = t.input(Family.CATEGORICAL, 2, 0.2, 0.3, 0.5);
        int a = t.product(mv, c1);
        int x = t.input(Family.NORMAL, 0, 0.5, 0.7);
        int y = t.input(Family.GAMMA, 1, 2.0, 1.5);
        int c2 = t.logCategorical(2, Math.log(0.6), Math.log(0.3), Math.log(0.1));
        int b = t.product(x, y, c2);
        t.output("joint", t.sum(new double[] {0.35, 0.65}, a, b));
        CompiledCircuit circuit = t.compile();
        assertAgreesWithEvaluator(circuit, "mvnormal mixture");
        ExactMarginals m = ExactMarginals.of(circuit);
        assertEquals(2, m.componentCount(0));
        assertEquals(Family.NORMAL, m.componentFamily(0, 0));
        assertEquals(Math.sqrt(1.5), m.componentParams(0, 0)[1], 0);
        assertClose(Math.log(0.35), m.componentLogWeight(0, 0, 0), "weight of the mvnormal's coordinate");
        assertClose(0, m.logPartition(0), "log Z");
    }

    @Test
    void logDensity_categoricalOfNormalisedCircuit_sumsToOne() {
        RandomCircuits rc = RandomCircuits.regionGraph(5, 6, 3, 2, 2, 0.3, false);
        CompiledCircuit circuit = rc.t.compile();
        ExactMarginals m = ExactMarginals.of(circuit);
        double[] states = {0, 1, 2};
        double[] out = new double[3];
        for (int o = 0; o < circuit.outputCount(); o++) {
            for (int v = 0; v < circuit.variableCount(); v++) {
                if (circuit.variables().get(v).type() != VariableType.CATEGORICAL) {
                    continue;
                }
                m.logDensity(o, v, states, 3, out);
                double total = 0;
                for (double lp : out) {
                    total += Math.exp(lp - m.logPartition(o));
                }
                assertEquals(1, total, 1e-12, "categorical marginal of variable " + v + " sums to 1");
            }
        }
    }

    @Test
    void inScope_variableOutsideTheOutput_isFalse() {
        TestCircuits t = new TestCircuits();
        t.variable("inlet_pressure", VariableType.REAL);
        t.variable("alarm", VariableType.BINARY);
        int x = t.input(Family.NORMAL, 0, 0, 1);
        int z = t.input(Family.BERNOULLI, 1, 0.2);
        t.output("pressure", x);
        t.output("joint", t.product(x, z));
        ExactMarginals m = ExactMarginals.of(t.compile());
        assertTrue(m.inScope(0, 0));
        assertFalse(m.inScope(0, 1));
        assertTrue(m.inScope(1, 1));
    }

    private static double[] points(CompiledCircuit circuit, int v) {
        return switch (circuit.variables().get(v).type()) {
            case REAL -> REAL_POINTS;
            case BINARY -> new double[] {0, 1};
            case CATEGORICAL -> new double[] {0, 1, 2};
            case COUNT -> new double[] {0, 1, 2, 5, 9};
        };
    }

    @Test
    void pairLogDensity_regionGraphAndMvnormalCircuits_matchesDirectEvaluation() {
        for (long seed = 1; seed <= 6; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 3 + (int) (seed % 4), 3, 2, 1 + (int) (seed % 2), 0.3,
                    seed % 3 == 0);
            CompiledCircuit c = rc.t.compile();
            assertPairsAgree(c, 0, 1, "seed " + seed);
            assertPairsAgree(c, c.variableCount() - 1, 0, "seed " + seed);
        }
        TestCircuits t = new TestCircuits();
        t.variable("inlet_pressure", VariableType.REAL);
        t.variable("motor_current", VariableType.REAL);
        t.variable("flow", VariableType.REAL);
        int mv = t.mvnormal(new int[] {0, 1, 2}, new double[] {2.0, -1.0, 0.5},
                new double[] {1.5, 0.4, 0.1, 0.4, 0.8, -0.2, 0.1, -0.2, 1.1});
        int x = t.input(Family.NORMAL, 0, 0.5, 0.7);
        int y = t.input(Family.GAMMA, 1, 2.0, 1.5);
        int z = t.input(Family.LOGNORMAL, 2, 0.1, 0.4);
        t.output("joint", t.sum(new double[] {0.35, 0.65}, mv, t.product(x, y, z)));
        CompiledCircuit c = t.compile();
        assertPairsAgree(c, 0, 1, "mvnormal over both");
        assertPairsAgree(c, 2, 0, "mvnormal over both, reversed");
    }

    private static void assertPairsAgree(CompiledCircuit circuit, int a, int b, String what) {
        ExactMarginals m = ExactMarginals.of(circuit);
        Evaluator evaluator = new Evaluator(circuit, Evaluator.Mode.GENERIC);
        int nv = circuit.variableCount();
        int no = circuit.outputCount();
        double[] xa = points(circuit, a);
        double[] xb = points(circuit, b);
        int rows = xa.length * xb.length;
        double[] data = new double[rows * nv];
        Arrays.fill(data, Double.NaN);
        for (int i = 0; i < xa.length; i++) {
            for (int j = 0; j < xb.length; j++) {
                data[(i * xb.length + j) * nv + a] = xa[i];
                data[(i * xb.length + j) * nv + b] = xb[j];
            }
        }
        double[] direct = new double[rows * no];
        evaluator.logDensity(data, rows, direct);
        double[] pair = new double[rows * no];
        m.pairLogDensity(a, xa, xa.length, b, xb, xb.length, pair);
        for (int k = 0; k < rows * no; k++) {
            assertClose(direct[k], pair[k], what + ": pair (" + a + ", " + b + ") entry " + k);
        }
    }

    private static void assertAgreesWithEvaluator(CompiledCircuit circuit, String what) {
        ExactMarginals m = ExactMarginals.of(circuit);
        Evaluator evaluator = new Evaluator(circuit, Evaluator.Mode.GENERIC);
        int nv = circuit.variableCount();
        int no = circuit.outputCount();
        double[] z = evaluator.logPartition();
        for (int o = 0; o < no; o++) {
            assertClose(z[o], m.logPartition(o), what + ": log Z of output " + o);
        }
        for (int v = 0; v < nv; v++) {
            double[] points = switch (circuit.variables().get(v).type()) {
                case REAL -> REAL_POINTS;
                case BINARY -> new double[] {0, 1};
                case CATEGORICAL -> new double[] {0, 1, 2};
                case COUNT -> new double[] {0, 1, 2, 5, 9};
            };
            double[] rows = new double[points.length * nv];
            Arrays.fill(rows, Double.NaN);
            for (int r = 0; r < points.length; r++) {
                rows[r * nv + v] = points[r];
            }
            double[] direct = new double[points.length * no];
            evaluator.logDensity(rows, points.length, direct);
            double[] mixture = new double[points.length];
            for (int o = 0; o < no; o++) {
                m.logDensity(o, v, points, points.length, mixture);
                for (int r = 0; r < points.length; r++) {
                    assertClose(direct[r * no + o], mixture[r], what + ": output " + o + ", variable " + v
                            + " at " + points[r]);
                }
            }
        }
    }
}
