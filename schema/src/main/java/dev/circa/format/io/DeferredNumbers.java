package dev.circa.format.io;

import dev.circa.format.NodeTable;
import java.util.Queue;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.ConcurrentLinkedQueue;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.core.io.NumberInput;

/**
 * Turns the text of a circuit's weights into doubles on a second thread while the reader goes on
 * with the next tokens: decoding a number costs about as much as finding it in the text, so the read
 * of a large circuit waits on the parser alone. The reader copies a number's characters into a batch
 * and appends a placeholder to the table; a full batch goes to the decoder thread, which decodes it
 * into the batch and hands it back; the reader writes the values over their placeholders when it next
 * hands a batch, and {@link #finish()} decodes what is left and waits, before the table is built.
 * Only the reading thread touches the table.
 *
 * <p>Only a decimal number that cannot leave the range of a double is deferred: no exponent or a
 * negative one, and at most {@value #MAX_DEFERRED_LENGTH} characters (below 10^300 and above
 * -10^300). Any other number is decoded at once by the reader, which reports one out of range at its
 * own line and column. The value is the same either way: both decode the same text to the nearest
 * double. The thread starts only when a first batch of {@value #FIRST_BATCH} fills, so small documents
 * never start one.
 * One instance per read; used by the reading thread only (the decoder thread is internal).
 */
final class DeferredNumbers implements AutoCloseable {
    /** Longest number text deferred (a shorter one without a positive exponent is below 10^300 in size). */
    static final int MAX_DEFERRED_LENGTH = 300;
    /** Numbers per batch. */
    static final int BATCH = 8192;
    /** Numbers in the first batch (made on the first number): a small document costs little. */
    static final int FIRST_BATCH = 1024;
    private static final Batch END = new Batch(0);

    private final NodeTable.Builder table;
    private final BlockingQueue<Batch> full = new ArrayBlockingQueue<>(4);
    private final Queue<Batch> decoded = new ConcurrentLinkedQueue<>();
    private Batch current;
    private Thread decoder;
    private volatile Throwable failure;

    DeferredNumbers(NodeTable.Builder table) {
        this.table = table;
    }

    /**
     * Takes the current token when it is a number that can be deferred: appends a placeholder to the
     * table and keeps the text for the decoder. Returns false otherwise (the caller reads it itself).
     */
    boolean offer(JsonParser parser) {
        if (parser.currentToken() != JsonToken.VALUE_NUMBER_FLOAT) {
            return false;
        }
        char[] text = parser.getStringCharacters();
        int off = parser.getStringOffset();
        int len = parser.getStringLength();
        if (len > MAX_DEFERRED_LENGTH) {
            return false;
        }
        for (int k = off; k < off + len; k++) {
            char c = text[k];
            if ((c == 'e' || c == 'E') && (k + 1 >= off + len || text[k + 1] != '-')) {
                return false;
            }
        }
        Batch b = current;
        if (b == null) {
            b = new Batch(FIRST_BATCH);
            current = b;
        } else if (b.count == b.end.length || b.used + len > b.chars.length) {
            b = hand(b);
            current = b;
        }
        System.arraycopy(text, off, b.chars, b.used, len);
        b.used += len;
        b.end[b.count] = b.used;
        b.position[b.count] = table.valueCount();
        b.count++;
        table.appendValue(0);
        return true;
    }

    /** Sends a full batch to the decoder (starting it the first time) and returns an empty one. */
    private Batch hand(Batch b) {
        if (decoder == null) {
            decoder = new Thread(this::decodeBatches, "circa-number-decoder");
            decoder.setDaemon(true);
            decoder.start();
        }
        put(full, b);
        Batch next = null;
        for (Batch d = decoded.poll(); d != null; d = decoded.poll()) {
            apply(d);
            next = d;
        }
        if (next == null) {
            next = new Batch(BATCH);
        }
        next.count = 0;
        next.used = 0;
        return next;
    }

    /** Writes a decoded batch's values over their placeholders (on the reading thread). */
    private void apply(Batch b) {
        for (int k = 0; k < b.count; k++) {
            table.setValue(b.position[k], b.value[k]);
        }
    }

    private void decodeBatches() {
        try {
            for (Batch b = full.take(); b != END; b = full.take()) {
                if (failure == null) {
                    try {
                        decode(b);
                        decoded.add(b);
                    } catch (RuntimeException | Error e) {
                        // kept for the reader; the batches that follow are drained so that it never waits
                        failure = e;
                    }
                }
            }
        } catch (InterruptedException e) {
            // an abandoned read: nothing waits for the values
            Thread.currentThread().interrupt();
        }
    }

    private static void decode(Batch b) {
        int start = 0;
        for (int k = 0; k < b.count; k++) {
            b.value[k] = NumberInput.parseDouble(b.chars, start, b.end[k] - start, true);
            start = b.end[k];
        }
    }

    /** Decodes every number taken and waits for the decoder: the table's values are complete after this. */
    void finish() {
        if (current != null) {
            decode(current);
            apply(current);
            current.count = 0;
            current.used = 0;
        }
        if (decoder == null) {
            return;
        }
        put(full, END);
        try {
            decoder.join();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while numbers were decoded", e);
        }
        decoder = null;
        Throwable f = failure;
        if (f instanceof RuntimeException r) {
            throw r;
        }
        if (f instanceof Error r) {
            throw r;
        }
        for (Batch d = decoded.poll(); d != null; d = decoded.poll()) {
            apply(d);
        }
    }

    /** Stops the decoder of an abandoned read and waits for it to end (nothing to do after {@link #finish()}). */
    @Override
    public void close() {
        Thread d = decoder;
        if (d == null) {
            return;
        }
        decoder = null;
        Workers.stop(d);
    }

    private void put(BlockingQueue<Batch> q, Batch b) {
        try {
            q.put(b);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while numbers were decoded", e);
        }
        Throwable f = failure;
        if (f != null) {
            throw new IllegalStateException("decoding numbers failed", f);
        }
    }

    /** The texts of up to {@value #BATCH} numbers, where their values go and, once decoded, the values. */
    private static final class Batch {
        final char[] chars;
        final int[] end;
        final int[] position;
        final double[] value;
        int count;
        int used;

        Batch(int capacity) {
            chars = new char[capacity * 24];
            end = new int[capacity];
            position = new int[capacity];
            value = new double[capacity];
        }
    }
}
