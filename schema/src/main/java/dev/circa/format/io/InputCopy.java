package dev.circa.format.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * An input that can be read only once (standard input, a pipe such as {@code <(cat f)}, a FIFO), made
 * readable as often as a file: what the first reader takes from the source is copied into a temporary
 * file as it goes, so that every later reader gets the same bytes from the start, and the source is
 * read on only when a reader goes past what has been copied. Readers are sequential streams; the
 * copy grows with what is read and nothing more is held in memory than a buffer.
 */
final class InputCopy {
    private static final int CHUNK = 1 << 16;

    private final InputStream source;
    private final Path copy;
    private final FileChannel channel;
    private long length;
    private boolean ended;

    private InputCopy(InputStream source, Path copy, FileChannel channel) {
        this.source = source;
        this.copy = copy;
        this.channel = channel;
    }

    /** Starts copying {@code source}; the temporary file is removed at exit (or by {@link #discard}). */
    static InputCopy of(InputStream source) throws IOException {
        Path copy = Files.createTempFile("circa-input-", ".copy");
        ScratchFiles.register(copy);
        FileChannel ch = FileChannel.open(copy, StandardOpenOption.READ, StandardOpenOption.WRITE);
        return new InputCopy(source, copy, ch);
    }

    /** The source this copy reads from. */
    InputStream source() {
        return source;
    }

    /** A new reader from the first byte. */
    InputStream newReader() {
        return new Reader();
    }

    /** Closes and removes the copy (the source stays open: standard input belongs to the process). */
    synchronized void discard() {
        try {
            channel.close();
        } catch (IOException e) {
            // removing the file is what matters
        }
        ScratchFiles.remove(copy);
    }

    /** Reads up to {@code len} bytes at {@code pos} into {@code b}, taking more from the source when needed. */
    private synchronized int readAt(long pos, byte[] b, int off, int len) throws IOException {
        while (pos >= length && !ended) {
            byte[] buf = new byte[CHUNK];
            int n = source.read(buf);
            if (n < 0) {
                ended = true;
            } else if (n > 0) {
                ByteBuffer bb = ByteBuffer.wrap(buf, 0, n);
                while (bb.hasRemaining()) {
                    channel.write(bb, length + bb.position());
                }
                length += n;
            }
        }
        if (pos >= length) {
            return -1;
        }
        int want = (int) Math.min(len, length - pos);
        return channel.read(ByteBuffer.wrap(b, off, want), pos);
    }

    private final class Reader extends BulkReadInputStream {
        private long pos;

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            if (len == 0) {
                return 0;
            }
            int n = readAt(pos, b, off, len);
            if (n > 0) {
                pos += n;
            }
            return n;
        }
    }
}
