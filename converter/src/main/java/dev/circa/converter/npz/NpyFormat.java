package dev.circa.converter.npz;

import dev.circa.format.io.FormatException;
import java.io.ByteArrayOutputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.Locale;

/**
 * The NumPy {@code .npy} file format, versions 1.0, 2.0 and 3.0: the magic string
 * {@code \x93NUMPY}, a major and a minor version byte, a little-endian header length (2 bytes in
 * version 1, 4 bytes in versions 2 and 3), a header holding a Python dict literal with exactly the
 * keys {@code descr}, {@code fortran_order} and {@code shape} (Latin-1 text in versions 1 and 2,
 * UTF-8 in version 3), then the raw values.
 *
 * <p>Supported dtypes: {@code <f8 >f8 <f4 >f4}, the integers {@code i2 i4 i8 u2 u4 u8} in either
 * byte order, and the one-byte {@code |i1 |u1 |b1}. An integer that a double cannot hold exactly is an
 * error. The header parser accepts the literal syntax NumPy writes (quoted strings, {@code True},
 * {@code False}, tuples of non-negative integers, optional trailing commas) and nothing else.
 * Stateless.
 */
public final class NpyFormat {
    /** Bytes allowed in one header (NumPy's own headers are a few hundred bytes). */
    public static final int MAX_HEADER_BYTES = 1 << 16;

    private static final byte[] MAGIC = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y'};

    private NpyFormat() {
    }

    /**
     * Reads one array from {@code in}, which must end right after its values.
     *
     * @param name the array's name for the result and for messages
     * @param file the file for messages
     * @param maxBytes the most bytes the array may take (header and values)
     * @throws FormatException naming the array and what is wrong
     */
    public static NpyArray read(InputStream in, String name, String file, long maxBytes) throws FormatException {
        try {
            return readArray(in, name, file, maxBytes);
        } catch (EOFException e) {
            throw problem(file, name, "the file ends early (truncated)");
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw problem(file, name, "cannot be read: " + e.getMessage());
        }
    }

    private static NpyArray readArray(InputStream in, String name, String file, long maxBytes) throws IOException {
        byte[] lead = readFully(in, 8);
        for (int i = 0; i < MAGIC.length; i++) {
            if (lead[i] != MAGIC[i]) {
                throw problem(file, name, "not a .npy array: it does not start with the NumPy magic string \\x93NUMPY");
            }
        }
        int major = lead[6] & 0xff;
        int minor = lead[7] & 0xff;
        if (minor != 0 || major < 1 || major > 3) {
            throw problem(file, name, "unsupported .npy format version " + major + "." + minor
                    + "; expected 1.0, 2.0 or 3.0");
        }
        long headerLength;
        int prefix;
        if (major == 1) {
            byte[] l = readFully(in, 2);
            headerLength = (l[0] & 0xff) | (l[1] & 0xff) << 8;
            prefix = 10;
        } else {
            byte[] l = readFully(in, 4);
            headerLength = (l[0] & 0xffL) | (l[1] & 0xffL) << 8 | (l[2] & 0xffL) << 16 | (l[3] & 0xffL) << 24;
            prefix = 12;
        }
        if (headerLength > MAX_HEADER_BYTES) {
            throw problem(file, name, String.format(Locale.ROOT,
                    "the header is %d bytes long; expected at most %d", headerLength, MAX_HEADER_BYTES));
        }
        byte[] hb = readFully(in, (int) headerLength);
        String text;
        if (major == 3) {
            try {
                text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                        .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(hb)).toString();
            } catch (CharacterCodingException e) {
                throw problem(file, name, "the version 3.0 header is not valid UTF-8");
            }
        } else {
            text = new String(hb, StandardCharsets.ISO_8859_1);
        }
        Header h = new HeaderParser(text, file, name).parse();
        Dtype dt = Dtype.parse(h.descr, file, name);
        long count = 1;
        for (int d : h.shape) {
            count = multiply(count, d, file, name);
        }
        if (count > Integer.MAX_VALUE - 8) {
            throw problem(file, name, "shape " + NpyArray.shapeText(h.shape) + " has " + count
                    + " values; at most " + (Integer.MAX_VALUE - 8) + " are supported");
        }
        long dataBytes = multiply(count, dt.size, file, name);
        if (prefix + headerLength + dataBytes > maxBytes) {
            throw problem(file, name, String.format(Locale.ROOT,
                    "shape %s of %s needs %d bytes of values but the entry holds at most %d",
                    NpyArray.shapeText(h.shape), h.descr, dataBytes, Math.max(0, maxBytes - prefix - headerLength)));
        }
        double[] raw = readValues(in, dt, (int) count, file, name);
        if (in.read() != -1) {
            throw problem(file, name, "there are bytes after the " + count + " values that shape "
                    + NpyArray.shapeText(h.shape) + " holds");
        }
        double[] values = h.fortranOrder && h.shape.length > 1 ? fortranToRowMajor(raw, h.shape) : raw;
        return new NpyArray(name, h.descr, h.shape, h.fortranOrder, values);
    }

    private static long multiply(long a, long b, String file, String name) throws FormatException {
        try {
            return Math.multiplyExact(a, b);
        } catch (ArithmeticException e) {
            throw problem(file, name, "the shape is too large");
        }
    }

    /** Values are read into an array that grows as they arrive, from at most this many: a header never decides an allocation. */
    private static final int FIRST_CHUNK = 1 << 16;

    /**
     * Reads {@code count} values. The array grows (doubling) as values really arrive, so a shape or an
     * entry size that claims more than the archive holds costs no more memory than the archive's own bytes.
     */
    private static double[] readValues(InputStream in, Dtype dt, int count, String file, String name) throws IOException {
        byte[] buf = new byte[dt.size * 8192];
        ByteBuffer bb = ByteBuffer.wrap(buf).order(dt.order);
        double[] out = new double[Math.min(count, FIRST_CHUNK)];
        int done = 0;
        while (done < count) {
            int n = Math.min(8192, count - done);
            int bytes = n * dt.size;
            int got = 0;
            while (got < bytes) {
                int r = in.read(buf, got, bytes - got);
                if (r < 0) {
                    throw problem(file, name, "the values end early: " + (done + got / dt.size) + " of " + count
                            + " read (truncated)");
                }
                got += r;
            }
            if (done + n > out.length) {
                out = java.util.Arrays.copyOf(out, (int) Math.min(count, Math.max(done + n, 2L * out.length)));
            }
            for (int i = 0; i < n; i++) {
                out[done + i] = dt.get(bb, i * dt.size, done + i, file, name);
            }
            done += n;
        }
        return out;
    }

    /** Reorders values stored with the first axis varying fastest into row-major order. */
    static double[] fortranToRowMajor(double[] f, int[] shape) {
        int rank = shape.length;
        long[] stride = new long[rank];
        long s = 1;
        for (int a = rank - 1; a >= 0; a--) {
            stride[a] = s;
            s *= shape[a];
        }
        double[] c = new double[f.length];
        int[] idx = new int[rank];
        long pos = 0;
        for (int k = 0; k < f.length; k++) {
            c[(int) pos] = f[k];
            for (int a = 0; a < rank; a++) {
                idx[a]++;
                pos += stride[a];
                if (idx[a] < shape[a]) {
                    break;
                }
                pos -= stride[a] * shape[a];
                idx[a] = 0;
            }
        }
        return c;
    }

    /**
     * Writes {@code array} as a version 1.0 {@code .npy} file of dtype {@code <f8} in C order
     * (version 2.0 when the header does not fit in version 1.0), header padded to a multiple of 64 bytes.
     */
    public static void write(NpyArray array, OutputStream out) throws IOException {
        String dict = "{'descr': '<f8', 'fortran_order': False, 'shape': " + array.shapeText() + ", }";
        int major = 1;
        int prefix = 10;
        int total = prefix + dict.length() + 1;
        int padded = (total + 63) / 64 * 64;
        if (padded - prefix > 0xffff) {
            major = 2;
            prefix = 12;
            total = prefix + dict.length() + 1;
            padded = (total + 63) / 64 * 64;
        }
        int headerLength = padded - prefix;
        StringBuilder sb = new StringBuilder(headerLength).append(dict);
        while (sb.length() < headerLength - 1) {
            sb.append(' ');
        }
        sb.append('\n');
        ByteArrayOutputStream head = new ByteArrayOutputStream(padded);
        head.write(MAGIC);
        head.write(major);
        head.write(0);
        head.write(headerLength & 0xff);
        head.write((headerLength >>> 8) & 0xff);
        if (major == 2) {
            head.write((headerLength >>> 16) & 0xff);
            head.write((headerLength >>> 24) & 0xff);
        }
        head.write(sb.toString().getBytes(StandardCharsets.ISO_8859_1));
        head.writeTo(out);
        byte[] buf = new byte[8 * 8192];
        ByteBuffer bb = ByteBuffer.wrap(buf).order(ByteOrder.LITTLE_ENDIAN);
        int n = array.size();
        for (int done = 0; done < n; ) {
            int m = Math.min(8192, n - done);
            for (int i = 0; i < m; i++) {
                bb.putDouble(i * 8, array.value(done + i));
            }
            out.write(buf, 0, m * 8);
            done += m;
        }
    }

    private static byte[] readFully(InputStream in, int n) throws IOException {
        byte[] b = in.readNBytes(n);
        if (b.length < n) {
            throw new EOFException();
        }
        return b;
    }

    static FormatException problem(String file, String name, String what) {
        return new FormatException(file, 0, 0, null, "array " + name + ": " + what);
    }

    /** The parsed header dict. */
    private record Header(String descr, boolean fortranOrder, int[] shape) {
    }

    /** A supported dtype. */
    private record Dtype(char kind, int size, ByteOrder order) {
        static Dtype parse(String descr, String file, String name) throws FormatException {
            String expected = "; supported dtypes are <f8 >f8 <f4 >f4, i2 i4 i8 u2 u4 u8 with < or >, and |i1 |u1 |b1";
            if (descr.length() < 3) {
                throw problem(file, name, "unsupported dtype '" + descr + "'" + expected);
            }
            char bo = descr.charAt(0);
            char kind = descr.charAt(1);
            String sz = descr.substring(2);
            int size = switch (sz) {
                case "1" -> 1;
                case "2" -> 2;
                case "4" -> 4;
                case "8" -> 8;
                default -> -1;
            };
            boolean ok = switch (kind) {
                case 'f' -> size == 4 || size == 8;
                case 'i', 'u' -> size > 0;
                case 'b' -> size == 1;
                default -> false;
            };
            boolean orderOk = size == 1 ? bo == '|' : bo == '<' || bo == '>';
            if (!ok || !orderOk) {
                throw problem(file, name, "unsupported dtype '" + descr + "'" + expected);
            }
            return new Dtype(kind, size, bo == '>' ? ByteOrder.BIG_ENDIAN : ByteOrder.LITTLE_ENDIAN);
        }

        double get(ByteBuffer bb, int at, int index, String file, String name) throws FormatException {
            switch (kind) {
                case 'f':
                    return size == 8 ? bb.getDouble(at) : bb.getFloat(at);
                case 'b': {
                    byte v = bb.get(at);
                    if (v != 0 && v != 1) {
                        throw problem(file, name, "value " + index + " of a boolean array is the byte " + (v & 0xff)
                                + "; expected 0 or 1");
                    }
                    return v;
                }
                case 'i':
                    switch (size) {
                        case 1:
                            return bb.get(at);
                        case 2:
                            return bb.getShort(at);
                        case 4:
                            return bb.getInt(at);
                        default: {
                            long v = bb.getLong(at);
                            double d = v;
                            if (d == 0x1p63 || (long) d != v) {
                                throw inexact(file, name, index, Long.toString(v));
                            }
                            return d;
                        }
                    }
                default:
                    switch (size) {
                        case 1:
                            return bb.get(at) & 0xff;
                        case 2:
                            return bb.getShort(at) & 0xffff;
                        case 4:
                            return bb.getInt(at) & 0xffffffffL;
                        default: {
                            long v = bb.getLong(at);
                            if (v >= 0) {
                                double d = v;
                                if (d == 0x1p63 || (long) d != v) {
                                    throw inexact(file, name, index, Long.toUnsignedString(v));
                                }
                                return d;
                            }
                            if ((v & 0x7ffL) != 0) {
                                throw inexact(file, name, index, Long.toUnsignedString(v));
                            }
                            return (double) (v >>> 11) * 0x1p11;
                        }
                    }
            }
        }

        private static FormatException inexact(String file, String name, int index, String v) {
            return problem(file, name, "value " + index + " (" + v + ") cannot be held exactly by a double");
        }
    }

    /** A strict parser for the header's Python dict literal. */
    private static final class HeaderParser {
        private final String s;
        private final String file;
        private final String name;
        private int pos;

        HeaderParser(String s, String file, String name) {
            this.s = s;
            this.file = file;
            this.name = name;
        }

        Header parse() throws FormatException {
            String descr = null;
            Boolean fortran = null;
            int[] shape = null;
            skipSpace();
            expect('{');
            skipSpace();
            while (peek() != '}') {
                int keyAt = pos;
                String key = string();
                skipSpace();
                expect(':');
                skipSpace();
                switch (key) {
                    case "descr" -> {
                        if (descr != null) {
                            throw fail(keyAt, "the key 'descr' appears twice");
                        }
                        if (peek() == '[') {
                            throw fail(pos, "structured dtypes (a list as 'descr') are not supported; expected a plain"
                                    + " number dtype such as '<f8'");
                        }
                        descr = string();
                    }
                    case "fortran_order" -> {
                        if (fortran != null) {
                            throw fail(keyAt, "the key 'fortran_order' appears twice");
                        }
                        fortran = bool();
                    }
                    case "shape" -> {
                        if (shape != null) {
                            throw fail(keyAt, "the key 'shape' appears twice");
                        }
                        shape = tuple();
                    }
                    default -> throw fail(keyAt, "unknown header key '" + key
                            + "'; expected only 'descr', 'fortran_order' and 'shape'");
                }
                skipSpace();
                if (peek() == ',') {
                    pos++;
                    skipSpace();
                } else if (peek() != '}') {
                    throw fail(pos, "expected ',' or '}'");
                }
            }
            pos++;
            skipSpace();
            if (pos != s.length()) {
                throw fail(pos, "unexpected text after the header dict");
            }
            if (descr == null || fortran == null || shape == null) {
                throw fail(0, "the header dict needs 'descr', 'fortran_order' and 'shape'");
            }
            return new Header(descr, fortran, shape);
        }

        private char peek() throws FormatException {
            if (pos >= s.length()) {
                throw fail(pos, "the header ends early");
            }
            return s.charAt(pos);
        }

        private void skipSpace() {
            while (pos < s.length() && (s.charAt(pos) == ' ' || s.charAt(pos) == '\n' || s.charAt(pos) == '\t'
                    || s.charAt(pos) == '\r')) {
                pos++;
            }
        }

        private void expect(char c) throws FormatException {
            if (peek() != c) {
                throw fail(pos, "expected '" + c + "'");
            }
            pos++;
        }

        private String string() throws FormatException {
            char q = peek();
            if (q != '\'' && q != '"') {
                throw fail(pos, "expected a quoted string");
            }
            int start = ++pos;
            while (peek() != q) {
                if (s.charAt(pos) == '\\') {
                    throw fail(pos, "escapes in header strings are not supported");
                }
                pos++;
            }
            String v = s.substring(start, pos);
            pos++;
            return v;
        }

        private boolean bool() throws FormatException {
            if (s.startsWith("True", pos)) {
                pos += 4;
                return true;
            }
            if (s.startsWith("False", pos)) {
                pos += 5;
                return false;
            }
            throw fail(pos, "'fortran_order' must be True or False");
        }

        private int[] tuple() throws FormatException {
            expect('(');
            int[] dims = new int[4];
            int n = 0;
            boolean comma = false;
            skipSpace();
            while (peek() != ')') {
                int at = pos;
                long v = 0;
                while (pos < s.length() && Character.isDigit(s.charAt(pos)) && s.charAt(pos) < 128) {
                    v = v * 10 + (s.charAt(pos) - '0');
                    if (v > Integer.MAX_VALUE) {
                        throw fail(at, "a dimension of 'shape' is too large");
                    }
                    pos++;
                }
                if (pos == at) {
                    throw fail(at, "'shape' must be a tuple of non-negative integers");
                }
                if (pos < s.length() && s.charAt(pos) == 'L') {
                    pos++;
                }
                if (n == dims.length) {
                    dims = java.util.Arrays.copyOf(dims, n * 2);
                }
                dims[n++] = (int) v;
                skipSpace();
                comma = false;
                if (peek() == ',') {
                    pos++;
                    comma = true;
                    skipSpace();
                } else if (peek() != ')') {
                    throw fail(pos, "expected ',' or ')' in 'shape'");
                }
            }
            pos++;
            if (n == 1 && !comma) {
                throw fail(pos, "'shape' (" + dims[0] + ") is not a tuple; a one-dimensional shape is written ("
                        + dims[0] + ",)");
            }
            return java.util.Arrays.copyOf(dims, n);
        }

        private FormatException fail(int at, String what) {
            return problem(file, name, "bad header at character " + at + ": " + what + " (header: "
                    + abbreviate(s) + ")");
        }

        private static String abbreviate(String h) {
            String t = h.strip();
            return t.length() > 120 ? t.substring(0, 120) + "..." : t;
        }
    }
}
