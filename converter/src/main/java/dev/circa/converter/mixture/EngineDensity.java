package dev.circa.converter.mixture;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;

/** The engine's log-density of a converted circuit's one output. Not for application code. */
final class EngineDensity implements CircuitLogDensity {
    private final Evaluator evaluator;

    private EngineDensity(Evaluator evaluator) {
        this.evaluator = evaluator;
    }

    /** Compiles {@code circuit}; a circuit the converter wrote that does not compile is a converter bug. */
    static EngineDensity of(CircuitDocument circuit) {
        try {
            return new EngineDensity(new Evaluator(CompiledCircuit.compile(circuit)));
        } catch (CompileException e) {
            throw new IllegalStateException("the converter wrote a circuit the engine cannot compile: "
                    + e.getMessage(), e);
        }
    }

    @Override
    public void logDensity(double[] data, int rows, double[] out) {
        evaluator.logDensity(data, rows, out);
    }
}
