package dev.circa.format.io;

import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.util.concurrent.CountDownLatch;

/**
 * A {@link NodeScanner} reading part of a stored file's nodes array on a thread of its own, into a table
 * and locations of its own, lines counted from its start as line 2 (the line after a first line of its
 * own): what {@link NodeArrayHead} and {@link NodeArrayTail} share. The reading thread waits for it
 * ({@link #await}), then takes its table and locations or drops them ({@link #close}).
 */
abstract class NodeScanThread implements AutoCloseable {
    private final FileChannel channel;
    private final NodeTable.Builder table = new NodeTable.Builder();
    private final NodeLocations.Recorder locations = new NodeLocations.Recorder();
    /** The scanner, counting from the file offset it starts at as line 2, {@code column}. */
    protected final NodeScanner scanner;
    private final CountDownLatch done = new CountDownLatch(1);
    private final Thread thread;
    private volatile Error error;

    protected NodeScanThread(FileChannel channel, long offset, int column, ReadLimits limits, long size, String name) {
        this.channel = channel;
        this.scanner = new NodeScanner(channel, offset, 2, column, limits, table, locations, size);
        this.thread = new Thread(this::run, name);
        thread.setDaemon(true);
    }

    /** The scan, on the thread. */
    protected abstract void scan();

    /** Starts the thread. */
    protected final void startThread() {
        thread.start();
    }

    /** Waits for the scan to end; rethrows what broke it. */
    protected final void await(String what) {
        try {
            done.await();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while " + what + " of the nodes was read", e);
        }
        Error e = error;
        if (e != null) {
            throw e;
        }
    }

    /** The nodes read (after the scan). */
    final NodeTable.Builder table() {
        return table;
    }

    /** Where the nodes read start, as counted from the start (line 2). */
    final NodeLocations.Recorder locations() {
        return locations;
    }

    /** The number of nodes read. */
    final int count() {
        return scanner.count();
    }

    /** The file offset where the scan stopped (after the scan). */
    final long offset() {
        return scanner.offset();
    }

    /** The file's line where the scan stopped, line 2 of the count standing at {@code line} of the file. */
    final int stopLine(int line) {
        return scanner.line() - 2 + line;
    }

    /** The file's column where the scan stopped, column 1 of line 2 of the count standing at {@code column}. */
    final int stopColumn(int column) {
        return scanner.line() == 2 ? scanner.column() - 1 + column : scanner.column();
    }

    /** Stops the scan (if it still runs) and waits for it. */
    @Override
    public final void close() {
        scanner.stop();
        Workers.stop(thread);
        try {
            channel.close();
        } catch (IOException ignored) {
            // nothing read from it is kept
        }
    }

    private void run() {
        try {
            scan();
        } catch (Error e) {
            error = e;
        } finally {
            done.countDown();
        }
    }
}
