package dev.circa.converter.mixture;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;

/**
 * The engine's log-density of a converted circuit's one output, all rows in one batch spread over every
 * processor ({@link BatchRunner}: the same values as one thread). Not for application code.
 */
final class EngineDensity implements CircuitLogDensity {
    private final CompiledCircuit circuit;

    private EngineDensity(CompiledCircuit circuit) {
        this.circuit = circuit;
    }

    /** Compiles {@code circuit}; a circuit the converter wrote that does not compile is a converter bug. */
    static EngineDensity of(CircuitDocument circuit) {
        try {
            return new EngineDensity(CompiledCircuit.compile(circuit));
        } catch (CompileException e) {
            throw new IllegalStateException("the converter wrote a circuit the engine cannot compile: "
                    + e.getMessage(), e);
        }
    }

    @Override
    public void logDensity(double[] data, int rows, double[] out) {
        try (BatchRunner runner = BatchRunner.onAllProcessors(circuit)) {
            runner.logDensity(data, rows, out);
        }
    }
}
