package dev.circa.format.io;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.zip.ZipException;

/**
 * Opens input files: {@code -} for standard input, {@code .gz} decompressed (nothing but gzip members
 * up to the end of the file), {@code --max-bytes} enforced.
 */
public final class InputFiles {
    private InputFiles() {
    }

    /** The display name of a path for messages ({@code -} for standard input). */
    public static String displayName(Path path) {
        return path == null ? "-" : path.toString();
    }

    /**
     * Opens {@code path} (or standard input when {@code path} is {@code null} or {@code -}) for reading,
     * decompressing gzip when the name ends in {@code .gz}, and counting bytes against {@code maxBytes}.
     *
     * @throws FormatException when the file is missing, unreadable or not gzip although named so
     */
    public static InputStream open(Path path, long maxBytes) throws FormatException {
        boolean gz = path != null && path.getFileName() != null && isGzipName(path.getFileName().toString());
        return decoded(openStored(path), displayName(path), gz, maxBytes);
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
        if (path == null || path.toString().equals("-")) {
            return System.in;
        }
        if (Files.isDirectory(path)) {
            throw new FormatException(name, 0, 0, null, "is a directory, expected a file");
        }
        try {
            return Files.newInputStream(path);
        } catch (NoSuchFileException e) {
            throw new FormatException(name, 0, 0, null, "no such file");
        } catch (IOException e) {
            throw new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage());
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
                throw new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage());
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
}
