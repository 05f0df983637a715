package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

/** {@link BatchRunner} gives the single evaluator's results bit for bit (common practice: determinism). */
class BatchRunnerTest {
    @Test
    void logDensity_anyThreadCountAndBatchSize_identicalToSerial() {
        RandomCircuits rc = RandomCircuits.regionGraph(21, 9, 4, 3, 2, 0.3, true);
        CompiledCircuit circuit = rc.compile();
        double[] data = rc.rows(517, 0.2);
        for (Evaluator.Mode mode : Evaluator.Mode.values()) {
            for (int rows : new int[] {0, 1, 7, 64, 65, 517}) {
                double[] serial = new double[rows * 2];
                new Evaluator(circuit, mode).logDensity(data, rows, serial);
                for (int threads = 1; threads <= 4; threads++) {
                    try (BatchRunner runner = new BatchRunner(circuit, threads, mode)) {
                        double[] out = new double[rows * 2];
                        runner.logDensity(data, rows, out);
                        assertArrayEquals(serial, out, mode + " rows " + rows + " threads " + threads);
                    }
                }
            }
        }
    }

    @Test
    void conditional_twoThreads_identicalToSerial() {
        RandomCircuits rc = RandomCircuits.regionGraph(22, 7, 3, 2, 1, 0.3, false);
        CompiledCircuit circuit = rc.compile();
        double[] data = rc.rows(300, 0.1);
        boolean[] given = {true, false, true, false, false, true, false};
        double[] serial = new double[300];
        new Evaluator(circuit).conditional(data, 300, given, serial);
        try (BatchRunner runner = new BatchRunner(circuit, 2)) {
            double[] out = new double[300];
            runner.conditional(data, 300, given, out);
            assertArrayEquals(serial, out);
        }
    }

    @Test
    void mpe_anyThreadCountAndBatchSize_identicalToSerial() {
        RandomCircuits rc = RandomCircuits.regionGraph(24, 9, 4, 3, 2, 0.3, true);
        CompiledCircuit circuit = rc.compile();
        int nv = circuit.variableCount();
        double[] data = rc.rows(517, 0.4);
        for (Evaluator.Mode mode : Evaluator.Mode.values()) {
            for (int rows : new int[] {0, 1, 9, 64, 65, 517}) {
                for (int output = 0; output < 2; output++) {
                    double[] filled = new double[rows * nv];
                    double[] value = new double[rows];
                    new Evaluator(circuit, mode).mpe(data, rows, output, filled, value);
                    for (int threads = 1; threads <= 3; threads++) {
                        try (BatchRunner runner = new BatchRunner(circuit, threads, mode)) {
                            double[] f = new double[rows * nv];
                            double[] v = new double[rows];
                            runner.mpe(data, rows, output, f, v);
                            String what = mode + " rows " + rows + " output " + output + " threads " + threads;
                            assertArrayEquals(filled, f, what);
                            assertArrayEquals(value, v, what);
                        }
                    }
                }
            }
        }
    }

    @Test
    void mpe_badArguments_rejectedBeforeAnyThreadStarts() {
        CompiledCircuit circuit = RandomCircuits.regionGraph(25, 4, 2, 2, 1, 0, false).compile();
        try (BatchRunner runner = new BatchRunner(circuit, 2)) {
            assertThrows(IllegalArgumentException.class, () -> runner.mpe(new double[40], 10, 0, new double[40], new double[9]));
            assertThrows(IllegalArgumentException.class, () -> runner.mpe(new double[40], 10, 0, new double[39], new double[10]));
            assertThrows(IllegalArgumentException.class, () -> runner.mpe(new double[40], 10, 1, new double[40], new double[10]));
        }
    }

    @Test
    void logDensity_outputTooSmall_rejected() {
        CompiledCircuit circuit = RandomCircuits.regionGraph(23, 4, 2, 2, 1, 0, false).compile();
        try (BatchRunner runner = new BatchRunner(circuit, 2)) {
            assertThrows(IllegalArgumentException.class, () -> runner.logDensity(new double[40], 10, new double[9]));
        }
        assertThrows(IllegalArgumentException.class, () -> new BatchRunner(circuit, 0));
    }
}
