package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.PoissonDistribution;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/** Values by name on a circuit with every variable type: labels, indices, booleans, counts, errors. */
class RowTest {
    private static Model model;

    @BeforeAll
    static void load() throws Exception {
        model = Fixtures.load(Model.loader(), Fixtures.DETERMINISTIC);
    }

    /** The joint of the deterministic circuit by hand, from commons-math3 3.6.1 densities. */
    private static double joint(double x, int valve, int alarm, int restarts) {
        if (valve == 0) {
            return 0.3 * new NormalDistribution(2.2, 0.5).density(x) * (alarm == 1 ? 0.7 : 0.3)
                    * new PoissonDistribution(2.5).probability(restarts);
        }
        if (valve == 2) {
            return 0.7 * new NormalDistribution(3.1, 0.2).density(x) * (alarm == 1 ? 0.1 : 0.9)
                    * new PoissonDistribution(0.5).probability(restarts);
        }
        return 0;
    }

    @Test
    void set_labelIndexAndBoolean_sameCells() {
        // source: commons-math3 3.6.1 NormalDistribution and PoissonDistribution
        double expected = Math.log(joint(3.0, 2, 1, 1));
        assertEquals(expected, model.logDensity(Map.of("inlet_pressure", 3.0, "valve", "open", "alarm", 1, "restarts", 1)), 1e-12);
        assertEquals(expected, model.logDensity(Map.of("inlet_pressure", 3.0, "valve", 2, "alarm", true, "restarts", 1L)), 1e-12);
        Row row = model.newRow().set("inlet_pressure", 3.0).set("valve", "open").set("alarm", (Object) Boolean.TRUE)
                .set("restarts", 1);
        assertEquals(expected, model.logDensity(row), 1e-12);
        assertEquals("open", row.value("valve"));
        assertEquals(1L, row.value("restarts"));
        assertEquals(1, row.value("alarm"));
        assertEquals(3.0, row.value("inlet_pressure"));
        assertEquals(2.0, row.get("valve"));
    }

    @Test
    void logDensity_valveHalf_minusInfinity() {
        // no component puts mass on "half" (indicators of closed and open)
        assertEquals(Double.NEGATIVE_INFINITY, model.logDensity(Map.of("valve", "half")));
    }

    @Test
    void set_nullOrNaN_missing() {
        Row row = model.newRow().set("inlet_pressure", 2.0).set("inlet_pressure", Double.NaN);
        assertTrue(row.isMissing("inlet_pressure"));
        row.set("valve", "open").set("valve", (String) null);
        assertTrue(row.isMissing("valve"));
        assertNull(row.value("valve"));
        // every variable missing: the total mass, 1 for this normalised circuit (common practice)
        assertEquals(0.0, model.logDensity(row), 1e-15);
    }

    @Test
    void set_badValues_messagesNameVariableAndExpectation() {
        Row row = model.newRow();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> row.set("valve", "opn"));
        assertTrue(e.getMessage().contains("valve") && e.getMessage().contains("closed, half, open"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> row.set("valve", 3));
        assertThrows(IllegalArgumentException.class, () -> row.set("valve", 1.5));
        assertThrows(IllegalArgumentException.class, () -> row.set("restarts", -1));
        assertThrows(IllegalArgumentException.class, () -> row.set("restarts", 0.5));
        assertThrows(IllegalArgumentException.class, () -> row.set("alarm", 2));
        assertThrows(IllegalArgumentException.class, () -> row.set("inlet_pressure", Double.POSITIVE_INFINITY));
        assertThrows(IllegalArgumentException.class, () -> row.set("inlet_pressure", "high"));
        assertThrows(IllegalArgumentException.class, () -> row.set("inlet_pressure", (Object) List.of()));
        e = assertThrows(IllegalArgumentException.class, () -> row.set("pressure", 1.0));
        assertTrue(e.getMessage().contains("\"pressure\" is not a variable"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> model.logDensity(Map.of("pressure", 1.0)));
        assertTrue(e.getMessage().contains("\"pressure\""), e.getMessage());
    }

    @Test
    void conditional_variableInQueryAndEvidence_refused() {
        assertThrows(IllegalArgumentException.class,
                () -> model.conditional(Map.of("valve", "open"), Map.of("valve", "open")));
    }

    @Test
    void rowOfAnotherModel_refused() throws Exception {
        Row foreign = Model.load(Fixtures.PUMP_STATION).newRow();
        assertThrows(IllegalArgumentException.class, () -> model.logDensity(foreign));
    }

    @Test
    void impute_deterministicCircuit_exactArgmaxOfEnumeratedJoint() {
        // exhaustive search over valve, alarm and restarts 0..30 with commons-math3 densities
        for (double x : new double[] {2.0, 2.6, 2.8, 3.3}) {
            double best = -1;
            int[] arg = null;
            for (int valve = 0; valve < 3; valve++) {
                for (int alarm = 0; alarm < 2; alarm++) {
                    for (int k = 0; k <= 30; k++) {
                        double p = joint(x, valve, alarm, k);
                        if (p > best) {
                            best = p;
                            arg = new int[] {valve, alarm, k};
                        }
                    }
                }
            }
            Imputation imp = model.impute(Map.of("inlet_pressure", x));
            assertTrue(imp.exact());
            assertEquals(List.of("closed", "half", "open").get(arg[0]), imp.values().get("valve"), "x = " + x);
            assertEquals(arg[1], imp.values().get("alarm"), "x = " + x);
            assertEquals((long) arg[2], imp.values().get("restarts"), "x = " + x);
            assertEquals(Math.log(best), imp.logValue(), 1e-12);
            Row filled = model.newRow();
            assertEquals(imp.logValue(), model.impute(model.newRow().set("inlet_pressure", x), 0, filled));
            assertEquals(imp.values(), filled.toMap());
        }
    }

    @Test
    void sample_sameSeed_sameRowsAnySplit_meanNearMixtureMean() {
        List<Map<String, Object>> a = model.sample(7, 4000);
        assertEquals(a, model.sample(7, 4000));
        double[] tail = new double[1000 * model.variableCount()];
        model.sample(0, 7, 3000, 1000, tail);
        for (int r = 0; r < 1000; r++) {
            assertEquals(a.get(3000 + r), model.decode(tail, r));
        }
        // mixture mean 0.3 * 2.2 + 0.7 * 3.1 = 2.83 (common practice); sd of the mean < 0.008, bound 5 sd
        double sum = 0;
        for (Map<String, Object> row : a) {
            sum += (Double) row.get("inlet_pressure");
        }
        assertEquals(2.83, sum / a.size(), 0.04);
        Map<String, Object> first = new LinkedHashMap<>(a.get(0));
        assertEquals(List.of("inlet_pressure", "valve", "alarm", "restarts"), List.copyOf(first.keySet()));
    }
}
