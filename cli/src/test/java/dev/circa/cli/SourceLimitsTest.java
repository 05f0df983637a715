package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The project's limits on its own sources (issue 11, kept by all later work): no simple class name is
 * defined twice across the main sources of all modules, and no file of the command line's package is
 * over {@value #CLI_MAX_LINES} lines. Walks every module of the repository (the folders beside
 * {@code cli/} that have {@code src/main/java}), so modules added later are covered too.
 */
class SourceLimitsTest {
    static final int CLI_MAX_LINES = 150;
    static final Path ROOT = Path.of("..");

    @Test
    void noSimpleClassNameIsDefinedTwiceInMainSources() throws IOException {
        Map<String, List<Path>> byName = new TreeMap<>();
        for (Path file : mainSources()) {
            String name = file.getFileName().toString();
            if (!name.equals("package-info.java") && !name.equals("module-info.java")) {
                byName.computeIfAbsent(name.substring(0, name.length() - ".java".length()), k -> new ArrayList<>())
                        .add(ROOT.relativize(file));
            }
        }
        List<String> twice = new ArrayList<>();
        byName.forEach((name, files) -> {
            if (files.size() > 1) {
                twice.add(name + " " + files);
            }
        });
        assertTrue(byName.size() > 100, "the walk found the modules' sources: " + byName.size());
        assertTrue(twice.isEmpty(), () -> "simple class names defined more than once: " + twice);
    }

    @Test
    void noCommandLineFileIsOverTheLimit() throws IOException {
        Path cli = ROOT.resolve(Path.of("cli", "src", "main", "java", "dev", "circa", "cli"));
        List<String> over = new ArrayList<>();
        int files = 0;
        try (Stream<Path> s = Files.list(cli)) {
            for (Path file : s.filter(p -> p.toString().endsWith(".java")).toList()) {
                files++;
                long lines;
                try (Stream<String> l = Files.lines(file)) {
                    lines = l.count();
                }
                if (lines > CLI_MAX_LINES) {
                    over.add(file.getFileName() + " (" + lines + " lines)");
                }
            }
        }
        assertTrue(files > 10, "the walk found the command line's sources: " + files);
        assertTrue(over.isEmpty(), () -> "files of " + cli + " over " + CLI_MAX_LINES + " lines: " + over);
    }

    private static List<Path> mainSources() throws IOException {
        List<Path> sources = new ArrayList<>();
        try (Stream<Path> modules = Files.list(ROOT)) {
            for (Path module : modules.sorted().toList()) {
                Path main = module.resolve(Path.of("src", "main", "java"));
                if (Files.isDirectory(main)) {
                    try (Stream<Path> s = Files.walk(main)) {
                        s.filter(p -> p.toString().endsWith(".java")).forEach(sources::add);
                    }
                }
            }
        }
        return sources;
    }
}
