package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertFalse;

/** The contract for the generic node-by-node path, forced with {@link Evaluator.Mode#GENERIC}. */
class GenericEvaluatorTest extends EvaluatorContractTest {
    @Override
    protected Variant create(CompiledCircuit circuit) {
        Evaluator e = new Evaluator(circuit, Evaluator.Mode.GENERIC);
        assertFalse(e.usesDenseBlocks(), "the generic mode evaluates no dense block");
        return of(e);
    }
}
