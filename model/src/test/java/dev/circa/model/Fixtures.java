package dev.circa.model;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.apache.commons.math3.distribution.NormalDistribution;

/** Paths of the repository's fixtures and small circuits written inline for the tests. */
final class Fixtures {
    /** The FORMAT.md section 2 example circuit (pump station). */
    static final Path PUMP_STATION = Path.of("..", "fixtures", "circuits", "pump-station.json");
    /** A product of two inputs of the same variable: not decomposable. */
    static final Path NOT_DECOMPOSABLE = Path.of("..", "fixtures", "circuits", "not-decomposable.json");
    /** FORMAT.md section 5: SciPy 1.10, log p(inlet_pressure = 3.0, valve = open) of the example circuit. */
    static final double SCIPY_FULL = 0.18261296103078395;
    /** FORMAT.md section 5: SciPy 1.10, log p(inlet_pressure = 2.1) of the example circuit, valve missing. */
    static final double SCIPY_MARGINAL = -2.1428574782131147;

    private Fixtures() {
    }

    /**
     * p(x, valve = state), or p(x) for state -1, of the example circuit by hand from commons-math3 3.6.1
     * normal densities and the example's weights and probabilities.
     */
    static double exampleDensity(double x, int state) {
        double a = new NormalDistribution(3.1, 0.2).density(x);
        double b = new NormalDistribution(2.2, 0.5).density(x);
        double[] pa = {0.05, 0.15, 0.80};
        double[] pb = {0.6, 0.3, 0.1};
        return state < 0 ? 0.85 * a + 0.15 * b : 0.85 * a * pa[state] + 0.15 * b * pb[state];
    }

    /** Loads a circuit given as JSON text through the stream entry point. */
    static Model load(ModelLoader loader, String json) throws ModelException {
        return loader.load(new ByteArrayInputStream(json.getBytes(StandardCharsets.UTF_8)), "inline.json");
    }

    /** A sum over two products, each an indicator of the valve and a normal of the pressure: deterministic. */
    static final String DETERMINISTIC = """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "inlet_pressure", "type": "real"},
                           {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]},
                           {"name": "alarm", "type": "binary"},
                           {"name": "restarts", "type": "count"}],
             "nodes": [
               {"id": 0, "input": "indicator", "var": 1, "value": 0},
               {"id": 1, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
               {"id": 2, "input": "bernoulli", "var": 2, "p": 0.7},
               {"id": 3, "input": "poisson", "var": 3, "rate": 2.5},
               {"id": 4, "product": [0, 1, 2, 3]},
               {"id": 5, "input": "indicator", "var": 1, "value": 2},
               {"id": 6, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
               {"id": 7, "input": "bernoulli", "var": 2, "p": 0.1},
               {"id": 8, "input": "poisson", "var": 3, "rate": 0.5},
               {"id": 9, "product": [5, 6, 7, 8]},
               {"id": 10, "sum": [4, 9], "weights": [0.3, 0.7]}
             ],
             "outputs": [{"name": "joint", "node": 10}]}
            """;
}
