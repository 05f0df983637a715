package dev.circa.format.io;

import java.io.EOFException;
import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.DirectoryNotEmptyException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.NoSuchFileException;
import java.nio.file.NotDirectoryException;
import java.util.Locale;
import java.util.zip.ZipException;

/**
 * An input or output failure of the Java platform told in circa's words: what happened, without
 * exception class names or a bare {@code null}. Used wherever a file is opened, read or written.
 */
public final class IoMessages {
    private IoMessages() {
    }

    /** What went wrong, in a few words (no file name: the caller's message names the file). */
    public static String of(IOException e) {
        if (e instanceof NoSuchFileException) {
            return "no such file or folder";
        }
        if (e instanceof AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof NotDirectoryException) {
            return "a part of the path is not a folder";
        }
        if (e instanceof FileAlreadyExistsException) {
            return "the file already exists";
        }
        if (e instanceof DirectoryNotEmptyException) {
            return "the folder is not empty";
        }
        if (e instanceof EOFException) {
            return "the input ends unexpectedly (is the file truncated?)";
        }
        if (e instanceof ZipException) {
            return "the compressed data or the zip structure is damaged";
        }
        if (e instanceof FileSystemException fs) {
            return fs.getReason() != null ? lower(fs.getReason()) : "the file system refused the operation";
        }
        String m = e.getMessage();
        if (m == null || m.isBlank()) {
            return "an input/output error";
        }
        if (m.contains("No space left")) {
            return "no space left on the device";
        }
        if (m.contains("Illegal seek")) {
            return "the input cannot be repositioned (a pipe?)";
        }
        if (m.contains("Stream closed")) {
            return "the input was already read and closed";
        }
        return lower(m);
    }

    private static String lower(String m) {
        if (m.length() > 1 && Character.isUpperCase(m.charAt(0)) && !Character.isUpperCase(m.charAt(1))) {
            return m.substring(0, 1).toLowerCase(Locale.ROOT) + m.substring(1);
        }
        return m;
    }
}
