package dev.circa.format.io;

import java.io.BufferedInputStream;
import java.io.FileInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.Map;
import java.util.zip.ZipException;

/**
 * Opens input files: {@code -} for standard input, {@code .gz} decompressed, {@code --max-bytes}
 * enforced. Standard input and other inputs that can be read only once (a pipe such as
 * {@code <(cat f)}, a FIFO) are read like files: the bytes are kept as they are read, so that they
 * can be opened again (a reader that first looks for the document's kind, a schema check after the
 * read), and gzip is recognised from the content since there is no name to tell it. A gzip input is
 * nothing but gzip members up to its end.
 */
public final class InputFiles {
    private static final Map<Object, InputCopy> COPIES = new HashMap<>();

    private InputFiles() {
    }

    /** The display name of a path for messages ({@code -} for standard input). */
    public static String displayName(Path path) {
        return path == null ? "-" : path.toString();
    }

    /** Whether {@code path} names standard input ({@code -}, or {@code null}). */
    public static boolean isStandardInput(Path path) {
        return path == null || path.toString().equals("-");
    }

    /** Whether {@code path} can be read only once (standard input, a pipe, a FIFO, a device). */
    public static boolean isReadOnce(Path path) {
        return isStandardInput(path) || (Files.exists(path) && !Files.isRegularFile(path) && !Files.isDirectory(path));
    }

    /**
     * Opens {@code path} (or standard input when {@code path} is {@code null} or {@code -}) for reading,
     * decompressing gzip when the name ends in {@code .gz} (or, for an input without a file, when the
     * content starts as gzip does), and counting bytes against {@code maxBytes}.
     *
     * @throws FormatException when the file is missing, unreadable or not gzip although named so
     */
    public static InputStream open(Path path, long maxBytes) throws FormatException {
        String name = displayName(path);
        boolean named = !isStandardInput(path) && path.getFileName() != null && isGzipName(path.getFileName().toString());
        BufferedInputStream in = new BufferedInputStream(openStored(path), 1 << 16);
        boolean gz = named;
        if (!named && isReadOnce(path)) {
            try {
                gz = startsAsGzip(in);
            } catch (IOException e) {
                closeQuietly(in);
                throw new FormatException(name, 0, 0, null, "cannot be read: " + IoMessages.of(e));
            }
            if (gz) {
                try {
                    return new LimitedInputStream(GzipMembersInputStream.open(in, name), maxBytes, name);
                } catch (FormatException e) {
                    closeQuietly(in);
                    throw e;
                } catch (IOException e) {
                    closeQuietly(in);
                    throw new FormatException(name, 0, 0, null, "the input starts as gzip-compressed data but is not valid gzip");
                }
            }
        }
        return decoded(in, name, gz, maxBytes);
    }

    /**
     * Opens the bytes of {@code path} as stored (standard input when {@code path} is {@code null} or
     * {@code -}), neither decompressed nor counted: for callers that observe the stored bytes before
     * passing them to {@link #decoded}.
     *
     * @throws FormatException when the file is missing, a directory or unreadable
     */
    public static InputStream openStored(Path path) throws FormatException {
        String name = displayName(path);
        if (!isStandardInput(path) && Files.isDirectory(path)) {
            throw new FormatException(name, 0, 0, null, "is a folder, expected a file");
        }
        try {
            if (isStandardInput(path)) {
                return copyOf(System.in, System.in).newReader();
            }
            if (Files.isRegularFile(path) || !Files.exists(path)) {
                return Files.newInputStream(path);
            }
            Object key = Files.readAttributes(path, java.nio.file.attribute.BasicFileAttributes.class).fileKey();
            return copyOf(key == null ? path.toAbsolutePath().toString() : key, null, path).newReader();
        } catch (NoSuchFileException e) {
            throw new FormatException(name, 0, 0, null, "no such file");
        } catch (IOException e) {
            throw new FormatException(name, 0, 0, null, "cannot be read: " + IoMessages.of(e));
        }
    }

    /**
     * The bytes of a file as stored, opened by the caller (who may observe them, e.g. to hash them),
     * turned into what a reader reads: decompressed when {@code gzip}, counted against {@code maxBytes}.
     * Closing the result closes {@code stored}.
     *
     * @param stored input: the stored bytes
     * @param name the file's name in messages
     * @param gzip whether the stored bytes are gzip-compressed
     * @param maxBytes the {@code --max-bytes} limit on the bytes read after decompression
     * @throws FormatException when {@code gzip} is set but the bytes are not gzip
     */
    public static InputStream decoded(InputStream stored, String name, boolean gzip, long maxBytes) throws FormatException {
        InputStream in = new BufferedInputStream(stored, 1 << 16);
        if (gzip) {
            try {
                in = GzipMembersInputStream.open(in, name);
            } catch (FormatException e) {
                closeQuietly(in);
                throw e;
            } catch (ZipException | java.io.EOFException e) {
                closeQuietly(in);
                throw new FormatException(name, 0, 0, null, "the name ends in .gz but the file is not gzip-compressed");
            } catch (IOException e) {
                closeQuietly(in);
                throw new FormatException(name, 0, 0, null, "cannot be read: " + IoMessages.of(e));
            }
        }
        return new LimitedInputStream(in, maxBytes, name);
    }

    /** Whether a file of this name is read as gzip ({@code .gz}). */
    public static boolean isGzipName(String name) {
        return name != null && name.endsWith(".gz");
    }

    private static void closeQuietly(InputStream in) {
        try {
            in.close();
        } catch (IOException ignored) {
            // the stream is abandoned after a failure already reported
        }
    }

    /**
     * Forgets the kept copies of standard input and of pipes (removing their temporary files): the
     * next open reads the source anew. For a program that runs several commands in one process.
     */
    public static synchronized void forgetCopies() {
        for (InputCopy c : COPIES.values()) {
            c.discard();
        }
        COPIES.clear();
    }

    private static InputCopy copyOf(Object key, InputStream stdin) throws IOException {
        return copyOf(key, stdin, null);
    }

    /** The copy of standard input ({@code stdin} non-null, keyed by that stream) or of the pipe {@code path}. */
    private static synchronized InputCopy copyOf(Object key, InputStream stdin, Path path) throws IOException {
        InputCopy c = COPIES.get(key);
        if (c == null) {
            if (stdin == null && COPIES.size() > 64) {
                forgetCopies();
            }
            c = InputCopy.of(stdin != null ? stdin : new FileInputStream(path.toFile()));
            COPIES.put(key, c);
        }
        return c;
    }

    private static boolean startsAsGzip(BufferedInputStream in) throws IOException {
        in.mark(2);
        int a = in.read();
        int b = in.read();
        in.reset();
        return a == 0x1f && b == 0x8b;
    }
}
