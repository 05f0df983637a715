package dev.circa.format.io;

import java.io.BufferedOutputStream;
import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.zip.GZIPOutputStream;

/**
 * Writes an output file whole or not at all: into a temporary file beside the target, moved into
 * place only when the writer has finished. A failure leaves an existing target untouched.
 * {@code -} writes to standard output. A name ending in {@code .gz} is gzip-compressed.
 */
public final class AtomicOutput {
    /** Writes the content of a file to a stream. */
    @FunctionalInterface
    public interface Content {
        void writeTo(OutputStream out) throws IOException;
    }

    private AtomicOutput() {
    }

    /**
     * Writes {@code target} from {@code content}.
     *
     * @param inputs files this command reads: writing over one of them is refused
     * @throws IOException when writing fails; the target is then unchanged
     */
    public static void write(Path target, Content content, Path... inputs) throws IOException {
        if (target.toString().equals("-")) {
            OutputStream out = new FilterOutputStream(System.out) {
                @Override
                public void close() throws IOException {
                    flush();
                }
            };
            OutputStream buffered = new BufferedOutputStream(out, 1 << 16);
            content.writeTo(buffered);
            buffered.flush();
            return;
        }
        refuseInputs(target, inputs);
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        if (dir != null && !Files.isDirectory(dir)) {
            throw new FormatException(target.toString(), 0, 0, null, "cannot write: the folder " + dir + " does not exist");
        }
        if (Files.isDirectory(abs)) {
            throw new FormatException(target.toString(), 0, 0, null, "is a folder; expected the name of a file to write");
        }
        Path tmp;
        try {
            tmp = Files.createTempFile(dir, "." + abs.getFileName() + ".", ".tmp");
        } catch (IOException e) {
            throw cannotWrite(target, e);
        }
        boolean done = false;
        try {
            try (OutputStream raw = Files.newOutputStream(tmp);
                 OutputStream buffered = new BufferedOutputStream(raw, 1 << 16)) {
                if (abs.getFileName().toString().endsWith(".gz")) {
                    try (GZIPOutputStream gz = new GZIPOutputStream(buffered, 1 << 16)) {
                        content.writeTo(gz);
                    }
                } else {
                    content.writeTo(buffered);
                }
            }
            try {
                Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING);
            }
            done = true;
        } catch (FormatException e) {
            // a problem of an input met while writing (it names that input)
            throw e;
        } catch (IOException e) {
            throw cannotWrite(target, e);
        } finally {
            if (!done) {
                Files.deleteIfExists(tmp);
            }
        }
    }

    /** A write failure (disk full, no permission...) as a message naming the target. */
    private static FormatException cannotWrite(Path target, IOException e) {
        FormatException f = new FormatException(target.toString(), 0, 0, null, "cannot write: " + e.getMessage()
                + "; the existing file, if any, is unchanged");
        f.initCause(e);
        return f;
    }

    /** Refuses a target that is one of the inputs (same file, however named). */
    public static void refuseInputs(Path target, Path... inputs) throws FormatException {
        for (Path in : inputs) {
            if (in == null || in.toString().equals("-")) {
                continue;
            }
            boolean same;
            try {
                same = Files.exists(target) && Files.exists(in) && Files.isSameFile(target, in);
            } catch (IOException e) {
                same = false;
            }
            if (same || target.toAbsolutePath().normalize().equals(in.toAbsolutePath().normalize())) {
                throw new FormatException(target.toString(), 0, 0, null,
                        "refusing to write over an input file; choose another output with -o");
            }
        }
    }
}
