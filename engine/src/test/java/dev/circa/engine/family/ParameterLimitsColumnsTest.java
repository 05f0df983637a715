package dev.circa.engine.family;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.NodeTable;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The check read from the node columns ({@link ParameterLimits#holds(NodeTable, int, int)}, used by the engine's
 * compiler and the validator's parameter analysis) says what the record check says: every parameter finite and
 * {@link ParameterLimits#holds(Family, double[], int)}, the owner of the limits.
 */
class ParameterLimitsColumnsTest {
    /** Values at and around every limit's edges, and the non-finite ones. */
    private static final double[] EDGES = {0, -0.0, 1, -1, 0.5, 2, 3, 1e-300, -1e-300, 1.5, 9.007199254740992E15,
        9.007199254740994E15, Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY};

    @Test
    void columns_sameVerdictAsTheRecordCheck_everyFamilyAndEdge() {
        Random rnd = new Random(23);
        List<Node> nodes = new ArrayList<>();
        List<double[]> params = new ArrayList<>();
        for (Family f : Family.values()) {
            if (f == Family.CATEGORICAL || f == Family.MVNORMAL) {
                continue;
            }
            int n = f.parameters().size();
            for (int round = 0; round < 400; round++) {
                double[] p = new double[n];
                for (int k = 0; k < n; k++) {
                    p[k] = rnd.nextBoolean() ? EDGES[rnd.nextInt(EDGES.length)] : rnd.nextGaussian() * 3;
                }
                nodes.add(new InputNode(nodes.size(), null, f, new int[] {0}, p, false));
                params.add(p);
            }
        }
        NodeTable t = NodeTable.of(nodes);
        int held = 0;
        for (int i = 0; i < t.size(); i++) {
            double[] p = params.get(i);
            boolean finite = true;
            for (double x : p) {
                finite &= Double.isFinite(x);
            }
            Family f = t.family(i);
            boolean want = finite && ParameterLimits.holds(f, p, 3);
            assertEquals(want, ParameterLimits.holds(t, i, 3), () -> f + " " + java.util.Arrays.toString(p));
            held += want ? 1 : 0;
        }
        assertEquals(true, held > 100 && held < t.size() - 100, "both verdicts met often: " + held);
    }

    @Test
    void columns_otherNumberOfParametersOrCategorical_notHeld() {
        NodeTable t = NodeTable.of(List.of(
                new InputNode(0, null, Family.NORMAL, new int[] {0}, new double[] {0.5}, false),
                new InputNode(1, null, Family.NORMAL, new int[] {0}, new double[] {0.5, 1, 2}, false),
                new InputNode(2, null, Family.CATEGORICAL, new int[] {0}, new double[] {0.5, 0.5}, false)));
        for (int i = 0; i < t.size(); i++) {
            assertFalse(ParameterLimits.holds(t, i, 3));
        }
    }
}
