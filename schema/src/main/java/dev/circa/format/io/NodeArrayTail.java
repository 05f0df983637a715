package dev.circa.format.io;

import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import dev.circa.format.ReadFinding;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.SequenceInputStream;
import java.nio.ByteBuffer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import tools.jackson.core.JsonToken;

/**
 * Reads the second half of a large circuit's {@code nodes} array on another thread, while the
 * document's reader reads the first half: the read of a large file takes both cores.
 *
 * <p>The split is a guess checked afterwards. When the reader reaches the nodes array, the tail picks a
 * <code>{</code> near the middle of what is left of the file that follows <code>},</code> (as a node
 * follows another) and parses the file from there on as if it were inside the nodes array: its input
 * starts with one line of its own, the document's members read so far and <code>"nodes": [</code>, so
 * that its parser stands where the reader's will stand, duplicate keys included. Its nodes go to a
 * table of their own. The guess holds only if the reader, going on node by node, meets a node that
 * starts at exactly that byte: then the text from there on is the same tokens in the same place for
 * both parsers. The reader then takes the tail's nodes, lines moved down to where the tail started, and
 * reads the rest of the document from the tail's parser, whose lines and columns are moved to the file's. In every other case the reader reads on by
 * itself, as it would have without a tail: when it passes the byte or ends the nodes array without
 * meeting it, or when the tail stopped at anything but a clean end of the array (a syntax error, a
 * limit, an unknown member, anything it would have to report), since what the reader reports must
 * not depend on the split. Used by one reading thread.
 */
final class NodeArrayTail implements AutoCloseable {
    /** Files smaller than this are read by one thread (a thread and a second parser cost more). */
    static final long MIN_BYTES = 8L << 20;
    /** How far past the middle the start of a node is looked for. */
    private static final int SCAN_BYTES = 1 << 16;

    private final long braceOffset;
    private final JsonInput input;
    private final NodeTable.Builder table = new NodeTable.Builder();
    private final NodeLocations.Recorder locations = new NodeLocations.Recorder();
    private final List<ReadFinding> findings = new ArrayList<>();
    private final NodeArrayReader reader;
    private final CountDownLatch done = new CountDownLatch(1);
    private final Thread thread;
    private volatile boolean cancelled;
    /** Whether the tail read its nodes up to the end of the array with nothing to report. */
    private volatile boolean clean;
    private volatile Error error;
    private boolean handedOver;

    private NodeArrayTail(long braceOffset, JsonInput input, ReadLimits limits) {
        this.braceOffset = braceOffset;
        this.input = input;
        this.reader = new NodeArrayReader(input, limits, table, locations, null, findings);
        this.thread = new Thread(this::run, "circa-read-tail");
        thread.setDaemon(true);
    }

    /**
     * Starts reading the second half of the nodes array of {@code main}'s file, or returns {@code null}
     * when the file does not lend itself to it (not a regular file read as stored, smaller than
     * {@code minBytes}, larger than the byte limit, not UTF-8 text, nothing near the middle that looks like a node's start).
     *
     * @param membersBefore the document's members read before {@code nodes}, in order
     * @param nodesOffset the byte offset of the nodes array's <code>[</code>
     */
    static NodeArrayTail start(JsonInput main, ReadLimits limits, long minBytes, List<String> membersBefore, long nodesOffset) {
        Path file = main.storedFile();
        if (file == null || nodesOffset < 0) {
            return null;
        }
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            long size = ch.size();
            if (size < minBytes || size > limits.maxBytes() || !startsAsUtf8(ch)) {
                return null;
            }
            long brace = objectAfterComma(ch, nodesOffset + (size - nodesOffset) / 2);
            if (brace < 0) {
                return null;
            }
            byte[] prefix = prefix(membersBefore);
            FileChannel tailChannel = FileChannel.open(file, StandardOpenOption.READ);
            tailChannel.position(brace);
            InputStream stream = new LimitedInputStream(new SequenceInputStream(new ByteArrayInputStream(prefix),
                    Channels.newInputStream(tailChannel)), limits.maxBytes() - brace + prefix.length, main.file());
            JsonInput input;
            try {
                input = JsonInput.fromStream(stream, main.file(), limits);
            } catch (FormatException e) {
                stream.close();
                return null;
            }
            NodeArrayTail tail = new NodeArrayTail(brace, input, limits);
            tail.thread.start();
            return tail;
        } catch (IOException e) {
            // the file cannot be opened a second time: the reader reads it alone
            return null;
        }
    }

    /** The byte offset of the node the reader must meet for the tail to hold. */
    long nodeOffset() {
        return braceOffset;
    }

    /**
     * Waits for the tail and, when it read cleanly and its nodes fit under {@code maxNodes} after
     * {@code nodesBefore}, hands it over: its input reports lines as the file's from now on.
     *
     * @param line the line of the node the reader met at {@link #nodeOffset()}
     * @param column its column
     * @return whether the tail holds (its table, locations and input are then the reader's to take)
     */
    boolean handOver(int line, int column, int nodesBefore, long maxNodes) {
        try {
            done.await();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while the second half of the nodes was read", e);
        }
        Error e = error;
        if (e != null) {
            throw e;
        }
        if (!clean || (long) nodesBefore + reader.count() > maxNodes) {
            return false;
        }
        // the tail's input has a line of its own, then starts at the node's brace
        input.moveTo(line, column);
        handedOver = true;
        return true;
    }

    /** The nodes read (after {@link #handOver}). */
    NodeTable.Builder table() {
        return table;
    }

    /** Where the nodes read start, as the tail's input counted them (after {@link #handOver}). */
    NodeLocations.Recorder locations() {
        return locations;
    }

    /** The number of nodes read. */
    int count() {
        return reader.count();
    }

    /** The input, standing on the end of the nodes array (after {@link #handOver}; the caller closes it). */
    JsonInput input() {
        return input;
    }

    /** Stops the tail (if it still runs) and waits for it; closes its input unless handed over. */
    @Override
    public void close() {
        cancelled = true;
        if (!handedOver) {
            // ends a read of the file in progress (the channel closes): the tail stops within a node
            thread.interrupt();
        }
        boolean interrupted = false;
        while (thread.isAlive()) {
            try {
                thread.join();
            } catch (InterruptedException e) {
                interrupted = true;
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        if (!handedOver) {
            closeQuietly(input);
        }
    }

    private void run() {
        try {
            input.startDocument("a circuit document");
            String m;
            do {
                // the members the first line repeats (values stand in for the document's)
                m = input.nextProperty();
            } while (m != null && !m.equals("nodes"));
            if (m == null || input.token() != JsonToken.START_ARRAY) {
                return;
            }
            while (!cancelled && input.nextElement()) {
                reader.readNext("/nodes");
                if (!findings.isEmpty()) {
                    return;
                }
            }
            clean = !cancelled;
        } catch (FormatException | RuntimeException e) {
            // the reader reads this part itself and reports what there is to report, where it is
        } catch (Error e) {
            error = e;
        } finally {
            done.countDown();
        }
    }

    /** Whether the file starts as UTF-8 JSON text would without a byte order mark (no zero in the first bytes). */
    private static boolean startsAsUtf8(FileChannel ch) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(4);
        ch.read(b, 0);
        for (int i = 0; i < b.position(); i++) {
            int c = b.get(i) & 0xff;
            if (c == 0 || c >= 0x80) {
                return false;
            }
        }
        return true;
    }

    /**
     * The first <code>{</code> at or after {@code from} that follows a comma after a <code>}</code> (spaces
     * and line breaks between them allowed), as between two nodes: its offset, or -1 within
     * {@link #SCAN_BYTES}.
     */
    private static long objectAfterComma(FileChannel ch, long from) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(SCAN_BYTES);
        int n = Math.max(ch.read(b, from), 0);
        for (int i = 0; i < n; i++) {
            if (b.get(i) == '{' && before(b, before(b, i, ','), '}') >= 0) {
                return from + i;
            }
        }
        return -1;
    }

    /** The position of the last byte before {@code i} that is not white space if it is {@code c}, else -1. */
    private static int before(ByteBuffer b, int i, char c) {
        int j = i - 1;
        while (j >= 0 && (b.get(j) == ' ' || b.get(j) == '\t' || b.get(j) == '\n' || b.get(j) == '\r')) {
            j--;
        }
        return j >= 0 && b.get(j) == c ? j : -1;
    }

    /** The tail's first line: the document's members so far, then the opening of the nodes array. */
    static byte[] prefix(List<String> membersBefore) {
        StringBuilder sb = new StringBuilder("{");
        for (String m : membersBefore) {
            sb.append('"');
            for (int i = 0; i < m.length(); i++) {
                char c = m.charAt(i);
                if (c == '"' || c == '\\' || c < 0x20 || c >= 0x7f) {
                    // escaped, so that the name is the same whatever it holds (lone surrogates included)
                    sb.append(String.format(java.util.Locale.ROOT, "\\u%04x", (int) c));
                } else {
                    sb.append(c);
                }
            }
            sb.append("\":0,");
        }
        sb.append("\"nodes\":[\n");
        return sb.toString().getBytes(StandardCharsets.US_ASCII);
    }

    private static void closeQuietly(JsonInput in) {
        try {
            in.close();
        } catch (FormatException ignored) {
            // nothing read from it is kept
        }
    }
}
