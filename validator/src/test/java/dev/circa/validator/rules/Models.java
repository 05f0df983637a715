package dev.circa.validator.rules;

/** Small inline models shared by the rule tests (the pump-station scenario of FORMAT.md). */
final class Models {
    /** alarm (binary, index 0) and inlet_pressure (real, index 1). */
    static final String VARS = """
            {"name": "alarm", "type": "binary"}, {"name": "inlet_pressure", "type": "real", "unit": "bar"}""";

    /** A smooth, decomposable, deterministic, structured and normalised circuit over {@link #VARS}. */
    static final String NODES = """
            {"id": 0, "input": "indicator", "var": 0, "value": 0},
            {"id": 1, "input": "indicator", "var": 0, "value": 1},
            {"id": 2, "input": "normal", "var": 1, "mean": 3.1, "sd": 0.2},
            {"id": 3, "input": "normal", "var": 1, "mean": 2.2, "sd": 0.5},
            {"id": 4, "product": [0, 2]},
            {"id": 5, "product": [1, 3]},
            {"id": 6, "sum": [4, 5], "weights": [0.3, 0.7]}""";

    static final String OUT = """
            {"name": "joint", "node": 6}""";

    private Models() {
    }

    /** {@link #NODES} with its last node (the sum 6) replaced by {@code lastNodes}. */
    static String withTop(String lastNodes) {
        return NODES.substring(0, NODES.lastIndexOf("{\"id\": 6")) + lastNodes;
    }
}
