package dev.circa.format.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.core.StreamReadConstraints;
import tools.jackson.core.StreamReadFeature;
import tools.jackson.core.StreamWriteFeature;
import tools.jackson.core.TokenStreamLocation;
import tools.jackson.core.exc.StreamConstraintsException;
import tools.jackson.core.json.JsonFactory;
import tools.jackson.core.json.JsonReadFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;

/**
 * A token-by-token reader over JSON (or YAML, through any Jackson parser) that turns every problem
 * into a located {@link FormatException}: syntax errors, wrong types, non-finite numbers, duplicate
 * keys and limits. The document readers of circa are built on it. Not thread-safe.
 */
public final class JsonInput implements AutoCloseable {
    private static final Pattern ALLOWED = Pattern.compile("maximum allowed \\(([0-9]+)");

    private final JsonParser parser;
    private final String file;
    /** The regular file read as stored (not standard input, not gzip), or {@code null}: see {@link #storedFile()}. */
    private Path storedFile;
    /** The stream the parser reads (null when it was given a parser): see {@link #source()}. */
    private InputStream source;
    /** The value of the integer {@link #isIntIn(int, int)} last accepted. */
    private int intValue;
    /** Added to every line the parser reports: the input starts this many lines into the file. */
    private int lineShift;
    /** Added to the columns of the parser's {@link #shiftedLine} (where the input starts within a file's line). */
    private int columnShift;
    private int shiftedLine;
    private long byteShift;

    /** Wraps an existing parser (its stream-read constraints should come from {@link #mapperFor(ReadLimits)}). */
    public JsonInput(JsonParser parser, String file) {
        this.parser = parser;
        this.file = file;
    }

    /** Opens a JSON file (or standard input for {@code -}) under {@code limits}. */
    public static JsonInput openJson(Path path, ReadLimits limits) throws FormatException {
        InputStream in = InputFiles.open(path, limits.maxBytes());
        JsonInput input = fromStream(in, InputFiles.displayName(path), limits);
        if (isStored(path)) {
            input.storedFile = path;
        }
        return input;
    }

    /**
     * Whether {@code path} is read as stored (a regular file, not gzip, not standard input), so that a
     * second reader may open it at any byte offset.
     */
    static boolean isStored(Path path) {
        return !InputFiles.isReadOnce(path) && !InputFiles.isGzipName(String.valueOf(path.getFileName()))
                && Files.isRegularFile(path);
    }

    /**
     * The file this input reads when its bytes are the file's as stored (a regular file, not gzip, not
     * standard input), so that a second reader may open it at any byte offset; otherwise {@code null}.
     */
    Path storedFile() {
        return storedFile;
    }

    /** The stream this input's parser reads, when it reads one (else {@code null}). */
    InputStream source() {
        return source;
    }

    /**
     * The bytes the parser has read from {@link #source()} past the current token and not yet taken, or
     * {@code null} when it reads characters (an input in UTF-16 or UTF-32) and cannot give them back.
     */
    byte[] releaseBuffered() throws FormatException {
        java.io.ByteArrayOutputStream out = new java.io.ByteArrayOutputStream();
        try {
            return parser.releaseBuffered(out) < 0 ? null : out.toByteArray();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /**
     * Makes this input, whose second line starts at line {@code line}, column {@code column} of a file
     * (after a first line of its own), report its locations as the file's.
     */
    void moveTo(int line, int column) {
        lineShift = line - 2;
        shiftedLine = 2;
        columnShift = column - 1;
    }

    /** Makes {@link #byteOffset()} report offsets {@code bytes} further on (where the input starts in a file). */
    void shiftBytes(long bytes) {
        byteShift = bytes;
    }

    /** The file's line of the parser's line {@code l} (0 when unknown). */
    private int fileLine(int l) {
        return l <= 0 ? 0 : l + lineShift;
    }

    /** The file's column of the parser's column {@code c} on its line {@code l}. */
    private int fileColumn(int l, int c) {
        return Math.max(c, 0) + (l == shiftedLine ? columnShift : 0);
    }

    /** The byte offset of the current token in the input, or -1 when the parser does not know it. */
    long byteOffset() {
        TokenStreamLocation l = parser.currentTokenLocation();
        return l == null || l.getByteOffset() < 0 ? -1 : l.getByteOffset() + byteShift;
    }

    /** Reads JSON from {@code in} under {@code limits}; {@code file} names it in messages. */
    public static JsonInput fromStream(InputStream in, String file, ReadLimits limits) throws FormatException {
        try {
            JsonInput input = new JsonInput(mapperFor(limits).createParser(in), file);
            input.source = in;
            return input;
        } catch (JacksonException e) {
            // The parser is created after the encoding is detected from the first bytes: any problem is at the start.
            FormatException f = translate(e, file);
            throw f.line() > 0 ? f : f.relocated(1, 1);
        }
    }

    /**
     * A JSON mapper that enforces {@code limits}, rejects duplicate keys and NaN literals, and writes each double
     * as the shortest decimal that reads back to the same bits.
     */
    public static ObjectMapper mapperFor(ReadLimits limits) {
        JsonFactory factory = JsonFactory.builder()
                .streamReadConstraints(constraints(limits))
                .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                .disable(JsonReadFeature.ALLOW_NON_NUMERIC_NUMBERS)
                // doubles written as the shortest decimal that reads back to the same bits, about 7x faster than
                // Double.toString on Java 17 (which sometimes writes a digit more); tested against the JDK's parser
                .enable(StreamWriteFeature.USE_FAST_DOUBLE_WRITER)
                .build();
        return JsonMapper.builder(factory).build();
    }

    /** The Jackson constraints that implement {@code limits}. */
    public static StreamReadConstraints constraints(ReadLimits limits) {
        return StreamReadConstraints.builder()
                .maxNestingDepth(limits.maxDepth())
                .maxNumberLength(limits.maxNumber())
                .maxStringLength(limits.maxString())
                .maxNameLength(Math.max(limits.maxString(), 1))
                .maxDocumentLength(-1)
                .build();
    }

    /** The file name used in messages. */
    public String file() {
        return file;
    }

    /** The underlying parser (for callers that need raw access). */
    public JsonParser parser() {
        return parser;
    }

    /** Advances to the next token; {@code null} at the end of input. */
    public JsonToken next() throws FormatException {
        try {
            return parser.nextToken();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /** The current token. */
    public JsonToken token() {
        return parser.currentToken();
    }

    /** The current property name (after a {@link JsonToken#PROPERTY_NAME}). */
    public String name() {
        return parser.currentName();
    }

    /** Line of the current token (1-based). */
    public int line() {
        TokenStreamLocation l = parser.currentTokenLocation();
        return l == null ? 0 : fileLine(l.getLineNr());
    }

    /** Column of the current token (1-based). */
    public int column() {
        TokenStreamLocation l = parser.currentTokenLocation();
        return l == null ? 0 : fileColumn(l.getLineNr(), l.getColumnNr());
    }

    /** Line (high 32 bits) and column (low 32 bits) of the current token, from one location lookup. */
    public long position() {
        TokenStreamLocation l = parser.currentTokenLocation();
        if (l == null) {
            return 0;
        }
        return ((long) fileLine(l.getLineNr()) << 32) | fileColumn(l.getLineNr(), l.getColumnNr());
    }

    /** A located error at the current token. */
    public FormatException error(String pointer, String problem) {
        return new FormatException(file, line(), column(), pointer, problem);
    }

    /** Reads the first token and requires an object. */
    public void startDocument(String what) throws FormatException {
        JsonToken t = next();
        if (t == null) {
            throw new FormatException(file, 1, 1, "", "the file is empty; expected " + what);
        }
        if (t != JsonToken.START_OBJECT) {
            throw error("", "expected " + what + " (a JSON object), found " + describe(t));
        }
    }

    /** After the root object closes: requires the end of input. */
    public void endDocument() throws FormatException {
        JsonToken t = next();
        if (t != null) {
            throw error("", "unexpected content after the end of the document: " + describe(t));
        }
    }

    /** Requires the current token to be {@code expected}. */
    public void expect(JsonToken expected, String pointer, String what) throws FormatException {
        JsonToken t = token();
        if (t != expected) {
            throw error(pointer, "expected " + what + ", found " + describe(t));
        }
    }

    /** The next property name inside the current object, or {@code null} at its end. */
    public String nextProperty() throws FormatException {
        JsonToken t = next();
        if (t == JsonToken.END_OBJECT) {
            return null;
        }
        if (t != JsonToken.PROPERTY_NAME) {
            throw error(null, "expected a property name or '}', found " + describe(t));
        }
        String n = parser.currentName();
        next();
        return n;
    }

    /** Whether the current array has another element (advances onto it). */
    public boolean nextElement() throws FormatException {
        JsonToken t = next();
        if (t == null) {
            throw error(null, "the input ends inside an array");
        }
        return t != JsonToken.END_ARRAY;
    }

    /** Skips the current value (and its children). */
    public void skipValue() throws FormatException {
        try {
            parser.skipChildren();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /** Reads the current value as a tree (for free-form members such as {@code extensions}). */
    public JsonNode readTree() throws FormatException {
        try {
            JsonNode n = parser.readValueAsTree();
            return n;
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /** The current value as a string. */
    public String readString(String pointer) throws FormatException {
        if (token() != JsonToken.VALUE_STRING) {
            throw error(pointer, "expected a string, found " + describe(token()));
        }
        String s;
        try {
            s = parser.getString();
        } catch (JacksonException e) {
            throw fail(e);
        }
        int bad = loneSurrogate(s);
        if (bad >= 0) {
            throw error(pointer, String.format(Locale.ROOT, "the string has a lone surrogate \\u%04x at character %d, which is"
                    + " not a Unicode character (no UTF-8 file or CSV cell can hold it); expected text of whole characters",
                    (int) s.charAt(bad), bad + 1));
        }
        return s;
    }

    /** The index of the first UTF-16 surrogate without its pair in {@code s}, or -1. */
    static int loneSurrogate(String s) {
        int n = s.length();
        for (int i = 0; i < n; i++) {
            char c = s.charAt(i);
            if (Character.isHighSurrogate(c) && i + 1 < n && Character.isLowSurrogate(s.charAt(i + 1))) {
                i++;
            } else if (Character.isSurrogate(c)) {
                return i;
            }
        }
        return -1;
    }

    /** The current value as a string, or {@code null} for JSON null. */
    public String readNullableString(String pointer) throws FormatException {
        return token() == JsonToken.VALUE_NULL ? null : readString(pointer);
    }

    /** Whether the current token is a number. */
    public boolean isNumber() {
        JsonToken t = token();
        return t == JsonToken.VALUE_NUMBER_INT || t == JsonToken.VALUE_NUMBER_FLOAT;
    }

    /** The current value as a finite double. */
    public double readDouble(String pointer) throws FormatException {
        if (!isNumber()) {
            throw error(pointer, "expected a number, found " + describe(token()));
        }
        double v;
        try {
            v = parser.getDoubleValue();
        } catch (JacksonException e) {
            throw fail(e);
        }
        if (!Double.isFinite(v)) {
            throw error(pointer, "the number " + abbreviate(parser) + " is out of double range; expected a finite number");
        }
        return v;
    }

    /** The current value as an integer in [{@code min}, {@code max}]; an integral float such as 2.0 is accepted. */
    public long readLong(String pointer, long min, long max) throws FormatException {
        if (!isNumber()) {
            throw error(pointer, "expected an integer, found " + describe(token()));
        }
        long v;
        try {
            if (token() == JsonToken.VALUE_NUMBER_INT) {
                JsonParser.NumberType nt = parser.getNumberType();
                if (nt == JsonParser.NumberType.BIG_INTEGER) {
                    throw error(pointer, "the integer " + abbreviate(parser) + " is out of range; expected an integer from "
                            + min + " to " + max);
                }
                v = parser.getLongValue();
            } else {
                double d = parser.getDoubleValue();
                if (d != Math.rint(d) || Math.abs(d) > 9.007199254740992E15) {
                    throw error(pointer, "expected an integer, found " + parser.getText());
                }
                v = (long) d;
            }
        } catch (JacksonException e) {
            throw fail(e);
        }
        if (v < min || v > max) {
            throw error(pointer, "the integer " + v + " is out of range; expected an integer from " + min + " to " + max);
        }
        return v;
    }

    /** The current value as an int in [{@code min}, {@code max}]. */
    public int readInt(String pointer, int min, int max) throws FormatException {
        return (int) readLong(pointer, min, max);
    }

    /** The current number token's value (checked by the caller). */
    private double numberValue() throws FormatException {
        try {
            return parser.getDoubleValue();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /**
     * Whether the current token is an int in [{@code min}, {@code max}] as written; then {@link #intValue()}
     * is its value, else the caller reads it with {@link #readInt(String, int, int)} for the message (so
     * that a reader can build a pointer only when it is needed).
     */
    public boolean isIntIn(int min, int max) throws FormatException {
        if (token() != JsonToken.VALUE_NUMBER_INT) {
            return false;
        }
        // the digits read here (the parser checked the syntax): one loop for every length of integer, where
        // the parser's own decoding switches on the length and is compiled anew for each new one it meets
        char[] text;
        int off;
        int len;
        try {
            text = parser.getStringCharacters();
            off = parser.getStringOffset();
            len = parser.getStringLength();
        } catch (JacksonException e) {
            throw fail(e);
        }
        boolean negative = len > 0 && text[off] == '-';
        int k = negative ? off + 1 : off;
        int end = off + len;
        if (end - k > 10 || end == k) {
            return false;
        }
        long v = 0;
        for (; k < end; k++) {
            v = v * 10 + (text[k] - '0');
        }
        v = negative ? -v : v;
        if (v < min || v > max) {
            return false;
        }
        intValue = (int) v;
        return true;
    }

    /** The value of the current token, after {@link #isIntIn(int, int)} said yes. */
    public int intValue() {
        return intValue;
    }

    /** The current token's value when it is a finite number, else NaN (the caller then reads it for the message). */
    public double finiteOrNaN() throws FormatException {
        if (!isNumber()) {
            return Double.NaN;
        }
        double v = numberValue();
        return Double.isFinite(v) ? v : Double.NaN;
    }

    /** The current token's text when it is a string, else {@code null}; not checked for lone surrogates. */
    public String stringOrNull() throws FormatException {
        if (token() != JsonToken.VALUE_STRING) {
            return null;
        }
        try {
            return parser.getString();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /** Reads an array of finite numbers (the current token must start it). */
    public double[] readDoubleArray(String pointer) throws FormatException {
        expect(JsonToken.START_ARRAY, pointer, "an array of numbers");
        double[] buf = new double[8];
        int n = 0;
        while (nextElement()) {
            if (n == buf.length) {
                buf = Arrays.copyOf(buf, n * 2);
            }
            double v = finiteOrNaN();
            buf[n] = Double.isFinite(v) ? v : readDouble(pointer + "/" + n);
            n++;
        }
        return Arrays.copyOf(buf, n);
    }

    /** Reads an array of ints in [{@code min}, {@code max}] (the current token must start it). */
    public int[] readIntArray(String pointer, int min, int max) throws FormatException {
        expect(JsonToken.START_ARRAY, pointer, "an array of integers");
        int[] buf = new int[8];
        int n = 0;
        while (nextElement()) {
            if (n == buf.length) {
                buf = Arrays.copyOf(buf, n * 2);
            }
            // the pointer is built only for a message: a large array costs no string per element
            buf[n] = isIntIn(min, max) ? intValue : readInt(pointer + "/" + n, min, max);
            n++;
        }
        return Arrays.copyOf(buf, n);
    }

    @Override
    public void close() throws FormatException {
        try {
            parser.close();
        } catch (JacksonException e) {
            throw fail(e);
        }
    }

    /** A short description of a token for messages. */
    public static String describe(JsonToken t) {
        if (t == null) {
            return "the end of the input";
        }
        return switch (t) {
            case START_OBJECT -> "an object";
            case END_OBJECT -> "'}'";
            case START_ARRAY -> "an array";
            case END_ARRAY -> "']'";
            case PROPERTY_NAME -> "a property name";
            case VALUE_STRING -> "a string";
            case VALUE_NUMBER_INT -> "an integer";
            case VALUE_NUMBER_FLOAT -> "a number";
            case VALUE_TRUE, VALUE_FALSE -> "a boolean";
            case VALUE_NULL -> "null";
            default -> t.name().toLowerCase(Locale.ROOT);
        };
    }

    private static String abbreviate(JsonParser p) {
        String s = p.getText();
        return s.length() > 40 ? s.substring(0, 20) + "..." + " (" + s.length() + " characters)" : s;
    }

    /** Translates {@code e}, locating it at the parser's read position when Jackson gives no location. */
    private FormatException fail(JacksonException e) {
        FormatException f = translate(e, file);
        if (f.line() > 0) {
            return shiftedLine == 0 ? f : f.relocated(fileLine(f.line()), fileColumn(f.line(), f.column()));
        }
        TokenStreamLocation l = parser.currentLocation();
        if (l == null || l.getLineNr() <= 0) {
            l = parser.currentTokenLocation();
        }
        if (l == null || l.getLineNr() <= 0) {
            return f;
        }
        return f.relocated(fileLine(l.getLineNr()), fileColumn(l.getLineNr(), Math.max(1, l.getColumnNr())));
    }

    /** Turns a Jackson exception into a located {@link FormatException}. */
    public static FormatException translate(JacksonException e, String file) {
        Throwable c = e.getCause();
        while (c != null) {
            if (c instanceof FormatException fe) {
                return fe;
            }
            c = c.getCause();
        }
        TokenStreamLocation l = e.getLocation();
        int line = l == null ? 0 : Math.max(0, l.getLineNr());
        int col = l == null ? 0 : Math.max(0, l.getColumnNr());
        String msg = e.getOriginalMessage();
        if (msg == null) {
            msg = e.getClass().getSimpleName();
        }
        if (e instanceof StreamConstraintsException) {
            return limitFrom(msg, file, line, col);
        }
        if (e.getCause() instanceof IOException io) {
            String m = io.getMessage() == null ? "" : io.getMessage();
            boolean encoding = io instanceof java.io.CharConversionException || m.contains("UCS-4") || m.contains("UTF-");
            if (!encoding) {
                return new FormatException(file, line, col, null, "cannot be read: " + IoMessages.of(io));
            }
            msg = m;
        }
        return new FormatException(file, line, col, null, ParserMessages.json(msg));
    }

    private static FormatException limitFrom(String msg, String file, int line, int col) {
        String lower = msg.toLowerCase(Locale.ROOT);
        String limit = allowed(msg);
        if (lower.contains("nesting depth")) {
            return limit(file, line, col, "the nesting depth exceeds the limit of " + limit + " levels", ReadLimits.MAX_DEPTH);
        }
        if (lower.contains("number value length") || lower.contains("number length")) {
            return limit(file, line, col, "a number is longer than the limit of " + limit + " characters", ReadLimits.MAX_NUMBER);
        }
        if (lower.contains("string value length") || lower.contains("name length")) {
            return limit(file, line, col, "a string is longer than the limit of " + limit + " characters", ReadLimits.MAX_STRING);
        }
        if (lower.contains("document length")) {
            return limit(file, line, col, "the file is longer than the limit of " + limit + " bytes", ReadLimits.MAX_BYTES);
        }
        return new FormatException(file, line, col, null, ParserMessages.json(msg));
    }

    private static LimitExceededException limit(String file, int line, int col, String what, String option) {
        return new LimitExceededException(file, line, col, null,
                what + " set by " + option + " (raise it with " + option + ")", option);
    }

    /** The limit Jackson names in "... exceeds the maximum allowed (N, from ...)". */
    private static String allowed(String msg) {
        Matcher m = ALLOWED.matcher(msg);
        return m.find() ? m.group(1) : "the configured number of";
    }
}
