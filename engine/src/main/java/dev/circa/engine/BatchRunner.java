package dev.circa.engine;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Evaluates large batches on several threads: the rows are cut into one contiguous range per thread and
 * each range goes to that thread's own {@link Evaluator}. A row's result does not depend on the rows
 * evaluated with it, so results are identical to a single {@link Evaluator}'s, bit for bit, for any
 * thread count (tested). The calling thread works on the last range.
 *
 * <p>Calls are serialised (one batch at a time); close the runner to stop its worker threads.
 */
public final class BatchRunner implements AutoCloseable {
    /** Fewest rows given to one thread; smaller batches use fewer threads. */
    public static final int MIN_ROWS_PER_THREAD = 8;

    private final CompiledCircuit circuit;
    private final Evaluator[] evaluators;
    private final ExecutorService pool;
    private final List<Future<?>> pending = new ArrayList<>();

    /** A runner on {@code threads} threads (at least 1) for {@code circuit}, automatic path. */
    public BatchRunner(CompiledCircuit circuit, int threads) {
        this(circuit, threads, Evaluator.Mode.AUTOMATIC);
    }

    /** A runner on {@code threads} threads (at least 1) for {@code circuit} on the path {@code mode}. */
    public BatchRunner(CompiledCircuit circuit, int threads, Evaluator.Mode mode) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads = " + threads + " (expected >= 1)");
        }
        this.circuit = circuit;
        this.evaluators = new Evaluator[threads];
        for (int t = 0; t < threads; t++) {
            evaluators[t] = new Evaluator(circuit, mode);
        }
        AtomicInteger count = new AtomicInteger();
        this.pool = threads == 1 ? null : Executors.newFixedThreadPool(threads - 1, r -> {
            Thread thread = new Thread(r, "circa-batch-" + count.incrementAndGet());
            thread.setDaemon(true);
            return thread;
        });
    }

    /** A runner on every available processor. */
    public static BatchRunner onAllProcessors(CompiledCircuit circuit) {
        return new BatchRunner(circuit, Runtime.getRuntime().availableProcessors());
    }

    /** Number of threads. */
    public int threads() {
        return evaluators.length;
    }

    /** The circuit evaluated. */
    public CompiledCircuit circuit() {
        return circuit;
    }

    /** As {@link Evaluator#logDensity}, spread over the threads. */
    public synchronized void logDensity(double[] data, int rows, double[] out) {
        evaluators[0].checkBatch(data, rows, out, (long) rows * circuit.outputCount());
        spread(rows, (e, from, to) -> e.logDensityRange(data, from, to, out));
    }

    /** As {@link Evaluator#conditional}, spread over the threads. */
    public synchronized void conditional(double[] data, int rows, boolean[] given, double[] out) {
        evaluators[0].checkConditional(data, rows, given, out);
        spread(rows, (e, from, to) -> e.conditionalRange(data, from, to, given, out));
    }

    /** As {@link Evaluator#mpe}, spread over the threads (each row's explanation is its own: the same on any thread). */
    public synchronized void mpe(double[] data, int rows, int output, double[] completed, double[] logValue) {
        evaluators[0].checkMpe(data, rows, output, completed, logValue);
        spread(rows, (e, from, to) -> e.mpeRange(data, from, to, output, completed, logValue));
    }

    private interface RangeTask {
        void run(Evaluator e, int from, int to);
    }

    private void spread(int rows, RangeTask task) {
        int parts = (int) Math.max(1, Math.min(evaluators.length, (long) rows / MIN_ROWS_PER_THREAD));
        if (parts == 1 || pool == null) {
            task.run(evaluators[0], 0, rows);
            return;
        }
        pending.clear();
        for (int t = 0; t < parts - 1; t++) {
            Evaluator e = evaluators[t];
            int from = (int) ((long) rows * t / parts);
            int to = (int) ((long) rows * (t + 1) / parts);
            pending.add(pool.submit(() -> task.run(e, from, to)));
        }
        RuntimeException failure = null;
        try {
            task.run(evaluators[parts - 1], (int) ((long) rows * (parts - 1) / parts), rows);
        } catch (RuntimeException ex) {
            failure = ex;
        }
        for (Future<?> f : pending) {
            try {
                f.get();
            } catch (ExecutionException ex) {
                if (failure == null) {
                    failure = ex.getCause() instanceof RuntimeException re ? re : new IllegalStateException(ex.getCause());
                }
            } catch (InterruptedException ex) {
                Thread.currentThread().interrupt();
                if (failure == null) {
                    failure = new IllegalStateException("interrupted while waiting for a batch", ex);
                }
            }
        }
        pending.clear();
        if (failure != null) {
            throw failure;
        }
    }

    /** Stops the worker threads. */
    @Override
    public void close() {
        if (pool != null) {
            pool.shutdownNow();
        }
    }
}
