package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.Map;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The FORMAT.md example circuit (fixtures/circuits/pump-station.json) scored through the model API,
 * against the two SciPy 1.10 values of FORMAT.md and against densities from commons-math3 3.6.1.
 */
class FormatExampleTest {
    private static final double TOL = 1e-12;
    private static Model model;

    @BeforeAll
    static void load() throws Exception {
        model = Model.load(Fixtures.PUMP_STATION);
    }

    @Test
    void logDensity_mapByLabel_equalsScipyValue() {
        // source: FORMAT.md, SciPy 1.10
        assertEquals(Fixtures.SCIPY_FULL, model.logDensity(Map.of("inlet_pressure", 3.0, "valve", "open")), TOL);
    }

    @Test
    void logDensity_mapByStateIndex_equalsScipyValue() {
        // source: FORMAT.md, SciPy 1.10 (state index 2 is "open")
        assertEquals(Fixtures.SCIPY_FULL, model.logDensity(Map.of("inlet_pressure", 3.0, "valve", 2)), TOL);
    }

    @Test
    void logDensity_valveAbsentOrNull_equalsScipyMarginal() {
        // source: FORMAT.md, SciPy 1.10
        assertEquals(Fixtures.SCIPY_MARGINAL, model.logDensity(Map.of("inlet_pressure", 2.1)), TOL);
        Map<String, Object> withNull = new HashMap<>();
        withNull.put("inlet_pressure", 2.1);
        withNull.put("valve", null);
        assertEquals(Fixtures.SCIPY_MARGINAL, model.logDensity(withNull), TOL);
    }

    @Test
    void logDensity_reusedRow_equalsScipyValues() {
        // source: FORMAT.md, SciPy 1.10
        Row row = model.newRow();
        assertEquals(Fixtures.SCIPY_FULL, model.logDensity(row.set("inlet_pressure", 3.0).set("valve", "open")), TOL);
        assertEquals(Fixtures.SCIPY_MARGINAL, model.logDensity(row.clear().set("inlet_pressure", 2.1)), TOL);
        assertEquals(Fixtures.SCIPY_MARGINAL, model.logDensity(row.clear().set("inlet_pressure", 2.1), 0), TOL);
        double[] all = new double[1];
        model.logDensities(row, all);
        assertEquals(Fixtures.SCIPY_MARGINAL, all[0], TOL);
    }

    @Test
    void logDensity_batchEncodedByName_equalsScipyValues() {
        // source: FORMAT.md, SciPy 1.10
        double[] data = new double[2 * model.variableCount()];
        model.encode(Map.of("inlet_pressure", 3.0, "valve", "open"), data, 0);
        model.encode(Map.of("inlet_pressure", 2.1), data, 1);
        double[] out = new double[2];
        model.logDensity(data, 2, out);
        assertEquals(Fixtures.SCIPY_FULL, out[0], TOL);
        assertEquals(Fixtures.SCIPY_MARGINAL, out[1], TOL);
        double[] chosen = new double[2];
        model.logDensity(data, 2, model.outputIndex("joint"), chosen);
        assertEquals(out[0], chosen[0]);
        assertEquals(out[1], chosen[1]);
    }

    @Test
    void conditional_valveGivenPressure_equalsRatioOfCommonsMathDensities() {
        // source: commons-math3 3.6.1 NormalDistribution densities, weighted as in the example circuit
        for (int state = 0; state < 3; state++) {
            double expected = Math.log(Fixtures.exampleDensity(3.0, state) / Fixtures.exampleDensity(3.0, -1));
            assertEquals(expected, model.conditional(Map.of("valve", state), Map.of("inlet_pressure", 3.0)), TOL);
            Row query = model.newRow().set("valve", (double) state);
            Row evidence = model.newRow().set("inlet_pressure", 3.0);
            assertEquals(expected, model.conditional(query, evidence), TOL);
        }
        double[] data = new double[2];
        model.encode(Map.of("inlet_pressure", 3.0, "valve", "half"), data, 0);
        double[] out = new double[1];
        model.conditional(data, 1, model.evidenceMask("inlet_pressure"), out);
        assertEquals(Math.log(Fixtures.exampleDensity(3.0, 1) / Fixtures.exampleDensity(3.0, -1)), out[0], TOL);
    }

    @Test
    void conditional_pressureGivenValve_equalsCommonsMathMixture() {
        // source: commons-math3 3.6.1; p(x | open) = p(x, open) / p(open), p(open) = 0.85 * 0.8 + 0.15 * 0.1
        double expected = Math.log(Fixtures.exampleDensity(2.7, 2) / (0.85 * 0.8 + 0.15 * 0.1));
        assertEquals(expected, model.conditional(Map.of("inlet_pressure", 2.7), Map.of("valve", "open")), TOL);
    }

    @Test
    void logPartition_normalizedExample_isZero() {
        // the example's weights and probabilities add to 1 and its inputs are normalised (common practice)
        assertEquals(0.0, model.logPartition(), 1e-15);
        assertTrue(model.normalized());
        assertFalse(model.mpeExact());
    }

    @Test
    void impute_valveMissing_isArgmaxOfCommonsMathJointAndSaysApproximate() {
        // max-product at inlet_pressure = 2.0: the larger of the six weighted terms picks the valve state;
        // densities from commons-math3 3.6.1
        double a = new NormalDistribution(3.1, 0.2).density(2.0);
        double b = new NormalDistribution(2.2, 0.5).density(2.0);
        double[] terms = {0.85 * a * 0.05, 0.85 * a * 0.15, 0.85 * a * 0.80, 0.15 * b * 0.6, 0.15 * b * 0.3, 0.15 * b * 0.1};
        int best = 0;
        for (int t = 1; t < terms.length; t++) {
            best = terms[t] > terms[best] ? t : best;
        }
        String[] labels = {"closed", "half", "open"};
        Imputation imp = model.impute(Map.of("inlet_pressure", 2.0));
        assertEquals(labels[best % 3], imp.values().get("valve"));
        assertEquals(2.0, imp.values().get("inlet_pressure"));
        assertEquals(Math.log(terms[best]), imp.logValue(), TOL);
        assertFalse(imp.exact());
    }
}
