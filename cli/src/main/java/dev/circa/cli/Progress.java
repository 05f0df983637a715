package dev.circa.cli;

import dev.circa.format.Counts;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.LongSupplier;

/**
 * One progress line on standard error for work that runs longer than {@link #DELAY_NANOS}, redrawn in
 * place with a carriage return and cleared at the end. Only the process's own standard error, and
 * only when it is a terminal: in pipes, files and tests nothing is ever written.
 */
final class Progress implements AutoCloseable {
    /** Work shorter than this shows no progress (2 s). */
    static final long DELAY_NANOS = 2_000_000_000L;
    private static volatile PrintWriter terminal;

    private final PrintWriter err;
    private final LongSupplier clock;
    private final long start;
    private final ScheduledExecutorService ticker;
    private volatile String what;
    private volatile long done = -1;
    private volatile long total = -1;
    private volatile String unit;
    private int drawn;

    /** A line for {@code err}, drawn only when {@code live}; the caller calls {@link #tick()} (for tests). */
    Progress(PrintWriter err, boolean live, LongSupplier clock, String what) {
        this.err = live ? err : null;
        this.clock = clock;
        this.start = clock.getAsLong();
        this.what = what;
        this.ticker = null;
    }

    private Progress(PrintWriter err, String what) {
        this.err = err;
        this.clock = System::nanoTime;
        this.start = clock.getAsLong();
        this.what = what;
        this.ticker = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "circa-progress");
            t.setDaemon(true);
            return t;
        });
        ticker.scheduleAtFixedRate(this::tick, 250, 250, TimeUnit.MILLISECONDS);
    }

    /** Called by {@link Main#main} only: {@code err} is the process's standard error, drawn on when it is a terminal. */
    static void useTerminal(PrintWriter err) {
        if (stderrIsTerminal()) {
            terminal = err;
        }
    }

    /** Progress of {@code what} on {@code err}: live only when {@code err} is the terminal of {@link #useTerminal}. */
    static Progress start(PrintWriter err, String what) {
        PrintWriter t = terminal;
        return t != null && t == err ? new Progress(err, what) : new Progress(err, false, System::nanoTime, what);
    }

    private static boolean stderrIsTerminal() {
        return isTerminal(2);
    }

    /** Whether standard output is a terminal too (rows written there would break the progress line). */
    static boolean stdoutIsTerminal() {
        return isTerminal(1);
    }

    private static boolean isTerminal(int fd) {
        try {
            String target = Files.readSymbolicLink(Path.of("/proc/self/fd/" + fd)).toString();
            return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
        } catch (java.io.IOException | UnsupportedOperationException | SecurityException e) {
            return System.console() != null;
        }
    }

    /** Now doing {@code phase}. */
    void phase(String phase) {
        this.what = phase;
        this.done = -1;
    }

    /** {@code count} of {@code outOf} (or -1 when unknown) {@code noun}s done. */
    void count(long count, long outOf, String noun) {
        this.unit = noun;
        this.total = outOf;
        this.done = count;
    }

    /** Draws the line when the work has run longer than the delay. */
    synchronized void tick() {
        long elapsed = clock.getAsLong() - start;
        if (err == null || elapsed < DELAY_NANOS) {
            return;
        }
        String line = line(what, done, total, unit, elapsed);
        err.print("\r" + line + " ".repeat(Math.max(0, drawn - line.length())));
        err.flush();
        drawn = line.length();
    }

    /** "circa sample: drawing samples, 12,000 of 100,000 rows (12%), 4 s". */
    static String line(String what, long done, long total, String unit, long elapsedNanos) {
        StringBuilder sb = new StringBuilder(what);
        if (done >= 0) {
            sb.append(", ").append(total >= 0 ? String.format(Locale.ROOT, "%,d of %s", done, Counts.grouped(total, unit))
                    : Counts.grouped(done, unit));
            if (total > 0) {
                sb.append(String.format(Locale.ROOT, " (%d%%)", Math.min(100, done * 100 / total)));
            }
        }
        return sb.append(", ").append(elapsedNanos / 1_000_000_000L).append(" s").toString();
    }

    /** Erases the line, if drawn, so that a message can be printed; the next tick draws it again. */
    synchronized void clear() {
        if (err != null && drawn > 0) {
            err.print("\r" + " ".repeat(drawn) + "\r");
            err.flush();
            drawn = 0;
        }
    }

    /** Stops and clears the line, leaving the terminal as it was. */
    @Override
    public synchronized void close() {
        if (ticker != null) {
            ticker.shutdownNow();
        }
        clear();
    }
}
