package dev.circa.cli;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.CircuitWriter;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** The folder {@code circa demo} writes to and the story it tells: bundled inputs out, results in, a list at the end. */
final class DemoFolder {
    private static final String RESOURCES = "/dev/circa/cli/demo/";

    private final Path dir;
    private final PrintWriter out;
    private final List<String> written = new ArrayList<>();

    DemoFolder(Path dir, PrintWriter out) throws Exception {
        this.dir = dir;
        this.out = out;
        Files.createDirectories(dir);
    }

    /** {@code name} in the folder. */
    Path file(String name) {
        return dir.resolve(name);
    }

    /** Copies the bundled {@code resource} to {@code name} in the folder. */
    Path extract(String resource, String name) throws Exception {
        Path target = dir.resolve(name);
        try (InputStream in = DemoFolder.class.getResourceAsStream(RESOURCES + resource)) {
            if (in == null) {
                throw new UsageException("the demo's bundled file " + resource + " is missing from the jar");
            }
            byte[] bytes = in.readAllBytes();
            AtomicOutput.write(target, s -> s.write(bytes));
        }
        written.add(target + "  (bundled input)");
        return target;
    }

    /** Writes {@code doc} to {@code name} in the folder. */
    Path write(CircuitDocument doc, String name, String what) throws Exception {
        Path target = dir.resolve(name);
        new CircuitWriter().write(doc, target);
        written.add(target + "  (" + what + ")");
        indent("wrote " + target);
        return target;
    }

    /** Writes {@code text} to {@code name} in the folder. */
    void writeText(String text, String name, String what) throws Exception {
        Path target = dir.resolve(name);
        AtomicOutput.write(target, s -> s.write(text.getBytes(StandardCharsets.UTF_8)));
        written.add(target + "  (" + what + ")");
    }

    /** Records {@code target}, written by the caller, among the files written. */
    void wrote(Path target, String what) {
        written.add(target + "  (" + what + ")");
        indent("wrote " + target);
    }

    /** Lists the files written. */
    void listWritten() {
        say("Files written:");
        for (String w : written) {
            say("  " + w);
        }
    }

    void say(String s) {
        out.println(s);
    }

    /** Prints each non-blank line of {@code text} indented under its step. */
    void indent(String text) {
        for (String line : text.split("\n")) {
            if (!line.isBlank()) {
                out.println("   " + line);
            }
        }
    }
}
