package dev.circa.format.io;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

/**
 * A process for {@link AtomicOutputTest}: starts writing {@code args[0]} through {@link AtomicOutput},
 * writes a first block, then waits for a minute so that the test can stop it mid-write.
 */
public final class SlowOutputWriter {
    private SlowOutputWriter() {
    }

    public static void main(String[] args) throws Exception {
        AtomicOutput.write(Path.of(args[0]), out -> {
            out.write("first block\n".repeat(10_000).getBytes(StandardCharsets.US_ASCII));
            out.flush();
            try {
                Thread.sleep(60_000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
    }
}
