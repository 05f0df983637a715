package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.SpecialFunctions;
import dev.circa.engine.internal.CircuitData;
import dev.circa.engine.internal.DenseBlocks;
import dev.circa.engine.internal.InputColumns;
import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.Random;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * {@link InputColumns} (the dense kernel's input log-densities over several rows, read variable-major) gives
 * each row, bit for bit, what the row-at-a-time loop gave: per input, the log total mass at a missing or
 * hidden cell, the normal formula with log sd taken once, {@link Families#logDensity} for every other family;
 * a fused product's inputs added in child order, first child first. On every univariate family, with missing
 * cells, values far in the tails and outside the supports, at every chunk size and position.
 */
class InputColumnsTest {
    private static final int ROWS = 300;
    private static final int VARS = 9;

    @Test
    void fusedAndInput_anyChunkSizeOrPosition_bitIdenticalToRowAtATimeLoop() {
        CompiledCircuit circuit = everyFamily();
        CircuitData c = circuit.data();
        DenseBlocks d = circuit.denseBlocks();
        int fused = 0;
        for (byte a : d.action) {
            fused += a == DenseBlocks.FUSED ? 1 : 0;
        }
        assertEquals(3, fused, "the three products of inputs are fused");
        double[] data = rows(new Random(5));
        boolean[] hide = new boolean[VARS];
        hide[2] = true;
        hide[7] = true;
        for (boolean[] h : new boolean[][] {null, hide}) {
            for (int n : new int[] {2, 3, 7, 64, 256}) {
                InputColumns columns = new InputColumns(n);
                double[] value = new double[n + 5];
                for (int row0 = 0; row0 + n <= ROWS; row0 += n + 13) {
                    columns.load(data, row0, n, VARS);
                    for (int i = 0; i < c.nodeCount; i++) {
                        if (d.action[i] == DenseBlocks.FUSED) {
                            columns.fused(c, d, i, h, value, 5);
                            for (int r = 0; r < n; r++) {
                                assertBits(fusedRow(c, i, data, row0 + r, h), value[5 + r],
                                        "product " + i + " row " + (row0 + r) + " of a chunk of " + n);
                            }
                        } else if (c.kind[i] == CircuitData.INPUT) {
                            int slot = c.inputSlot[i];
                            columns.input(c, d, slot, h, value, 0);
                            for (int r = 0; r < n; r++) {
                                assertBits(inputRow(c, slot, data, row0 + r, h), value[r],
                                        "input " + i + " row " + (row0 + r) + " of a chunk of " + n);
                            }
                        }
                    }
                }
            }
        }
    }

    @Test
    void input_observedNormalAndGammaCells_matchCommonsMath() {
        CompiledCircuit circuit = everyFamily();
        CircuitData c = circuit.data();
        double[] data = rows(new Random(9));
        InputColumns columns = new InputColumns(64);
        double[] value = new double[64];
        columns.load(data, 100, 64, VARS);
        int checked = 0;
        for (int i = 0; i < c.nodeCount; i++) {
            if (c.kind[i] != CircuitData.INPUT) {
                continue;
            }
            int slot = c.inputSlot[i];
            int off = c.paramStart[slot];
            int v = c.varIndex[c.varStart[slot]];
            columns.input(c, circuit.denseBlocks(), slot, null, value, 0);
            for (int r = 0; r < 64; r++) {
                double x = data[(100 + r) * VARS + v];
                if (x != x || Math.abs(x) > 1e3) {
                    continue;
                }
                // reference: Apache commons-math3 NormalDistribution / GammaDistribution (shape, scale = 1 / rate)
                if (c.family[slot] == Families.NORMAL) {
                    Tolerances.assertClose(new NormalDistribution(null, c.params[off], c.params[off + 1]).logDensity(x),
                            value[r], "normal input " + i + " at " + x);
                    checked++;
                } else if (c.family[slot] == Families.GAMMA && x > 0) {
                    Tolerances.assertClose(new GammaDistribution(null, c.params[off], 1 / c.params[off + 1]).logDensity(x),
                            value[r], "gamma input " + i + " at " + x);
                    checked++;
                }
            }
        }
        assertEquals(true, checked > 100, "observed cells compared: " + checked);
    }

    @Test
    void load_chunkAboveMaxCells_notTaken() {
        // a chunk of very wide data is left to the row-by-row loop: at most MAX_CELLS cells are turned
        assertEquals(true, InputColumns.fits(256, InputColumns.MAX_CELLS / 256));
        assertEquals(false, InputColumns.fits(256, InputColumns.MAX_CELLS / 256 + 1));
        InputColumns columns = new InputColumns(4);
        columns.load(new double[2 * VARS], 0, 2, VARS);
        assertEquals(true, columns.loaded());
        columns.load(new double[0], 0, 4, InputColumns.MAX_CELLS);
        assertEquals(false, columns.loaded());
    }

    private static void assertBits(double expected, double actual, String what) {
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(actual),
                () -> what + ": expected " + expected + " but was " + actual);
    }

    /** The row-at-a-time loop: a fused product's inputs at one row, added in child order. */
    private static double fusedRow(CircuitData c, int i, double[] data, int row, boolean[] hide) {
        double acc = 0;
        for (int e = c.childStart[i]; e < c.childStart[i + 1]; e++) {
            double g = inputRow(c, c.inputSlot[c.childIndex[e]], data, row, hide);
            acc = e == c.childStart[i] ? g : acc + g;
        }
        return acc;
    }

    /** The row-at-a-time loop: one input at one row. */
    private static double inputRow(CircuitData c, int slot, double[] data, int row, boolean[] hide) {
        int code = c.family[slot];
        int off = c.paramStart[slot];
        int len = c.paramStart[slot + 1] - off;
        int v = c.varIndex[c.varStart[slot]];
        double x = data[row * VARS + v];
        if (x != x || hide != null && hide[v]) {
            return Families.logTotalMass(code, c.params, off, len);
        }
        if (code == Families.NORMAL) {
            double z = (x - c.params[off]) / c.params[off + 1];
            return -0.5 * z * z - Math.log(c.params[off + 1]) - SpecialFunctions.HALF_LOG_2PI;
        }
        return Families.logDensity(code, c.params, off, len, x);
    }

    /**
     * Variables: six real (pump pressures and temperatures), a count, a binary and a three-state categorical;
     * three products over all nine with inputs of every univariate family (a tiny sd among them), under one sum.
     */
    private static CompiledCircuit everyFamily() {
        TestCircuits t = new TestCircuits();
        for (int v = 0; v < 6; v++) {
            t.variable("pressure_" + v, VariableType.REAL);
        }
        t.variable("starts", VariableType.COUNT);
        t.variable("alarm", VariableType.BINARY);
        t.variable("valve", VariableType.CATEGORICAL, "closed", "half", "open");
        int p1 = t.product(t.input(Family.NORMAL, 0, 1.5, 2), t.input(Family.NORMAL, 1, -3, 0.5),
                t.input(Family.LOGNORMAL, 2, 0.2, 0.7), t.input(Family.EXPONENTIAL, 3, 1.3),
                t.input(Family.GAMMA, 4, 2.5, 1.1), t.input(Family.BETA, 5, 2, 3), t.input(Family.POISSON, 6, 4.2),
                t.input(Family.BERNOULLI, 7, 0.3), t.input(Family.CATEGORICAL, 8, 0.2, 0.5, 0.3));
        int p2 = t.product(t.input(Family.NORMAL, 0, -2, 1e-150), t.input(Family.UNIFORM, 1, -1, 4),
                t.input(Family.NORMAL, 2, 0, 3), t.input(Family.GAMMA, 3, 0.5, 2), t.input(Family.BETA, 4, 15, 12),
                t.input(Family.EXPONENTIAL, 5, 0.1), t.input(Family.BINOMIAL, 6, 20, 0.4),
                t.input(Family.INDICATOR, 7, 1), t.logCategorical(8, Math.log(0.6), Math.log(0.3), Math.log(0.1)));
        int p3 = t.product(t.input(Family.NORMAL, 0, 1e300, 1e-300), t.input(Family.NORMAL, 1, 4, 1e200),
                t.input(Family.NORMAL, 2, -1e-3, 7), t.input(Family.NORMAL, 3, 11, 0.25),
                t.input(Family.NORMAL, 4, 0, 1), t.input(Family.NORMAL, 5, 2.5, 40),
                t.input(Family.POISSON, 6, 0.5), t.input(Family.CATEGORICAL, 7, 0.9, 0.1),
                t.input(Family.INDICATOR, 8, 2));
        int sum = t.sum(new double[] {0.5, 0.3, 0.2}, p1, p2, p3);
        t.output("joint", sum);
        return t.compile();
    }

    /**
     * Rows of the nine variables: a quarter of the cells missing, every tenth row entirely; real cells around
     * 1.5, or (one in five) far in the tails, infinite, or outside some input's support (negative, above 1);
     * counts and states mostly in range, sometimes fractional or too large.
     */
    private static double[] rows(Random random) {
        double[] tails = {40, -55, 1e5, -3e7, 1e154, -1e200, 1e300, Double.MAX_VALUE, -1e-300, 6e-310, 0, 1,
            Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, -0.5, 1.5};
        double[] data = new double[ROWS * VARS];
        for (int r = 0; r < ROWS; r++) {
            for (int v = 0; v < VARS; v++) {
                double x;
                if (r % 10 == 9 || random.nextDouble() < 0.25) {
                    x = Double.NaN;
                } else if (v < 6) {
                    x = random.nextDouble() < 0.2 ? tails[random.nextInt(tails.length)] : 1.5 + 2 * random.nextGaussian();
                } else if (random.nextDouble() < 0.1) {
                    x = random.nextBoolean() ? 2.5 : 30;
                } else {
                    x = random.nextInt(v == 6 ? 25 : v == 7 ? 2 : 3);
                }
                data[r * VARS + v] = x;
            }
        }
        return data;
    }
}
