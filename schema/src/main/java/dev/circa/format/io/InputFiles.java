package dev.circa.format.io;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;

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
        String name = displayName(path);
        try {
            InputStream raw;
            boolean gz;
            if (path == null || path.toString().equals("-")) {
                raw = System.in;
                gz = false;
            } else {
                if (Files.isDirectory(path)) {
                    throw new FormatException(name, 0, 0, null, "is a directory, expected a file");
                }
                raw = Files.newInputStream(path);
                gz = path.getFileName().toString().endsWith(".gz");
            }
            InputStream in = new BufferedInputStream(raw, 1 << 16);
            if (gz) {
                try {
                    in = GzipMembersInputStream.open(in, name);
                } catch (IOException e) {
                    in.close();
                    throw e;
                }
            }
            return new LimitedInputStream(in, maxBytes, name);
        } catch (NoSuchFileException e) {
            throw new FormatException(name, 0, 0, null, "no such file");
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage());
        }
    }
}
