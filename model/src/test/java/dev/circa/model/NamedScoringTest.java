package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.GridRegions;
import dev.circa.converter.regions.RandomRegions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.engine.Evaluator;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;

/**
 * Scoring a row by name adds nothing to the engine: a Map and a Row give, bit for bit, what the raw call
 * {@code new Evaluator(circuit).logDensity(cells, 1, out)} gives on the same cells (the engine's values are
 * checked against SciPy and commons-math3 in FormatExampleTest, RowTest and OldFaithfulTest); and names
 * are refused with the same messages as ever, also names and labels whose hash codes collide.
 */
class NamedScoringTest {
    /**
     * Variables and labels named so that hash codes collide: "Aa" and "BB" hash alike, and so do "AaAa",
     * "AaBB", "BBAa", "BBBB" (String.hashCode is polynomial in the characters; common practice).
     */
    private static final String COLLIDING = """
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "Aa", "type": "real"},
                           {"name": "BB", "type": "real"},
                           {"name": "AaAa", "type": "categorical", "states": ["AaBB", "BBAa", "BBBB"]},
                           {"name": "BBBB", "type": "count"}],
             "nodes": [
               {"id": 0, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
               {"id": 1, "input": "normal", "var": 1, "mean": 3.0, "sd": 1.5},
               {"id": 2, "input": "categorical", "var": 2, "probs": [0.2, 0.3, 0.5]},
               {"id": 3, "input": "poisson", "var": 3, "rate": 2.5},
               {"id": 4, "product": [0, 1, 2, 3]},
               {"id": 5, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
               {"id": 6, "input": "normal", "var": 1, "mean": 2.0, "sd": 0.7},
               {"id": 7, "input": "categorical", "var": 2, "probs": [0.6, 0.1, 0.3]},
               {"id": 8, "input": "poisson", "var": 3, "rate": 0.5},
               {"id": 9, "product": [5, 6, 7, 8]},
               {"id": 10, "sum": [4, 9], "weights": [0.3, 0.7]}
             ],
             "outputs": [{"name": "joint", "node": 10}]}
            """;

    @Test
    void logDensity_mapAndRow_bitIdenticalToRawEngineCall() throws Exception {
        List<Model> models = new ArrayList<>();
        models.add(Model.load(Fixtures.PUMP_STATION));
        models.add(Fixtures.load(Model.loader(), Fixtures.DETERMINISTIC));
        models.add(Fixtures.load(Model.loader(), COLLIDING));
        // dense blocks: a grid region graph; every variable type: a random region graph of mixed variables
        models.add(Model.loader().load(RegionCompiler.compile(GridRegions.generate(3, 3),
                new CompileOptions(3, 3, 1, Map.of()), 1L)));
        models.add(Model.loader().load(RegionCompiler.compile(RandomRegions.generate(mixed(), 2, 2, 1L),
                new CompileOptions(3, 3, 2, Map.of()), 1L)));
        for (Model m : models) {
            Evaluator raw = new Evaluator(m.circuit());
            int nv = m.variableCount();
            int no = m.outputCount();
            double[] expected = new double[no];
            double[] got = new double[no];
            Row row = m.newRow();
            SplittableRandom rnd = new SplittableRandom(12);
            for (int k = 0; k < 400; k++) {
                double[] cells = new double[nv];
                Map<String, Object> byLabel = new HashMap<>();
                Map<String, Object> byIndex = new TreeMap<>();
                row.clear();
                for (int v = 0; v < nv; v++) {
                    Variable var = m.variables().get(v);
                    cells[v] = Double.NaN;
                    // keys equal to the names, other objects (as after parsing a request)
                    String name = new String(var.name().toCharArray());
                    if (rnd.nextInt(4) == 0) {
                        if (rnd.nextBoolean()) {
                            byLabel.put(name, null);
                        }
                        continue;
                    }
                    double x = switch (var.type()) {
                        case REAL -> rnd.nextDouble(-2, 6) * (k % 50 == 0 ? 1e150 : 1);
                        case COUNT -> rnd.nextInt(8);
                        default -> rnd.nextInt(var.stateCount());
                    };
                    cells[v] = x;
                    byLabel.put(name, var.states().isEmpty() ? (Object) x : var.states().get((int) x));
                    byIndex.put(name, var.type() == VariableType.COUNT ? (Object) (long) x : (Object) x);
                    row.set(name, x);
                }
                raw.logDensity(cells, 1, expected);
                for (int o = 0; o < no; o++) {
                    String at = m.source() + " row " + k + " output " + o;
                    assertBits(expected[o], m.logDensity(byLabel, o), at + " (map of labels)");
                    assertBits(expected[o], m.logDensity(byIndex, o), at + " (map of indices)");
                    assertBits(expected[o], m.logDensity(row, o), at + " (row)");
                }
                m.logDensities(byLabel, got);
                assertBits(expected[0], got[0], m.source() + " row " + k + " (logDensities)");
            }
        }
    }

    @Test
    void names_collidingHashCodes_eachVariableAndLabelFound() throws Exception {
        Model m = Fixtures.load(Model.loader(), COLLIDING);
        assertEquals(List.of(0, 1, 2, 3), List.of(m.variableIndex("Aa"), m.variableIndex("BB"),
                m.variableIndex("AaAa"), m.variableIndex("BBBB")));
        Row row = m.newRow().set("AaAa", "BBAa").set("BBBB", 2).set("Aa", 2.5).set("BB", 1.0);
        assertEquals(1.0, row.get("AaAa"));
        assertEquals("BBAa", row.value("AaAa"));
        assertEquals(2L, row.value("BBBB"));
        assertEquals(2.5, row.get("Aa"));
        assertEquals(1.0, row.get("BB"));
        assertEquals(row.toMap(), Map.of("Aa", 2.5, "BB", 1.0, "AaAa", "BBAa", "BBBB", 2L));
    }

    @Test
    void unknownNames_collidingHashCodes_refusedWithTheMessageNamingTheVariables() throws Exception {
        Model m = Fixtures.load(Model.loader(), COLLIDING);
        String names = "; expected one of Aa, BB, AaAa, BBBB";
        // "AaBB" and "BBAa" hash like the variables "AaAa" and "BBBB"
        for (String unknown : new String[] {"AaBB", "BBAa", "aa", "", "null"}) {
            String message = "\"" + unknown + "\" is not a variable of this model" + names;
            assertEquals(message, assertThrows(IllegalArgumentException.class, () -> m.variableIndex(unknown)).getMessage());
            assertEquals(message, assertThrows(IllegalArgumentException.class, () -> m.newRow().set(unknown, 1.0))
                    .getMessage());
            assertEquals(message, assertThrows(IllegalArgumentException.class,
                    () -> m.logDensity(Map.of("Aa", 2.0, unknown, 1.0))).getMessage());
        }
        assertEquals("\"null\" is not a variable of this model" + names,
                assertThrows(IllegalArgumentException.class, () -> m.newRow().set(null, 1.0)).getMessage());
        // labels that hash like the states are not states
        String expected = "variable AaAa (categorical): \"AaAa\" is not a value; expected one of AaBB, BBAa, BBBB, or a "
                + "state index from 0 to 2, or null for missing";
        assertEquals(expected, assertThrows(IllegalArgumentException.class, () -> m.newRow().set("AaAa", "AaAa"))
                .getMessage());
        assertEquals(expected, assertThrows(IllegalArgumentException.class, () -> m.logDensity(Map.of("AaAa", "AaAa")))
                .getMessage());
    }

    @Test
    void mapWithBadValuesAndUnknownNames_sameRefusalAsBefore() throws Exception {
        Model m = Model.load(Fixtures.PUMP_STATION);
        String unknown = "\"pressure\" is not a variable of this model; expected one of inlet_pressure, valve";
        String badLabel = "variable valve (categorical): \"opn\" is not a value; expected one of closed, half, open, "
                + "or a state index from 0 to 2, or null for missing";
        // a bad value of a variable is told before a name that is not a variable, whatever the map's order
        Map<String, Object> both = new LinkedHashMap<>();
        both.put("pressure", 1.0);
        both.put("valve", "opn");
        assertEquals(badLabel, assertThrows(IllegalArgumentException.class, () -> m.logDensity(both)).getMessage());
        Map<String, Object> valveFirst = new LinkedHashMap<>();
        valveFirst.put("valve", "opn");
        valveFirst.put("pressure", 1.0);
        assertEquals(badLabel, assertThrows(IllegalArgumentException.class, () -> m.logDensity(valveFirst))
                .getMessage());
        Map<String, Object> nullName = new HashMap<>();
        nullName.put("inlet_pressure", 3.0);
        nullName.put(null, 1.0);
        assertEquals("\"null\" is not a variable of this model; expected one of inlet_pressure, valve",
                assertThrows(IllegalArgumentException.class, () -> m.logDensity(nullName)).getMessage());
        // a row reused after a refused map scores the next map alone
        Row row = m.newRow();
        assertThrows(IllegalArgumentException.class, () -> row.setAll(valveFirst));
        assertBits(m.logDensity(Map.of("inlet_pressure", 3.0)), m.logDensity(row.setAll(Map.of("inlet_pressure", 3.0))),
                "after a refused map");
        // a null value is missing; with a name that is not a variable, that name is refused
        Map<String, Object> nulls = new HashMap<>();
        nulls.put("valve", null);
        nulls.put("inlet_pressure", 3.0);
        assertEquals(m.logDensity(Map.of("inlet_pressure", 3.0)), m.logDensity(nulls));
        nulls.put("pressure", null);
        assertEquals(unknown, assertThrows(IllegalArgumentException.class, () -> m.logDensity(nulls)).getMessage());
        assertEquals("variable inlet_pressure (real): a Object is not a value; expected a finite number, or null for "
                + "missing", assertThrows(IllegalArgumentException.class,
                        () -> m.logDensity(Map.of("inlet_pressure", new Object()))).getMessage());
        assertEquals("variable inlet_pressure (real): Infinity is not a value; expected a finite number, or null for "
                + "missing", assertThrows(IllegalArgumentException.class,
                        () -> m.logDensity(Map.of("inlet_pressure", Double.POSITIVE_INFINITY))).getMessage());
        assertEquals("variable valve (categorical): 3.0 is not a value; expected one of closed, half, open, or a state "
                + "index from 0 to 2, or null for missing", assertThrows(IllegalArgumentException.class,
                        () -> m.logDensity(Map.of("valve", 3))).getMessage());
    }

    /** Two variables of every type, named after their type; categoricals with three labels. */
    private static List<Variable> mixed() {
        List<Variable> vars = new ArrayList<>();
        for (int copy = 0; copy < 2; copy++) {
            for (VariableType t : List.of(VariableType.REAL, VariableType.CATEGORICAL, VariableType.BINARY,
                    VariableType.COUNT)) {
                List<String> states = t == VariableType.CATEGORICAL ? List.of("closed", "half", "open") : List.of();
                vars.add(new Variable(t.jsonName() + copy, t, states, null, null));
            }
        }
        return vars;
    }

    private static void assertBits(double expected, double actual, String at) {
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(actual),
                at + ": expected " + expected + ", got " + actual);
    }
}
