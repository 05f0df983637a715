package dev.circa.format.io;

import java.io.IOException;
import java.io.InputStream;

/**
 * An input stream that reads in blocks: its single-byte {@link #read()} is the block read of one byte,
 * through one reused buffer (no allocation per call).
 */
abstract class BulkReadInputStream extends InputStream {
    private final byte[] one = new byte[1];

    @Override
    public final int read() throws IOException {
        int n = read(one, 0, 1);
        return n < 0 ? -1 : one[0] & 0xff;
    }

    @Override
    public abstract int read(byte[] b, int off, int len) throws IOException;
}
