package dev.circa.model;

import dev.circa.format.certificate.CertificateWriter;
import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.security.MessageDigest;
import java.util.HexFormat;

/**
 * The stored bytes of a file on their way to the reader, hashed (SHA-256) and counted as they pass, so
 * a certified load needs no second pass. {@link #close()} leaves the file open: after the document,
 * {@link #finish(long)} hashes what remains (whitespace, a gzip trailer) and closes it.
 */
final class DigestingInputStream extends FilterInputStream {
    private final MessageDigest digest = CertificateWriter.newSha256();
    private long count;
    private String hex;

    DigestingInputStream(InputStream stored) {
        super(stored);
    }

    @Override
    public int read() throws IOException {
        int b = in.read();
        if (b >= 0) {
            digest.update((byte) b);
            count++;
        }
        return b;
    }

    @Override
    public int read(byte[] b, int off, int len) throws IOException {
        int n = in.read(b, off, len);
        if (n > 0) {
            digest.update(b, off, n);
            count += n;
        }
        return n;
    }

    @Override
    public long skip(long n) throws IOException {
        byte[] buf = new byte[8192];
        long done = 0;
        while (done < n) {
            int r = read(buf, 0, (int) Math.min(buf.length, n - done));
            if (r < 0) {
                break;
            }
            done += r;
        }
        return done;
    }

    @Override
    public boolean markSupported() {
        return false;
    }

    @Override
    public void mark(int limit) {
        // not supported: every byte is hashed once, in order
    }

    @Override
    public void reset() throws IOException {
        throw new IOException("reset is not supported while hashing");
    }

    /** Leaves the file open for {@link #finish(long)}; see {@link #abort()}. */
    @Override
    public void close() {
        // the reader is done with the document; the rest of the file is still to be hashed
    }

    /**
     * Hashes the rest of the file, stopping once more than {@code limit} bytes were seen in all (the
     * file then cannot match a certificate of {@code limit} bytes), and closes it.
     */
    void finish(long limit) throws IOException {
        try {
            byte[] buf = new byte[65536];
            while (count <= limit && read(buf, 0, buf.length) >= 0) {
                // hashed by read
            }
        } finally {
            in.close();
        }
    }

    /** Closes the file without hashing the rest. */
    void abort() {
        try {
            in.close();
        } catch (IOException ignored) {
            // the read already failed with its own message
        }
    }

    /** Bytes seen so far. */
    long count() {
        return count;
    }

    /** SHA-256 of the bytes seen, lower-case hex (ends the hashing). */
    String sha256() {
        if (hex == null) {
            hex = HexFormat.of().formatHex(digest.digest());
        }
        return hex;
    }
}
