package dev.circa.validator.regression;

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
import org.apache.commons.math3.distribution.MixtureMultivariateNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.random.Well19937c;
import org.apache.commons.math3.util.Pair;

/**
 * A three-component Gaussian mixture over inlet and outlet pressure (diagonal covariances), as a
 * circuit (sum of products of normals) and as commons-math3 distributions for reference values.
 */
final class GaussianMixtureFixture {
    static final double[] WEIGHTS = {0.55, 0.3, 0.15};
    static final double[][] MEANS = {{3.1, 5.0}, {2.2, 4.1}, {1.3, 2.9}};
    static final double[][] SDS = {{0.2, 0.3}, {0.5, 0.4}, {0.35, 0.8}};

    private GaussianMixtureFixture() {
    }

    static List<Variable> variables() {
        return List.of(new Variable("inlet_pressure", VariableType.REAL, null, "bar", null),
                new Variable("outlet_pressure", VariableType.REAL, null, "bar", null));
    }

    /** The circuit; with {@code float32} every weight and parameter is rounded through {@code (float)}. */
    static CircuitDocument circuit(boolean float32) {
        List<Node> nodes = new ArrayList<>();
        int[] products = new int[WEIGHTS.length];
        double[] w = new double[WEIGHTS.length];
        int id = 0;
        for (int k = 0; k < WEIGHTS.length; k++) {
            int a = id++;
            nodes.add(new InputNode(a, null, Family.NORMAL, new int[] {0}, new double[] {r(MEANS[k][0], float32), r(SDS[k][0], float32)}, false));
            int b = id++;
            nodes.add(new InputNode(b, null, Family.NORMAL, new int[] {1}, new double[] {r(MEANS[k][1], float32), r(SDS[k][1], float32)}, false));
            products[k] = id++;
            nodes.add(new ProductNode(products[k], "regime " + k, new int[] {a, b}));
            w[k] = r(WEIGHTS[k], float32);
        }
        int root = id;
        nodes.add(new SumNode(root, null, products, w, false));
        return CircuitDocument.builder().name("pump-pressures").variables(variables()).nodes(nodes)
                .outputs(List.of(new Output("joint", root))).build();
    }

    private static double r(double x, boolean float32) {
        return float32 ? (double) (float) x : x;
    }

    /** The same mixture in commons-math3. */
    static MixtureMultivariateNormalDistribution reference(long seed) {
        List<Pair<Double, MultivariateNormalDistribution>> comps = new ArrayList<>();
        for (int k = 0; k < WEIGHTS.length; k++) {
            double[][] cov = {{SDS[k][0] * SDS[k][0], 0}, {0, SDS[k][1] * SDS[k][1]}};
            comps.add(new Pair<>(WEIGHTS[k], new MultivariateNormalDistribution(MEANS[k], cov)));
        }
        MixtureMultivariateNormalDistribution m = new MixtureMultivariateNormalDistribution(new Well19937c(seed), comps);
        m.reseedRandomGenerator(seed);
        return m;
    }

    /** The log of the marginal density of variable {@code v} alone (a mixture of commons-math3 normals). */
    static double marginalLogDensity(int v, double x) {
        double s = 0;
        for (int k = 0; k < WEIGHTS.length; k++) {
            s += WEIGHTS[k] * new NormalDistribution(null, MEANS[k][v], SDS[k][v]).density(x);
        }
        return Math.log(s);
    }
}
