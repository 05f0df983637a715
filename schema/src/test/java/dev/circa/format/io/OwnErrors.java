package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;

/**
 * The property every reader test of issue 8 checks: an input yields a model or our own located
 * {@link FormatException}, never another exception or error (StackOverflowError and
 * OutOfMemoryError included).
 */
public final class OwnErrors {
    /** A reader under test. */
    @FunctionalInterface
    public interface Read<T> {
        T read(byte[] input) throws Exception;
    }

    /** A reader of a document kind from a stream, under given limits. */
    @FunctionalInterface
    public interface StreamRead<T> {
        T read(ReadLimits limits, InputStream in, String file) throws Exception;
    }

    /** A writer of a document kind. */
    @FunctionalInterface
    public interface Write<T> {
        void write(T document, OutputStream out) throws Exception;
    }

    private OwnErrors() {
    }

    /**
     * The reader property of the fuzz tests of a JSON document kind: {@code input} yields a document or a
     * located error under the default limits and under {@code tight}; a document that is read rewrites to
     * bytes that read back and rewrite to the same bytes.
     *
     * @return whether the input was read under the default limits
     */
    public static <T> boolean readsAndRewritesStably(byte[] input, ReadLimits tight, StreamRead<T> reader,
            Write<T> writer) {
        String file = "fuzz.json";
        T doc = modelOrLocatedError(file, true, input, b -> reader.read(ReadLimits.DEFAULT, new ByteArrayInputStream(b), file));
        modelOrLocatedError(file, true, input, b -> reader.read(tight, new ByteArrayInputStream(b), file));
        if (doc == null) {
            return false;
        }
        byte[] once = rewrite(doc, writer, input);
        T again = modelOrLocatedError("rewritten.json", true, once,
                b -> reader.read(ReadLimits.DEFAULT, new ByteArrayInputStream(b), "rewritten.json"));
        if (again == null) {
            throw new AssertionError("the rewrite of a document that was read is rejected: " + show(once)
                    + " from input " + show(input));
        }
        assertArrayEquals(once, rewrite(again, writer, input), () -> "rewrite is not stable for input " + show(input));
        return true;
    }

    private static <T> byte[] rewrite(T doc, Write<T> writer, byte[] input) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            writer.write(doc, out);
        } catch (Exception | Error e) {
            throw new AssertionError("writing a document that was read failed: " + e + " for input " + show(input), e);
        }
        return out.toByteArray();
    }

    /**
     * Reads {@code input}; returns the model, or {@code null} when the reader rejected it with a
     * {@link FormatException} naming {@code file} (and, when {@code lined}, a line and column > 0).
     *
     * @throws AssertionError on any other outcome, showing the input
     */
    public static <T> T modelOrLocatedError(String file, boolean lined, byte[] input, Read<T> reader) {
        try {
            return reader.read(input);
        } catch (FormatException e) {
            assertLocated(file, lined, e, input);
            return null;
        } catch (Throwable t) {
            throw new AssertionError("expected a model or a FormatException, got " + t + " for input " + show(input), t);
        }
    }

    /** Asserts that {@code e} names {@code file} and, when {@code lined}, a position. */
    public static void assertLocated(String file, boolean lined, FormatException e, byte[] input) {
        if (!file.equals(e.file())) {
            throw new AssertionError("error names " + e.file() + ", expected " + file + ": " + e.getMessage()
                    + " for input " + show(input), e);
        }
        if (lined && (e.line() <= 0 || e.column() <= 0)) {
            throw new AssertionError("error without a line and column: " + e.getMessage() + " for input " + show(input), e);
        }
        if (!e.getMessage().startsWith(file + ":")) {
            throw new AssertionError("message does not start with the file: " + e.getMessage(), e);
        }
        if (e instanceof LimitExceededException le && !e.getMessage().contains(le.option())) {
            throw new AssertionError("a limit message must name its option " + le.option() + ": " + e.getMessage(), e);
        }
    }

    /** The input as Java-escaped text (the first 2,000 bytes), for failure messages. */
    public static String show(byte[] input) {
        StringBuilder sb = new StringBuilder("(").append(input.length).append(" bytes) \"");
        String s = new String(input, 0, Math.min(input.length, 2000), StandardCharsets.ISO_8859_1);
        for (char c : s.toCharArray()) {
            if (c == '"' || c == '\\') {
                sb.append('\\').append(c);
            } else if (c >= 32 && c < 127) {
                sb.append(c);
            } else {
                sb.append(String.format(java.util.Locale.ROOT, "\\u%04x", (int) c));
            }
        }
        return sb.append(input.length > 2000 ? "...\"" : "\"").toString();
    }
}
