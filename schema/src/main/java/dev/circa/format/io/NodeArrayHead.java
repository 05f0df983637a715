package dev.circa.format.io;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Reads the first half of a large circuit's {@code nodes} array on another thread from the moment the
 * file is opened, while the document's reader is still setting up its parser and reading the members
 * before the nodes: with {@link NodeArrayTail} on the second half, both halves start at once and the
 * reader's own start-up costs no scanning time.
 *
 * <p>Where the array starts is a guess checked afterwards, as the tail's split is: the first
 * {@code "nodes"} member name (after <code>{</code> or a comma) followed by a colon and a <code>[</code>
 * within the file's first {@value #SEARCH_BYTES} bytes. The head reads nodes from there with a
 * {@link NodeScanner} of its own, into a table of its own, counting lines from that bracket, until it
 * meets the tail's node ({@link #meet}), ends the array, or meets a node it leaves to the parser. The
 * reader takes what it read only when its parser finds the {@code nodes} array at exactly that bracket;
 * it then goes on from where the head stopped as it would have from its own scanner. Otherwise the head
 * is dropped unheard. Used by one reading thread.
 */
final class NodeArrayHead extends NodeScanThread {
    /** How far into the file the nodes array's start is looked for. */
    static final int SEARCH_BYTES = 4 << 20;

    private final long bracketOffset;
    private volatile NodeScanner.End end;
    private boolean taken;

    private NodeArrayHead(long bracketOffset, FileChannel channel, ReadLimits limits, long size, long meet) {
        // lines counted from the bracket as line 2, column 1 (the line after a first line of its own)
        super(channel, bracketOffset + 1, 2, limits, size, "circa-read-head");
        this.bracketOffset = bracketOffset;
        scanner.meet(meet);
    }

    /**
     * Starts reading the nodes of {@code file} (of {@code size} bytes, read as stored) from the array's
     * guessed start up to the node at {@code meet}, or returns {@code null} when no start is found.
     */
    static NodeArrayHead start(Path file, long size, long meet, ReadLimits limits) {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            long bracket = nodesBracket(ch, (int) Math.min(size, SEARCH_BYTES));
            if (bracket < 0) {
                return null;
            }
            NodeArrayHead head = new NodeArrayHead(bracket, FileChannel.open(file, StandardOpenOption.READ), limits, size, meet);
            head.startThread();
            return head;
        } catch (IOException e) {
            // the file cannot be opened a second time: the reader reads it alone
            return null;
        }
    }

    /** The byte offset of the bracket the head started after. */
    long bracketOffset() {
        return bracketOffset;
    }

    /** Makes the head stop at the node that starts at {@code offset} (if it has not passed it yet). */
    void meet(long offset) {
        scanner.meet(offset);
    }

    /** Marks what the head read as taken by the reader. */
    void take() {
        taken = true;
    }

    /** Whether the reader took what the head read. */
    boolean taken() {
        return taken;
    }

    /** Waits for the head: how its scan ended. */
    NodeScanner.End await() {
        await("the first half");
        return end;
    }

    @Override
    protected void scan() {
        end = scanner.scan(true);
    }

    /**
     * The offset of the <code>[</code> after the first {@code "nodes"} that follows <code>{</code> or a
     * comma and is followed by a colon (white space allowed between them all) in the first {@code n}
     * bytes, or -1.
     */
    static long nodesBracket(FileChannel ch, int n) throws IOException {
        // most headers are small: the first quarter megabyte, then four times more, up to n
        for (int window = Math.min(n, 1 << 18); ; window = Math.min(n, window * 4)) {
            ByteBuffer b = ByteBuffer.allocate(window);
            while (b.hasRemaining() && ch.read(b, b.position()) > 0) {
                // reads on
            }
            long at = nodesBracket(b.array(), b.position());
            if (at >= 0 || window == n || b.hasRemaining()) {
                return at;
            }
        }
    }

    private static long nodesBracket(byte[] a, int len) {
        byte[] name = {'"', 'n', 'o', 'd', 'e', 's', '"'};
        for (int i = 0; i + name.length <= len; i++) {
            if (a[i] != '"' || a[i + 1] != 'n' || !matches(a, i, name)) {
                continue;
            }
            int before = i - 1;
            while (before >= 0 && space(a[before])) {
                before--;
            }
            if (before < 0 || (a[before] != '{' && a[before] != ',')) {
                continue;
            }
            int j = skipSpace(a, i + name.length, len);
            if (j < len && a[j] == ':') {
                j = skipSpace(a, j + 1, len);
                if (j < len && a[j] == '[') {
                    return j;
                }
            }
        }
        return -1;
    }

    private static boolean matches(byte[] a, int at, byte[] name) {
        for (int k = 0; k < name.length; k++) {
            if (a[at + k] != name[k]) {
                return false;
            }
        }
        return true;
    }

    private static int skipSpace(byte[] a, int i, int len) {
        while (i < len && space(a[i])) {
            i++;
        }
        return i;
    }

    private static boolean space(byte c) {
        return c == ' ' || c == '\t' || c == '\n' || c == '\r';
    }
}
