package dev.circa.format.io;

import java.io.IOException;
import java.io.InputStream;
import java.util.zip.CRC32;
import java.util.zip.DataFormatException;
import java.util.zip.Inflater;

/**
 * Decompresses a gzip file (RFC 1952) and requires it to be nothing but gzip members: one or more,
 * each with a valid header, deflate data, CRC-32 and length, up to the end of the file. Bytes after
 * the last member that do not start another one (garbage, NUL padding) are a {@link FormatException}
 * naming their byte offset, where {@link java.util.zip.GZIPInputStream} would silently ignore them.
 */
final class GzipMembersInputStream extends BulkReadInputStream {
    private static final int MAGIC_1 = 0x1f;
    private static final int MAGIC_2 = 0x8b;
    private static final int DEFLATE = 8;
    private static final int FHCRC = 2;
    private static final int FEXTRA = 4;
    private static final int FNAME = 8;
    private static final int FCOMMENT = 16;
    private static final int RESERVED_FLAGS = 0xe0;

    private final InputStream in;
    private final String file;
    private final byte[] buf = new byte[1 << 16];
    private final Inflater inflater = new Inflater(true);
    private final CRC32 crc = new CRC32();
    /** Valid bytes of {@link #buf} are {@code [pos, end)}. */
    private int pos;
    private int end;
    /** Compressed bytes consumed before {@code buf[0]}. */
    private long bufStart;
    private long memberBytes;
    private boolean done;

    private GzipMembersInputStream(InputStream in, String file) {
        this.in = in;
        this.file = file;
    }

    /**
     * Opens the first member.
     *
     * @throws FormatException when the file does not start with a gzip header
     */
    static GzipMembersInputStream open(InputStream in, String file) throws IOException {
        GzipMembersInputStream g = new GzipMembersInputStream(in, file);
        int b1 = g.byteOrEnd();
        int b2 = b1 < 0 ? -1 : g.byteOrEnd();
        if (b1 != MAGIC_1 || b2 != MAGIC_2) {
            throw new FormatException(file, 0, 0, null, "the name ends in .gz but the file is not gzip-compressed");
        }
        g.header();
        return g;
    }

    @Override
    public int read(byte[] b, int off, int len) throws IOException {
        if (len == 0) {
            return 0;
        }
        while (!done) {
            int n;
            try {
                n = inflater.inflate(b, off, len);
            } catch (DataFormatException e) {
                throw corrupt("the compressed data is damaged (" + e.getMessage() + ")");
            }
            if (n > 0) {
                crc.update(b, off, n);
                memberBytes += n;
                return n;
            }
            if (inflater.finished()) {
                pos = end - inflater.getRemaining();
                trailer();
                nextMemberOrEnd();
                continue;
            }
            if (inflater.needsDictionary()) {
                throw corrupt("the compressed data asks for a preset dictionary, which gzip does not allow");
            }
            if (inflater.needsInput()) {
                if (!fill()) {
                    throw corrupt("the file ends inside the compressed data (is it truncated?)");
                }
                inflater.setInput(buf, pos, end - pos);
                pos = end;
            }
        }
        return -1;
    }

    @Override
    public void close() throws IOException {
        inflater.end();
        in.close();
    }

    private void header() throws IOException {
        if (byteOrFail() != DEFLATE) {
            throw corrupt("the gzip header names a compression method other than deflate");
        }
        int flags = byteOrFail();
        if ((flags & RESERVED_FLAGS) != 0) {
            throw corrupt("the gzip header sets reserved flags");
        }
        skip(6); // modification time, extra flags, operating system
        if ((flags & FEXTRA) != 0) {
            int len = byteOrFail() | (byteOrFail() << 8);
            skip(len);
        }
        if ((flags & FNAME) != 0) {
            skipZeroTerminated();
        }
        if ((flags & FCOMMENT) != 0) {
            skipZeroTerminated();
        }
        if ((flags & FHCRC) != 0) {
            skip(2);
        }
        inflater.reset();
        crc.reset();
        memberBytes = 0;
        inflater.setInput(buf, pos, end - pos);
        pos = end;
    }

    private void trailer() throws IOException {
        long expectedCrc = uint32();
        long expectedSize = uint32();
        if (expectedCrc != crc.getValue()) {
            throw corrupt("the CRC-32 of the decompressed data does not match the gzip trailer (the file is damaged)");
        }
        if (expectedSize != (memberBytes & 0xffffffffL)) {
            throw corrupt("the length of the decompressed data does not match the gzip trailer (the file is damaged)");
        }
    }

    private void nextMemberOrEnd() throws IOException {
        long at = offset();
        int b1 = byteOrEnd();
        if (b1 < 0) {
            done = true;
            return;
        }
        int b2 = byteOrEnd();
        if (b1 != MAGIC_1 || b2 != MAGIC_2) {
            throw new FormatException(file, 0, 0, null, String.format(java.util.Locale.ROOT,
                    "unexpected bytes after the end of the gzip data at byte %d; expected the end of the file"
                            + " or another gzip member", at));
        }
        header();
    }

    private long offset() {
        return bufStart + pos;
    }

    private FormatException corrupt(String problem) {
        return new FormatException(file, 0, 0, null, problem + " near byte " + offset());
    }

    private long uint32() throws IOException {
        long v = 0;
        for (int i = 0; i < 4; i++) {
            v |= (long) byteOrFail() << (8 * i);
        }
        return v;
    }

    private void skip(int n) throws IOException {
        for (int i = 0; i < n; i++) {
            byteOrFail();
        }
    }

    private void skipZeroTerminated() throws IOException {
        while (byteOrFail() != 0) {
            // the name or comment is not needed
        }
    }

    private int byteOrFail() throws IOException {
        int b = byteOrEnd();
        if (b < 0) {
            throw corrupt("the file ends inside a gzip header or trailer (is it truncated?)");
        }
        return b;
    }

    private int byteOrEnd() throws IOException {
        if (pos == end && !fill()) {
            return -1;
        }
        return buf[pos++] & 0xff;
    }

    /** Refills the buffer once all of it has been consumed; false at the end of the file. */
    private boolean fill() throws IOException {
        bufStart += end;
        pos = 0;
        end = 0;
        int n = in.read(buf, 0, buf.length);
        while (n == 0) {
            n = in.read(buf, 0, buf.length);
        }
        if (n < 0) {
            return false;
        }
        end = n;
        return true;
    }
}
