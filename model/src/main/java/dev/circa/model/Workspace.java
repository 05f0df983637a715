package dev.circa.model;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.engine.Sampler;

/**
 * One thread's scratch space for a {@link Model}: its own evaluator and buffers, created on the thread's
 * first call and reused by every later one, so that calls allocate nothing at steady state.
 */
final class Workspace {
    /** Rows evaluated together when a batch call needs a copy (a chosen output of several). */
    static final int CHUNK = 256;

    final Evaluator evaluator;
    /** One row of cells, or a chunk of rows. */
    final double[] cells;
    /** Outputs of a chunk of rows. */
    final double[] out;
    /** Per variable: evidence of a conditional. */
    final boolean[] given;
    /** One completed row of an imputation. */
    final double[] filled;
    /** The max-product value of one imputed row. */
    final double[] logValue = new double[1];
    /** Rows that Map-valued calls are encoded into. */
    final Row query;
    final Row evidence;
    private Sampler sampler;
    private long samplerSeed;

    Workspace(Model model, VariableCodec codec) {
        CompiledCircuit c = model.circuit();
        this.evaluator = new Evaluator(c);
        this.cells = new double[CHUNK * c.variableCount()];
        this.out = new double[CHUNK * c.outputCount()];
        this.given = new boolean[c.variableCount()];
        this.filled = new double[c.variableCount()];
        this.query = new Row(model, codec);
        this.evidence = new Row(model, codec);
    }

    /** This thread's sampler for {@code seed}, made anew only when the seed changes. */
    Sampler sampler(CompiledCircuit circuit, long seed) {
        if (sampler == null || samplerSeed != seed) {
            sampler = new Sampler(circuit, seed);
            samplerSeed = seed;
        }
        return sampler;
    }
}
