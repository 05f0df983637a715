package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.Duration;
import java.util.Arrays;
import java.util.HexFormat;

/** The one test helper that runs the command line in-process (through {@link Main#run}), with a hang guard. */
final class Cli {
    /** Only a guard against hangs: malformed input must end, however slowly (tests never assert on time). */
    static final Duration HANG_GUARD = Duration.ofSeconds(30);
    static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    static final Path READINGS = Path.of("..", "fixtures", "data", "pump-station-readings.csv");

    /** What one run printed and returned. */
    record Result(String[] args, int status, String out, String err) {
        /** Lines of standard error that start a message ("circa: ...", warnings aside). */
        long messages() {
            return err.lines().filter(Result::isMessage).count();
        }

        /** The first message line. */
        String message() {
            return err.lines().filter(Result::isMessage).findFirst().orElse("");
        }

        private static boolean isMessage(String line) {
            return line.startsWith("circa: ") && !line.startsWith("circa: warning: ");
        }

        String describe() {
            return String.join(" ", args) + " -> " + status + "\n" + err;
        }

        @Override
        public String toString() {
            return "status " + status + "\n--- out\n" + out + "--- err\n" + err;
        }
    }

    private Cli() {
    }

    static Result run(String... args) {
        return assertTimeoutPreemptively(HANG_GUARD, () -> {
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
            return new Result(args, status, out.toString(), err.toString());
        }, () -> "hang guard: " + String.join(" ", args));
    }

    /**
     * Asserts status 2 with one message (CLI.md, exit status 2) that contains {@code name} (the file
     * or option it is about) and {@code fragment}, and no stack trace.
     */
    static void assertUnusable(Result r, String name, String fragment) {
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertEquals(1, r.messages(), r::describe);
        String message = r.message();
        assertTrue(message.contains(name), () -> "message does not name " + name + ": " + r.describe());
        assertTrue(r.err().contains(fragment), () -> "expected \"" + fragment + "\": " + r.describe());
        assertNoStackTrace(r);
    }

    static void assertNoStackTrace(Result r) {
        assertFalse(r.err().contains("\tat ") || r.err().contains("Exception:") || r.err().contains("Error:"),
                () -> "stack trace or exception name on standard error: " + r.describe());
    }

    /** SHA-256 of a file, for checking that inputs are not modified (FIPS 180-4, via the JDK). */
    static String sha256(Path p) throws IOException {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(p)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /** The names in a folder, sorted (to see that no temporary file is left behind). */
    static String[] listing(Path dir) throws IOException {
        try (var s = Files.list(dir)) {
            String[] names = s.map(p -> p.getFileName().toString()).toArray(String[]::new);
            Arrays.sort(names);
            return names;
        }
    }
}
