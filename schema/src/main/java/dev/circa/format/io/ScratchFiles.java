package dev.circa.format.io;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Duration;
import java.time.Instant;
import java.util.LinkedHashSet;
import java.util.Set;
import java.util.concurrent.ThreadLocalRandom;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The temporary files circa creates while it works (an output being written, a copy of standard
 * input or of a pipe that is read twice), removed when the work ends, when the process is stopped by
 * SIGTERM or Ctrl-C (one shutdown hook), and, for temporary outputs left by a process killed
 * outright ({@code kill -9}), by the next write to the same target.
 *
 * <p>A temporary output of target {@code NAME} is {@code .NAME.<pid>-<random>.tmp} in the target's
 * folder; the process id tells a file of a running writer from a stale one.
 */
final class ScratchFiles {
    /** A stale file of the older naming ({@code .NAME.<random>.tmp}, no process id) is removed after this age. */
    private static final Duration LEGACY_AGE = Duration.ofHours(1);

    private static final Set<Path> LIVE = new LinkedHashSet<>();
    private static boolean hooked;

    private ScratchFiles() {
    }

    /** The name of a new temporary output for {@code targetName}. */
    static String temporaryName(String targetName) {
        long random = ThreadLocalRandom.current().nextLong() >>> 1;
        return "." + targetName + "." + ProcessHandle.current().pid() + "-" + random + ".tmp";
    }

    /** Registers {@code file} for removal at shutdown until {@link #done} is called. */
    static synchronized void register(Path file) {
        if (!hooked) {
            Runtime.getRuntime().addShutdownHook(new Thread(ScratchFiles::removeAll, "circa-remove-temporary-files"));
            hooked = true;
        }
        LIVE.add(file);
    }

    /** Forgets {@code file} (moved into place or already removed). */
    static synchronized void done(Path file) {
        LIVE.remove(file);
    }

    /** Removes {@code file} if it exists and forgets it. */
    static void remove(Path file) {
        try {
            Files.deleteIfExists(file);
        } catch (IOException e) {
            // nothing more can be done for a file that cannot be removed; it keeps its telling name
        }
        done(file);
    }

    private static synchronized void removeAll() {
        for (Path p : LIVE) {
            try {
                Files.deleteIfExists(p);
            } catch (IOException e) {
                // the process is ending: remove what can be removed
            }
        }
        LIVE.clear();
    }

    /**
     * Removes the temporary outputs of {@code targetName} in {@code dir} whose writing process is no
     * longer running (or, in the older naming without a process id, untouched for an hour).
     */
    static void removeStale(Path dir, String targetName) {
        Pattern own = Pattern.compile("\\." + Pattern.quote(targetName) + "\\.(?:([0-9]+)-)?[0-9]+\\.tmp");
        Instant legacyBefore = Instant.now().minus(LEGACY_AGE);
        try (DirectoryStream<Path> files = Files.newDirectoryStream(dir, "." + globSafe(targetName) + ".*.tmp")) {
            for (Path f : files) {
                Matcher m = own.matcher(f.getFileName().toString());
                if (!m.matches() || !Files.isRegularFile(f, java.nio.file.LinkOption.NOFOLLOW_LINKS)) {
                    continue;
                }
                boolean stale;
                if (m.group(1) != null) {
                    long pid = Long.parseLong(m.group(1));
                    stale = pid != ProcessHandle.current().pid() && ProcessHandle.of(pid).map(h -> !h.isAlive()).orElse(true);
                } else {
                    FileTime t = Files.getLastModifiedTime(f, java.nio.file.LinkOption.NOFOLLOW_LINKS);
                    stale = t.toInstant().isBefore(legacyBefore);
                }
                if (stale) {
                    Files.deleteIfExists(f);
                }
            }
        } catch (IOException | RuntimeException e) {
            // a folder that cannot be listed keeps its leftovers; the write itself goes on
        }
    }

    /** {@code name} with the glob's special characters replaced by {@code ?} (the pattern then checks exactly). */
    private static String globSafe(String name) {
        return name.replaceAll("[\\\\*?\\[\\]{}]", "?");
    }
}
