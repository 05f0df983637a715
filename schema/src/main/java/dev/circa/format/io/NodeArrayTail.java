package dev.circa.format.io;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Reads the second half of a large circuit's {@code nodes} array on another thread, while the
 * document's reader reads the first half: the read of a large file takes both cores.
 *
 * <p>The split is a guess checked afterwards. When the reader reaches the nodes array, the tail picks a
 * <code>{</code> near the middle of what is left of the file that follows <code>},</code> (as a node
 * follows another) and reads nodes from there with a {@link NodeScanner} of its own, into a table of
 * its own, counting lines from that brace. The guess holds only if the reader, going on node by node,
 * meets a node that starts at exactly that byte: the bytes from there on are then nodes of the same
 * array. The reader then takes the tail's nodes, lines and columns moved to the file's, and goes on
 * after the array's end. In every other case the reader reads on by itself, as it would have without
 * a tail: when it passes the byte or ends the nodes array without meeting it, or when the tail stopped
 * before the end of the array (a node left to the parser: something to report, or a form the scanner
 * does not read), since what the reader reports must not depend on the split. Used by one reading thread.
 */
final class NodeArrayTail extends NodeScanThread {
    /** Files smaller than this are read by one thread (a second thread costs more than it saves). */
    static final long MIN_BYTES = 8L << 20;
    /** How far past the middle the start of a node is looked for. */
    private static final int SCAN_BYTES = 1 << 16;

    private final long braceOffset;
    /** Whether the tail read its nodes up to the end of the array. */
    private volatile boolean clean;
    /** SHA-256 of the bytes read, when the tail hashes ({@link #digest()}). */
    private volatile byte[] digest;
    /** Where the array ends, in the file's lines and columns (after {@link #handOver}). */
    private int endLine;
    private int endColumn;

    private NodeArrayTail(long braceOffset, FileChannel channel, ReadLimits limits, long size) {
        // the tail counts lines from its brace, as line 2 (the line after a first line of its own), column 1
        super(channel, braceOffset, 1, limits, size, "circa-read-tail");
        this.braceOffset = braceOffset;
    }

    /**
     * Starts reading the second half of the nodes array of {@code file} (of {@code size} bytes, read
     * as stored), or returns {@code null} when nothing near the middle looks like a node's start.
     *
     * @param nodesOffset the byte offset of the nodes array's <code>[</code>
     */
    static NodeArrayTail start(Path file, long size, long nodesOffset, ReadLimits limits) {
        return start(file, size, nodesOffset, limits, false);
    }

    /**
     * The same; with {@code hash}, the tail also takes the SHA-256 digest of the bytes it reads, from its
     * brace to the array's end ({@link #digest()}), so that a reader of the same file as a stream can check
     * that the tail read the bytes it passes over.
     */
    static NodeArrayTail start(Path file, long size, long nodesOffset, ReadLimits limits, boolean hash) {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            long brace = objectAfterComma(ch, nodesOffset + (size - nodesOffset) / 2);
            if (brace < 0) {
                return null;
            }
            NodeArrayTail tail = new NodeArrayTail(brace, FileChannel.open(file, StandardOpenOption.READ), limits, size);
            if (hash) {
                tail.scanner.hashTaken(dev.circa.format.certificate.CertificateWriter.newSha256());
            }
            tail.startThread();
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
     * {@code nodesBefore}, hands it over: its end is then known in the file's lines and columns.
     *
     * @param line the line of the node the reader met at {@link #nodeOffset()}
     * @param column its column
     * @return whether the tail holds (its table and locations are then the reader's to take)
     */
    boolean handOver(int line, int column, int nodesBefore, long maxNodes) {
        await("the second half");
        if (!clean || (long) nodesBefore + scanner.count() > maxNodes) {
            return false;
        }
        // the tail counted lines from its brace as line 2, column 1
        endLine = stopLine(line);
        endColumn = stopColumn(column);
        return true;
    }

    /** The file offset of the nodes array's <code>]</code> (after {@link #handOver}). */
    long endOffset() {
        return scanner.offset();
    }

    /** The file's line of the array's end (after {@link #handOver}). */
    int endLine() {
        return endLine;
    }

    /** The file's column of the array's end (after {@link #handOver}). */
    int endColumn() {
        return endColumn;
    }

    /** The digest of the bytes read, from the brace to the array's end (after a clean {@link #handOver}, with hashing). */
    byte[] digest() {
        return digest;
    }

    @Override
    protected void scan() {
        clean = scanner.scan(Long.MAX_VALUE, false) == NodeScanner.End.ARRAY_END;
        if (clean) {
            digest = scanner.takenDigest();
        }
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
}
