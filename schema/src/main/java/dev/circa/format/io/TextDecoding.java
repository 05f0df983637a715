package dev.circa.format.io;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.Charset;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.Locale;

/**
 * Decodes a text input the way the JSON reader does (RFC 8259 section 8.1, RFC 4627 section 3): UTF-8,
 * UTF-16 or UTF-32 in either byte order, with or without a byte-order mark. A mark decides; without
 * one, the pattern of zero bytes among the first four (text that starts with an ASCII character)
 * does; otherwise UTF-8. The mark is not part of the text. Malformed bytes are reported, never
 * replaced, at their own position: every character before them is read first. Used by the CSV and YAML
 * readers.
 */
public final class TextDecoding {
    private static final Charset UTF_32BE = Charset.forName("UTF-32BE");
    private static final Charset UTF_32LE = Charset.forName("UTF-32LE");

    private TextDecoding() {
    }

    /** A reader of {@code in} in its detected encoding, positioned after any byte-order mark. */
    public static Reader reader(InputStream in, String file) throws FormatException {
        InputStream b = in.markSupported() ? in : new BufferedInputStream(in);
        byte[] head = new byte[4];
        int n;
        try {
            b.mark(4);
            n = b.readNBytes(head, 0, 4);
            b.reset();
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, "cannot be read: " + e.getMessage());
        }
        Detected d = detect(head, n);
        try {
            b.skipNBytes(d.mark());
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, "cannot be read: " + e.getMessage());
        }
        return new StrictReader(b, d.charset());
    }

    /**
     * The encoding of a text that starts with the {@code n} bytes of {@code head} (at most 4 are looked
     * at), detected as {@link #reader} does; for readers that decode by themselves (Spark's).
     */
    public static Charset encoding(byte[] head, int n) {
        return detect(head, n).charset();
    }

    /** An encoding and the length of its byte-order mark (0 when there is none). */
    private record Detected(Charset charset, int mark) {
    }

    private static Detected detect(byte[] head, int n) {
        int skip = 0;
        Charset cs = StandardCharsets.UTF_8;
        int b0 = n > 0 ? head[0] & 0xff : -1;
        int b1 = n > 1 ? head[1] & 0xff : -1;
        int b2 = n > 2 ? head[2] & 0xff : -1;
        int b3 = n > 3 ? head[3] & 0xff : -1;
        if (b0 == 0 && b1 == 0 && b2 == 0xfe && b3 == 0xff) {
            cs = UTF_32BE;
            skip = 4;
        } else if (b0 == 0xff && b1 == 0xfe && b2 == 0 && b3 == 0) {
            cs = UTF_32LE;
            skip = 4;
        } else if (b0 == 0xef && b1 == 0xbb && b2 == 0xbf) {
            skip = 3;
        } else if (b0 == 0xfe && b1 == 0xff) {
            cs = StandardCharsets.UTF_16BE;
            skip = 2;
        } else if (b0 == 0xff && b1 == 0xfe) {
            cs = StandardCharsets.UTF_16LE;
            skip = 2;
        } else if (n == 4 && b0 == 0 && b1 == 0 && b2 == 0 && b3 != 0) {
            cs = UTF_32BE;
        } else if (n == 4 && b0 != 0 && b1 == 0 && b2 == 0 && b3 == 0) {
            cs = UTF_32LE;
        } else if (n >= 2 && b0 == 0 && b1 != 0) {
            cs = StandardCharsets.UTF_16BE;
        } else if (n >= 2 && b0 != 0 && b1 == 0) {
            cs = StandardCharsets.UTF_16LE;
        }
        return new Detected(cs, skip);
    }

    /**
     * Bytes that are not text in the detected encoding: the message names the encoding and the bytes.
     * A reader hands over every character before them first, so the reader's position (line, column)
     * is where they are.
     */
    public static final class MalformedTextException extends CharacterCodingException {
        private static final long serialVersionUID = 1L;
        private final String problem;

        MalformedTextException(String problem) {
            this.problem = problem;
        }

        @Override
        public String getMessage() {
            return problem;
        }
    }

    /**
     * Decodes with malformed input reported, never replaced, handing over the characters decoded before
     * a malformed sequence first and failing only on the next read (the JDK's stream decoder drops them
     * and fails at once, so the error would be located at the start of the caller's buffer).
     */
    private static final class StrictReader extends Reader {
        private final InputStream in;
        private final CharsetDecoder decoder;
        private final ByteBuffer bytes = ByteBuffer.allocate(1 << 14).flip();
        private boolean eof;
        private boolean flushed;
        private MalformedTextException pending;

        StrictReader(InputStream in, Charset cs) {
            this.in = in;
            this.decoder = cs.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT);
        }

        @Override
        public int read(char[] buf, int off, int len) throws IOException {
            if (len == 0) {
                return 0;
            }
            if (pending != null) {
                throw pending;
            }
            CharBuffer out = CharBuffer.wrap(buf, off, len);
            while (true) {
                CoderResult r = flushed ? CoderResult.UNDERFLOW : decoder.decode(bytes, out, eof);
                if (r.isError()) {
                    pending = malformed(r.length());
                    if (out.position() > off) {
                        return out.position() - off;
                    }
                    throw pending;
                }
                if (r.isOverflow()) {
                    return out.position() - off;
                }
                if (eof) {
                    if (!flushed && decoder.flush(out).isOverflow()) {
                        return out.position() - off;
                    }
                    flushed = true;
                    return out.position() > off ? out.position() - off : -1;
                }
                if (out.position() > off) {
                    return out.position() - off;
                }
                bytes.compact();
                int n = in.read(bytes.array(), bytes.arrayOffset() + bytes.position(), bytes.remaining());
                if (n < 0) {
                    eof = true;
                } else {
                    bytes.position(bytes.position() + n);
                }
                bytes.flip();
            }
        }

        private MalformedTextException malformed(int length) {
            StringBuilder sb = new StringBuilder(length == 1 ? "byte" : "bytes");
            for (int i = 0; i < length; i++) {
                sb.append(String.format(Locale.ROOT, " 0x%02X", bytes.get(bytes.position() + i) & 0xff));
            }
            return new MalformedTextException(sb.append(length == 1 ? " is" : " are").append(" not ")
                    .append(decoder.charset().name()).append(" text").toString());
        }

        @Override
        public void close() throws IOException {
            in.close();
        }
    }
}
