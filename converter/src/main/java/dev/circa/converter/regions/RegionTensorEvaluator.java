package dev.circa.converter.regions;

/**
 * Evaluates a compiled region graph directly from its parameters, region by region, without
 * building or reading a circuit. Written separately from the engine to check it.
 *
 * <p>Rows are taken in blocks of {@value #CHUNK_ROWS}, each region a block of values in a reused slot
 * ({@link DirectBlocks}). A block is evaluated in linear space, values times a power of two per row and region
 * ({@link LinearPass}); the rows that a region cannot hold this way are evaluated again on their own in the log
 * domain ({@link LogDomainPass}). Each row is summed in one fixed order (children in layout order, parts in
 * partition order), and which path a row takes depends on that row alone, so a row's value does not depend on
 * the other rows of the call.
 *
 * <p>The scaled weights ({@link ScaledWeights}) and the rest of the model's state ({@link DirectModel}) are
 * computed once and shared by the evaluators made with {@link #sharing()}; each evaluator owns its blocks and
 * reuses them on every call. Not thread-safe: one evaluator per thread.
 */
public final class RegionTensorEvaluator {
    /**
     * Rows evaluated together: the blocks hold this many rows, whatever the number of rows asked for. 256 rather
     * than 64: the loops over a block's rows are long enough for the JIT's vector loops, and the per-block work
     * (reading every input's parameters) is taken 4 times less often (6% less time on the K = I = 4 circuit of
     * 10^6 edges, unchanged at K = I = 24).
     */
    public static final int CHUNK_ROWS = 256;

    private final DirectModel model;
    private final LinearPass linear;

    /** An evaluator of the model that {@code params} define. */
    public RegionTensorEvaluator(RegionParameters params) {
        this(new DirectModel(params));
    }

    private RegionTensorEvaluator(DirectModel model) {
        this.model = model;
        DirectBlocks blocks = new DirectBlocks(model);
        this.linear = new LinearPass(model, blocks, new LogDomainPass(model, blocks));
    }

    /** Another evaluator of the same model that shares this one's scaled weights, for another thread. */
    public RegionTensorEvaluator sharing() {
        return new RegionTensorEvaluator(model);
    }

    /** The rows this evaluator has left to the log-domain evaluation so far (each counted once per call). */
    long logDomainRows() {
        return linear.logDomainRows();
    }

    /** Number of outputs (C). */
    public int outputCount() {
        return model.outputCount();
    }

    /**
     * Log-values of every output for each row.
     *
     * @param data input: row-major rows x variables, NaN = missing, discrete values as doubles
     * @param rows number of rows
     * @param out output: {@code out[row * outputCount() + o]}
     */
    public void logDensity(double[] data, int rows, double[] out) {
        logDensity(data, 0, rows, out);
    }

    /**
     * {@link #logDensity} spread over {@code threads} threads (this evaluator and others {@link #sharing()}
     * its weights), each on its own range of whole blocks; the values are the same as on one thread.
     */
    public void logDensity(double[] data, int rows, double[] out, int threads) {
        int blocks = (rows + CHUNK_ROWS - 1) / CHUNK_ROWS;
        int parts = Math.max(1, Math.min(threads, blocks));
        if (parts == 1) {
            logDensity(data, 0, rows, out);
            return;
        }
        Thread[] workers = new Thread[parts - 1];
        Throwable[] failure = new Throwable[parts - 1];
        for (int t = 0; t < parts - 1; t++) {
            int from = (int) ((long) blocks * t / parts) * CHUNK_ROWS;
            int to = (int) ((long) blocks * (t + 1) / parts) * CHUNK_ROWS;
            RegionTensorEvaluator e = sharing();
            int slot = t;
            workers[t] = new Thread(() -> {
                try {
                    e.logDensity(data, from, to, out);
                } catch (RuntimeException | Error ex) {
                    failure[slot] = ex;
                }
            }, "circa-region-tensors-" + (t + 1));
            workers[t].setDaemon(true);
            workers[t].start();
        }
        logDensity(data, (int) ((long) blocks * (parts - 1) / parts) * CHUNK_ROWS, rows, out);
        boolean interrupted = false;
        for (int t = 0; t < workers.length; t++) {
            while (true) {
                try {
                    workers[t].join();
                    break;
                } catch (InterruptedException ex) {
                    interrupted = true;
                }
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        for (Throwable f : failure) {
            if (f instanceof RuntimeException re) {
                throw re;
            }
            if (f instanceof Error er) {
                throw er;
            }
        }
    }

    /** {@link #logDensity} on rows {@code from .. to-1} of {@code data}, written to the same rows of {@code out}. */
    private void logDensity(double[] data, int from, int to, double[] out) {
        for (int row0 = from; row0 < to; row0 += CHUNK_ROWS) {
            linear.linearBlock(data, row0, Math.min(CHUNK_ROWS, to - row0), out);
        }
    }
}
