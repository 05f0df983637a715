package dev.circa.model;

import java.io.IOException;
import java.io.InputStream;

/**
 * Sees the bytes of a circuit exactly as stored (before gzip decompression and the read limits) while a
 * {@link ModelLoader} reads them, in the same pass: for instance to hash them. The loader opens the
 * stored stream, passes it to {@link #wrap} and reads the circuit from what it returns; it closes that
 * stream when the read ends, successful or not.
 */
@FunctionalInterface
public interface ReadHook {
    /** The hook that reads the stored bytes as they are. */
    ReadHook NONE = (stored, source) -> stored;

    /**
     * The stream the loader reads instead of {@code stored}; it must pass on every byte of
     * {@code stored}, unchanged and in order.
     *
     * @param stored input: the bytes as stored
     * @param source the file's name in messages
     * @return the stream to read
     * @throws IOException when the hook cannot start
     */
    InputStream wrap(InputStream stored, String source) throws IOException;
}
