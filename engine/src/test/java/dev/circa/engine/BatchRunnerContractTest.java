package dev.circa.engine;

/**
 * The contract for {@link BatchRunner} on three threads (densities and conditionals spread over threads;
 * partition and MPE from an evaluator of the same circuit).
 */
class BatchRunnerContractTest extends EvaluatorContractTest {
    @Override
    protected Variant create(CompiledCircuit circuit) {
        BatchRunner runner = new BatchRunner(circuit, 3);
        Evaluator e = new Evaluator(circuit);
        return of(e, runner::logDensity, runner::conditional);
    }
}
