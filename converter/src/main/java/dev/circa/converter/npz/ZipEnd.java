package dev.circa.converter.npz;

import dev.circa.format.io.FormatException;
import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.Locale;

/**
 * The end of a zip archive: its end-of-central-directory record (signature, fixed fields and a
 * comment of the length it states) must be the last bytes of the file. Anything after it is
 * trailing garbage, which {@link java.util.zip.ZipFile} and {@link java.util.zip.ZipInputStream}
 * would ignore; here it is a {@link FormatException} naming the byte offset.
 */
final class ZipEnd {
    /** The end record's fixed length and its longest comment: the record lies in this many final bytes. */
    static final int TAIL = 22 + 0xffff;
    private static final int SIGNATURE = 0x06054b50;

    private ZipEnd() {
    }

    /** Checks the end of the archive file at {@code path}. */
    static void check(Path path, String file) throws IOException {
        try (FileChannel ch = FileChannel.open(path, StandardOpenOption.READ)) {
            long size = ch.size();
            int n = (int) Math.min(size, TAIL);
            ByteBuffer b = ByteBuffer.allocate(n);
            long at = size - n;
            while (b.hasRemaining()) {
                if (ch.read(b, at + b.position()) < 0) {
                    break;
                }
            }
            check(b.array(), b.position(), size, file);
        }
    }

    /**
     * Checks the last {@code n} bytes of an archive of {@code size} bytes, held in {@code tail[0..n)}.
     *
     * @throws FormatException when no end record ends exactly at the end of the file
     */
    static void check(byte[] tail, int n, long size, String file) throws FormatException {
        long tailStart = size - n;
        long lastEnd = -1;
        for (int i = n - 22; i >= 0; i--) {
            if (int32(tail, i) == SIGNATURE) {
                int commentLength = (tail[i + 20] & 0xff) | (tail[i + 21] & 0xff) << 8;
                long end = tailStart + i + 22 + commentLength;
                if (end == size) {
                    return;
                }
                if (end < size) {
                    lastEnd = Math.max(lastEnd, end);
                }
            }
        }
        if (lastEnd < 0) {
            throw new FormatException(file, 0, 0, null, "not an .npz archive: the zip end-of-directory record is missing"
                    + " (a truncated or damaged file)");
        }
        throw new FormatException(file, 0, 0, null, String.format(Locale.ROOT,
                "unexpected %d bytes after the end of the zip archive at byte %d; expected the end of the file",
                size - lastEnd, lastEnd));
    }

    private static int int32(byte[] b, int i) {
        return (b[i] & 0xff) | (b[i + 1] & 0xff) << 8 | (b[i + 2] & 0xff) << 16 | (b[i + 3] & 0xff) << 24;
    }

    /** Passes a stream through, keeping its last {@link #TAIL} bytes and its length for {@link #check}. */
    static final class Keeper extends FilterInputStream {
        private final byte[] ring = new byte[TAIL];
        private long total;

        Keeper(InputStream in) {
            super(in);
        }

        @Override
        public int read() throws IOException {
            int b = super.read();
            if (b >= 0) {
                ring[(int) (total % TAIL)] = (byte) b;
                total++;
            }
            return b;
        }

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            int r = super.read(b, off, len);
            for (int i = 0; i < r; i++) {
                ring[(int) (total % TAIL)] = b[off + i];
                total++;
            }
            return r;
        }

        /** Reads to the end of the stream and checks the archive's end. */
        void drainAndCheck(String file) throws IOException {
            byte[] skip = new byte[1 << 16];
            while (read(skip, 0, skip.length) >= 0) {
                // the central directory was read through the entries already; only its end is checked
            }
            int n = (int) Math.min(total, TAIL);
            byte[] tail = new byte[n];
            for (int i = 0; i < n; i++) {
                tail[i] = ring[(int) ((total - n + i) % TAIL)];
            }
            check(tail, n, total, file);
        }
    }
}
