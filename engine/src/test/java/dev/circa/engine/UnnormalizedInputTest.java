package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import org.junit.jupiter.api.Test;

class UnnormalizedInputTest {
    private static final String UNNORMALIZED = """
        {"format": "circa.circuit", "version": "1.0",
         "variables": [{"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]},
                       {"name": "alarm", "type": "binary"}],
         "nodes": [{"id": 0, "input": "categorical", "var": 0, "probs": [0.2, 0.5, 0.9]},
                   {"id": 1, "input": "categorical", "var": 0, "logProbs": [-1.0, 0.5, 0.25]},
                   {"id": 2, "input": "bernoulli", "var": 1, "p": 0.3},
                   {"id": 3, "product": [0, 2]},
                   {"id": 4, "product": [1, 2]},
                   {"id": 5, "sum": [3, 4], "weights": [0.4, 0.6]}],
         "outputs": [{"name": "joint", "node": 5}]}
        """;

    @Test
    void missingVariable_unnormalizedCategorical_valueIsItsTotalMass() throws Exception {
        CircuitDocument doc = new CircuitReader().readString(UNNORMALIZED, "inline");
        Evaluator ev = new Evaluator(CompiledCircuit.compile(doc));
        // FORMAT.md: an input over a missing variable takes its integral; for a categorical that is the sum of
        // its probabilities. Brute force over the three states (common practice).
        double z = 0.4 * (0.2 + 0.5 + 0.9) + 0.6 * (Math.exp(-1.0) + Math.exp(0.5) + Math.exp(0.25));
        assertEquals(Math.log(z), ev.logPartition()[0], 1e-14);
        double[] out = new double[1];
        ev.logDensity(new double[] {Double.NaN, 1}, 1, out);
        assertEquals(Math.log(z * 0.3), out[0], 1e-14);
        double sum = 0;
        for (int s = 0; s < 3; s++) {
            ev.logDensity(new double[] {s, Double.NaN}, 1, out);
            sum += Math.exp(out[0]);
        }
        assertEquals(z, sum, 1e-14);
    }
}
