package dev.circa.format.io;

import java.io.BufferedOutputStream;
import java.io.FileOutputStream;
import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.PosixFileAttributes;
import java.nio.file.attribute.PosixFileAttributeView;
import java.util.zip.GZIPOutputStream;

/**
 * Writes an output file whole or not at all. Where the output goes depends on what the target is:
 * <ul>
 * <li>a regular file, or nothing yet: a temporary file {@code .NAME.<pid>-<random>.tmp} beside it,
 * renamed over the target only when the writer has finished, so a failure leaves an existing target
 * untouched. A new file gets the mode the umask gives ({@code 0666 & ~umask}); a file that existed
 * keeps its mode (and, when the process may set them, its owner and group).</li>
 * <li>a symbolic link: the file it points to is written in the same way, in that file's folder; the
 * link stays.</li>
 * <li>anything else that exists (a device such as {@code /dev/null}, a FIFO): written directly, since
 * it cannot be replaced.</li>
 * <li>{@code -}: standard output.</li>
 * </ul>
 * A temporary file is removed when writing fails and when the process is stopped by SIGTERM or
 * Ctrl-C; one left by a process killed outright is removed by the next write to the same target.
 * A name ending in {@code .gz} is gzip-compressed.
 */
public final class AtomicOutput {
    /** Writes the content of a file to a stream. */
    @FunctionalInterface
    public interface Content {
        void writeTo(OutputStream out) throws IOException;
    }

    private static final int MAX_LINKS = 40;

    private AtomicOutput() {
    }

    /**
     * Writes {@code target} from {@code content}.
     *
     * @param inputs files this command reads: writing over one of them is refused
     * @throws IOException when writing fails; the target is then unchanged
     */
    public static void write(Path target, Content content, Path... inputs) throws IOException {
        if (isStandardOutput(target)) {
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
        Path destination = checkTarget(target, inputs);
        boolean gzip = target.getFileName() != null && target.getFileName().toString().endsWith(".gz");
        if (Files.exists(destination) && !Files.isRegularFile(destination)) {
            writeDirectly(target, destination, content, gzip);
        } else {
            writeReplacing(target, destination, content, gzip);
        }
    }

    /** Whether {@code target} names standard output. */
    public static boolean isStandardOutput(Path target) {
        return target.toString().equals("-");
    }

    /**
     * Checks, before any work, that {@code target} can be written: a non-empty name, not one of the
     * inputs, not a folder, in a folder that exists. Returns where the bytes will go (the file a
     * symbolic link points to, followed to its end).
     *
     * @throws FormatException naming the target and what is wrong
     */
    public static Path checkTarget(Path target, Path... inputs) throws FormatException {
        if (isStandardOutput(target)) {
            return target;
        }
        if (target.toString().isEmpty()) {
            throw new FormatException("''", 0, 0, null, "the output name is empty; expected the name of a file to write");
        }
        refuseInputs(target, inputs);
        Path destination = followLinks(target.toAbsolutePath());
        if (Files.isDirectory(destination)) {
            throw new FormatException(target.toString(), 0, 0, null, "is a folder; expected the name of a file to write");
        }
        if (Files.exists(destination) && !Files.isRegularFile(destination)) {
            return destination;
        }
        Path dir = destination.getParent();
        if (dir != null && !Files.isDirectory(dir)) {
            throw new FormatException(target.toString(), 0, 0, null, "cannot write: the folder " + dir + " does not exist");
        }
        return destination;
    }

    /** The file at the end of a chain of symbolic links (the path itself when it is none). */
    private static Path followLinks(Path abs) throws FormatException {
        Path p = abs;
        for (int i = 0; i < MAX_LINKS; i++) {
            if (!Files.isSymbolicLink(p)) {
                return p;
            }
            try {
                Path to = Files.readSymbolicLink(p);
                p = p.resolveSibling(to).toAbsolutePath();
            } catch (IOException e) {
                throw new FormatException(abs.toString(), 0, 0, null, "cannot follow the symbolic link: " + IoMessages.of(e));
            }
        }
        throw new FormatException(abs.toString(), 0, 0, null,
                "more than " + MAX_LINKS + " symbolic links in a row (a loop?); expected a file to write");
    }

    private static void writeDirectly(Path target, Path destination, Content content, boolean gzip) throws IOException {
        try (OutputStream raw = new FileOutputStream(destination.toFile());
             OutputStream buffered = new BufferedOutputStream(raw, 1 << 16)) {
            writeContent(buffered, content, gzip);
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw cannotWrite(target, e, false);
        }
    }

    private static void writeReplacing(Path target, Path destination, Content content, boolean gzip) throws IOException {
        Path dir = destination.getParent();
        String name = destination.getFileName().toString();
        ScratchFiles.removeStale(dir, name);
        PosixFileAttributes before = existingAttributes(destination);
        Path tmp = dir.resolve(ScratchFiles.temporaryName(name));
        ScratchFiles.register(tmp);
        boolean done = false;
        try {
            // created without explicit permissions: the umask decides, as for any new file
            try (OutputStream raw = Files.newOutputStream(tmp, StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE);
                 OutputStream buffered = new BufferedOutputStream(raw, 1 << 16)) {
                writeContent(buffered, content, gzip);
            }
            if (before != null) {
                keepAttributes(tmp, before);
            }
            try {
                Files.move(tmp, destination, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, destination, StandardCopyOption.REPLACE_EXISTING);
            }
            done = true;
            ScratchFiles.done(tmp);
        } catch (FormatException e) {
            // a problem of an input met while writing (it names that input)
            throw e;
        } catch (IOException e) {
            throw cannotWrite(target, e, true);
        } finally {
            if (!done) {
                ScratchFiles.remove(tmp);
            }
        }
    }

    private static void writeContent(OutputStream out, Content content, boolean gzip) throws IOException {
        if (gzip) {
            GZIPOutputStream gz = new GZIPOutputStream(out, 1 << 16);
            content.writeTo(gz);
            gz.finish();
        } else {
            content.writeTo(out);
        }
    }

    /** The mode, owner and group of an existing regular file, or {@code null} (none, or no POSIX attributes). */
    private static PosixFileAttributes existingAttributes(Path file) {
        try {
            if (!Files.isRegularFile(file)) {
                return null;
            }
            return Files.readAttributes(file, PosixFileAttributes.class);
        } catch (IOException | UnsupportedOperationException e) {
            return null;
        }
    }

    /** Gives {@code tmp} the mode of the file it replaces, and its owner and group when allowed. */
    private static void keepAttributes(Path tmp, PosixFileAttributes before) throws IOException {
        PosixFileAttributeView view = Files.getFileAttributeView(tmp, PosixFileAttributeView.class, LinkOption.NOFOLLOW_LINKS);
        view.setPermissions(before.permissions());
        try {
            PosixFileAttributes now = view.readAttributes();
            if (!now.group().equals(before.group())) {
                view.setGroup(before.group());
            }
            if (!now.owner().equals(before.owner())) {
                view.setOwner(before.owner());
            }
        } catch (IOException | SecurityException e) {
            // only a privileged process may give a file away; the mode is what matters
        }
    }

    /** A write failure (disk full, no permission...) as a message naming the target. */
    private static FormatException cannotWrite(Path target, IOException e, boolean unchanged) {
        FormatException f = new FormatException(target.toString(), 0, 0, null, "cannot write: " + IoMessages.of(e)
                + (unchanged ? "; the existing file, if any, is unchanged" : ""));
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
