package dev.circa.engine.family;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.family.ParameterLimits.Limit;
import dev.circa.format.Family;
import java.io.InputStream;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;

/**
 * The bundled JSON Schemas (circuit.schema.json and mixture.schema.json, FORMAT.md asks them to state the
 * parameter limits) agree with {@link ParameterLimits}, family by family and parameter by parameter; and
 * the limits themselves are the textbook supports of each family (common practice: normal sd, lognormal
 * sigma, exponential/poisson rate, gamma shape/rate, beta alpha/beta > 0; probabilities in [0, 1];
 * binomial trials a whole number >= 0; uniform low < high).
 */
class ParameterLimitsSchemaTest {
    private static final ObjectMapper MAPPER = JsonMapper.builder().build();

    private static JsonNode schema(String file) throws Exception {
        try (InputStream in = ParameterLimitsSchemaTest.class.getClassLoader()
                .getResourceAsStream("dev/circa/format/schemas/" + file)) {
            assertNotNull(in, file);
            return MAPPER.readTree(in).path("$defs");
        }
    }

    @Test
    void circuitSchema_everyFamilysParameters_stateTheOwnersLimits() throws Exception {
        JsonNode defs = schema("circuit.schema.json");
        for (Family f : Family.values()) {
            JsonNode props = defs.path("input-" + f.jsonName()).path("properties");
            assertFalse(props.isMissingNode(), "circuit.schema.json has no input-" + f.jsonName());
            List<Limit> limits = ParameterLimits.of(f);
            for (int k = 0; k < limits.size(); k++) {
                String name = f.parameters().get(k);
                JsonNode p = props.path(name);
                if (f == Family.CATEGORICAL) {
                    p = p.path("items");
                } else if (f == Family.MVNORMAL) {
                    p = name.equals("cov") ? p.path("items").path("items") : p.path("items");
                }
                assertAgrees("circuit " + f.jsonName() + "." + name, limits.get(k), p);
            }
            assertOrder("circuit", f, props);
        }
    }

    @Test
    void mixtureSchema_everyFamilysParameters_stateTheOwnersLimits() throws Exception {
        JsonNode defs = schema("mixture.schema.json");
        for (Family f : Family.values()) {
            JsonNode def = defs.path("params-" + f.jsonName());
            assertFalse(def.isMissingNode(), "mixture.schema.json has no params-" + f.jsonName());
            List<Limit> limits = ParameterLimits.of(f);
            if (f == Family.CATEGORICAL) {
                // probabilities keyed by state label, or a list in state order: both forms carry the limit
                assertAgrees("mixture categorical (by label)", limits.get(0), def.path("oneOf").path(0)
                        .path("additionalProperties"));
                assertAgrees("mixture categorical (list)", limits.get(0), def.path("oneOf").path(1).path("items"));
                continue;
            }
            JsonNode props = def.path("properties");
            for (int k = 0; k < limits.size(); k++) {
                String name = f.parameters().get(k);
                JsonNode p = props.path(name);
                if (f == Family.MVNORMAL) {
                    p = name.equals("cov") ? p.path("items").path("items") : p.path("items");
                }
                assertAgrees("mixture " + f.jsonName() + "." + name, limits.get(k), p);
            }
            assertOrder("mixture", f, props);
        }
    }

    @Test
    void limits_textbookSupports() {
        // common practice: the parameter spaces of the families
        assertEquals(List.of(Limit.ANY, Limit.POSITIVE), ParameterLimits.of(Family.LOGNORMAL));
        assertFalse(Limit.POSITIVE.holds(0, Integer.MAX_VALUE));
        assertTrue(Limit.PROBABILITY.holds(1, Integer.MAX_VALUE));
        assertFalse(Limit.PROBABILITY.holds(1.0000001, Integer.MAX_VALUE));
        assertFalse(Limit.COUNT.holds(2.5, Integer.MAX_VALUE));
        // IEEE 754: integers up to 2^53 are exact in a double; 2^53 + 2 is the next double above it
        assertTrue(Limit.COUNT.holds(9007199254740992.0, Integer.MAX_VALUE));
        assertFalse(Limit.COUNT.holds(9007199254740994.0, Integer.MAX_VALUE));
        assertFalse(Limit.COUNT.holds(1e19, Integer.MAX_VALUE));
        assertFalse(Limit.COUNT.holds(Double.POSITIVE_INFINITY, Integer.MAX_VALUE));
        assertFalse(Limit.STATE.holds(3, 3));
        assertTrue(ParameterLimits.holds(Family.UNIFORM, new double[] {-1, 2}, 0));
        assertFalse(ParameterLimits.holds(Family.UNIFORM, new double[] {2, 2}, 0));
        assertFalse(ParameterLimits.holds(Family.BINOMIAL, new double[] {10, -0.1}, 0));
    }

    /** The schema fragment {@code p} of one parameter states exactly {@code limit}. */
    private static void assertAgrees(String what, Limit limit, JsonNode p) {
        assertFalse(p.isMissingNode(), what + ": no such property in the schema");
        String type = p.path("type").asString();
        boolean integer = limit == Limit.COUNT || limit == Limit.STATE;
        assertEquals(integer ? "integer" : "number", type, what + " type");
        Double min = p.has("minimum") ? p.get("minimum").asDouble() : null;
        Double exMin = p.has("exclusiveMinimum") ? p.get("exclusiveMinimum").asDouble() : null;
        Double max = p.has("maximum") ? p.get("maximum").asDouble() : null;
        switch (limit) {
            case ANY -> assertTrue(min == null && exMin == null && max == null, what + " has bounds " + p);
            case POSITIVE -> assertTrue(min == null && Double.valueOf(0).equals(exMin) && max == null, what + ": " + p);
            case PROBABILITY -> assertTrue(Double.valueOf(0).equals(min) && exMin == null && Double.valueOf(1).equals(max),
                    what + ": " + p);
            case NON_NEGATIVE, STATE -> assertTrue(Double.valueOf(0).equals(min) && exMin == null && max == null,
                    what + ": " + p);
            // IEEE 754: 2^53 = 9007199254740992, the end of the run of integers a double holds exactly
            case COUNT -> assertTrue(Double.valueOf(0).equals(min) && exMin == null
                    && p.get("maximum").isIntegralNumber() && p.get("maximum").asLong() == 9007199254740992L, what + ": " + p);
        }
    }

    /** A family whose parameters are ordered says so beside its upper parameter (a schema cannot compare two numbers). */
    private static void assertOrder(String schema, Family f, JsonNode props) {
        String high = props.path(f.parameters().get(f.parameters().size() - 1)).path("description").asString("");
        assertEquals(ParameterLimits.ordered(f), high.contains("greater than " + f.parameters().get(0)),
                schema + " " + f.jsonName() + ": " + high);
    }
}
