package dev.circa.format.io;

import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.OutputStream;

/** Passes writes through and flushes on close, leaving the caller's stream open (for generators and zip streams). */
public final class NonClosingOutputStream extends FilterOutputStream {
    public NonClosingOutputStream(OutputStream out) {
        super(out);
    }

    @Override
    public void write(byte[] b, int off, int len) throws IOException {
        out.write(b, off, len);
    }

    @Override
    public void close() throws IOException {
        flush();
    }
}
