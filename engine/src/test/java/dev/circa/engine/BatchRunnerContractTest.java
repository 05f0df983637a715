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
        return new Variant() {
            @Override
            public void logDensity(double[] data, int rows, double[] out) {
                runner.logDensity(data, rows, out);
            }

            @Override
            public void conditional(double[] data, int rows, boolean[] given, double[] out) {
                runner.conditional(data, rows, given, out);
            }

            @Override
            public double[] logPartition() {
                return e.logPartition();
            }

            @Override
            public void mpe(double[] data, int rows, int output, double[] completed, double[] logValue) {
                e.mpe(data, rows, output, completed, logValue);
            }
        };
    }
}
