package dev.circa.engine;

/** The contract for the generic node-by-node {@link Evaluator}. */
class GenericEvaluatorTest extends EvaluatorContractTest {
    @Override
    protected Variant create(CompiledCircuit circuit) {
        Evaluator e = new Evaluator(circuit);
        return new Variant() {
            @Override
            public void logDensity(double[] data, int rows, double[] out) {
                e.logDensity(data, rows, out);
            }

            @Override
            public void conditional(double[] data, int rows, boolean[] given, double[] out) {
                e.conditional(data, rows, given, out);
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
