package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.nio.file.attribute.PosixFilePermission;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Set;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * What each kind of output target becomes (regular file, none yet, symbolic link, device, FIFO), the
 * mode of what is written, and the temporary files left by a stopped or killed writer. The expected
 * behaviour of the operating system (POSIX rename, umask, FIFOs, /dev/null) is common practice.
 */
class AtomicOutputTest {
    @TempDir
    Path dir;

    private static void writeText(Path target, String text) throws IOException {
        AtomicOutput.write(target, out -> out.write(text.getBytes(StandardCharsets.UTF_8)));
    }

    private List<String> leftovers(Path folder) throws IOException {
        try (Stream<Path> s = Files.list(folder)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.endsWith(".tmp")).toList();
        }
    }

    @Test
    void regularFile_replacedWhole_noTemporaryLeft() throws Exception {
        Path out = dir.resolve("out.json");
        Files.writeString(out, "old");
        writeText(out, "new");
        assertEquals("new", Files.readString(out));
        assertEquals(List.of(), leftovers(dir));
    }

    @Test
    void failingWriter_existingTargetUnchanged_temporaryRemoved() throws Exception {
        Path out = dir.resolve("out.json");
        Files.writeString(out, "old");
        assertThrows(IOException.class, () -> AtomicOutput.write(out, o -> {
            o.write(1);
            throw new IOException("disk full");
        }));
        assertEquals("old", Files.readString(out));
        assertEquals(List.of(), leftovers(dir));
    }

    @Test
    void newFile_modeFollowsTheUmask() throws Exception {
        // the reference: a file the operating system creates with default permissions in the same folder
        Path probe = Files.createFile(dir.resolve("probe"));
        Path out = dir.resolve("new.csv");
        writeText(out, "x\n");
        assertEquals(Files.getPosixFilePermissions(probe), Files.getPosixFilePermissions(out));
        assertFalse(Files.getPosixFilePermissions(out).equals(PosixFilePermissions.fromString("rw-------"))
                && !Files.getPosixFilePermissions(probe).equals(PosixFilePermissions.fromString("rw-------")));
    }

    @Test
    void existingFile_keepsItsMode() throws Exception {
        for (String mode : List.of("rw-r--r--", "rw-r-----", "rwxr-x---")) {
            Path out = dir.resolve("kept-" + mode.hashCode() + ".json");
            Files.writeString(out, "old");
            Set<PosixFilePermission> perms = PosixFilePermissions.fromString(mode);
            Files.setPosixFilePermissions(out, perms);
            writeText(out, "new");
            assertEquals("new", Files.readString(out));
            assertEquals(perms, Files.getPosixFilePermissions(out), mode);
        }
    }

    @Test
    void symbolicLink_writesTheFileItPointsTo_andStaysALink() throws Exception {
        Path elsewhere = Files.createDirectory(dir.resolve("elsewhere"));
        Path real = elsewhere.resolve("model.json");
        Files.writeString(real, "old");
        Files.setPosixFilePermissions(real, PosixFilePermissions.fromString("rw-r--r--"));
        Path here = Files.createDirectory(dir.resolve("here"));
        Path link = Files.createSymbolicLink(here.resolve("link.json"), Path.of("../elsewhere/model.json"));
        writeText(link, "new");
        assertTrue(Files.isSymbolicLink(link));
        assertEquals(Path.of("../elsewhere/model.json"), Files.readSymbolicLink(link));
        assertEquals("new", Files.readString(real));
        assertEquals(PosixFilePermissions.fromString("rw-r--r--"), Files.getPosixFilePermissions(real));
        assertEquals(List.of(), leftovers(here));
        assertEquals(List.of(), leftovers(elsewhere));
    }

    @Test
    void danglingSymbolicLink_createsTheFileItNames() throws Exception {
        Path link = Files.createSymbolicLink(dir.resolve("link.json"), Path.of("target.json"));
        Path chained = Files.createSymbolicLink(dir.resolve("chain.json"), Path.of("link.json"));
        writeText(chained, "made");
        assertTrue(Files.isSymbolicLink(link) && Files.isSymbolicLink(chained));
        assertEquals("made", Files.readString(dir.resolve("target.json")));
    }

    @Test
    void symbolicLinkLoop_isAClearMessage() throws Exception {
        Files.createSymbolicLink(dir.resolve("a"), Path.of("b"));
        Files.createSymbolicLink(dir.resolve("b"), Path.of("a"));
        FormatException e = assertThrows(FormatException.class, () -> writeText(dir.resolve("a"), "x"));
        assertTrue(e.getMessage().contains("symbolic links in a row"), e.getMessage());
    }

    @Test
    void devNull_isWrittenDirectly_andStaysADevice() throws Exception {
        // as any user, and as root (who could otherwise replace it): /dev/null is a character device
        Path devNull = Path.of("/dev/null");
        assertFalse(Files.isRegularFile(devNull));
        writeText(devNull, "discarded\n");
        assertFalse(Files.isRegularFile(devNull));
        assertTrue(Files.exists(devNull));
        assertEquals(0, Files.size(devNull));
        assertFalse(Files.isRegularFile(devNull, LinkOption.NOFOLLOW_LINKS));
    }

    @Test
    void fifo_isWrittenDirectly_andStaysAFifo() throws Exception {
        Path fifo = dir.resolve("pipe");
        Process mk = new ProcessBuilder("mkfifo", fifo.toString()).inheritIO().start();
        assertEquals(0, mk.waitFor());
        CompletableFuture<String> reader = CompletableFuture.supplyAsync(() -> {
            try {
                return new String(Files.readAllBytes(fifo), StandardCharsets.UTF_8);
            } catch (IOException e) {
                return "failed: " + e;
            }
        });
        writeText(fifo, "through the pipe\n");
        assertEquals("through the pipe\n", reader.get(30, TimeUnit.SECONDS));
        assertTrue(Files.exists(fifo));
        assertFalse(Files.isRegularFile(fifo));
        assertTrue((Boolean) Files.getAttribute(fifo, "isOther"));
        assertEquals(List.of(), leftovers(dir));
    }

    @Test
    void emptyName_andFolder_andMissingFolder_areClearMessages() {
        FormatException empty = assertThrows(FormatException.class, () -> writeText(Path.of(""), "x"));
        assertTrue(empty.getMessage().contains("the output name is empty"), empty.getMessage());
        FormatException folder = assertThrows(FormatException.class, () -> writeText(dir, "x"));
        assertTrue(folder.getMessage().endsWith("is a folder; expected the name of a file to write"), folder.getMessage());
        Path missing = dir.resolve("nodir").resolve("out.json");
        FormatException nodir = assertThrows(FormatException.class, () -> AtomicOutput.checkTarget(missing));
        assertTrue(nodir.getMessage().contains("does not exist"), nodir.getMessage());
    }

    @Test
    void sigterm_midWrite_removesTheTemporaryFile() throws Exception {
        Path out = dir.resolve("big.csv");
        Process p = startSlowWriter(out);
        awaitLeftover();
        p.destroy(); // SIGTERM on POSIX systems
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        assertEquals(List.of(), leftovers(dir));
        assertFalse(Files.exists(out));
    }

    @Test
    void killMinus9_leftover_isRemovedByTheNextWriteToTheSameTarget() throws Exception {
        Path out = dir.resolve("big.csv");
        Path other = dir.resolve("other.csv");
        Process p = startSlowWriter(out);
        awaitLeftover();
        p.destroyForcibly(); // SIGKILL: no shutdown hook runs
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        List<String> left = leftovers(dir);
        assertEquals(1, left.size());
        assertTrue(left.get(0).matches("\\.big\\.csv\\.[0-9]+-[0-9]+\\.tmp"), left.get(0));
        // an older leftover without a process id, untouched for two hours, and one of another target
        Path legacy = Files.writeString(dir.resolve(".big.csv.123456789.tmp"), "old");
        Files.setLastModifiedTime(legacy, FileTime.from(Instant.now().minus(Duration.ofHours(2))));
        Process ended = new ProcessBuilder("true").start();
        assertEquals(0, ended.waitFor());
        String foreignName = ".other.csv." + ended.pid() + "-2.tmp";
        Path foreign = Files.writeString(dir.resolve(foreignName), "left by a process that has ended");
        writeText(out, "complete\n");
        assertEquals("complete\n", Files.readString(out));
        assertEquals(List.of(foreignName), leftovers(dir));
        assertTrue(Files.exists(foreign));
        writeText(other, "y");
        assertEquals(List.of(), leftovers(dir));
    }

    private Process startSlowWriter(Path out) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        return new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                SlowOutputWriter.class.getName(), out.toString())
                .redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
    }

    private void awaitLeftover() throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (System.nanoTime() < deadline) {
            for (String n : leftovers(dir)) {
                if (Files.size(dir.resolve(n)) >= 120_000) {
                    return;
                }
            }
            Thread.sleep(50);
        }
        throw new AssertionError("the writer did not start within a minute");
    }
}
