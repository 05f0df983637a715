package dev.circa.format.io;

import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;

/** Counts bytes read and fails with a {@link LimitExceededException} past {@code --max-bytes}. */
final class LimitedInputStream extends FilterInputStream {
    private final long limit;
    private final String file;
    private long count;

    LimitedInputStream(InputStream in, long limit, String file) {
        super(in);
        this.limit = limit;
        this.file = file;
    }

    @Override
    public int read() throws IOException {
        int b = super.read();
        if (b >= 0) {
            add(1);
        }
        return b;
    }

    @Override
    public int read(byte[] b, int off, int len) throws IOException {
        int n = super.read(b, off, len);
        if (n > 0) {
            add(n);
        }
        return n;
    }

    @Override
    public long skip(long n) throws IOException {
        long s = super.skip(n);
        add(s);
        return s;
    }

    private void add(long n) throws LimitExceededException {
        count += n;
        if (count > limit) {
            throw LimitExceededException.of(file, 0, 0, null, "the uncompressed size of the file",
                    ReadLimits.MAX_BYTES, limit);
        }
    }
}
