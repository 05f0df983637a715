package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.ReadLimits;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * The "Limits" section of README.md stays true: it lists exactly the {@code --max-*} options of the
 * command line, each with the default that {@link ReadLimits#DEFAULT} has (CLI.md, "Limits").
 */
class ReadmeLimitsTest {
    private static final Pattern ROW = Pattern.compile("^\\| `(--max-[a-z]+)`[^|]*\\| ([^|]+) \\|$");

    @Test
    void readme_limitsTable_matchesOptionsAndDefaults() throws IOException {
        String readme = Files.readString(Path.of("..", "README.md"));
        int start = readme.indexOf("\n## Limits");
        assertTrue(start >= 0, "README.md has a Limits section");
        int end = readme.indexOf("\n## ", start + 1);
        String section = readme.substring(start, end < 0 ? readme.length() : end);
        Map<String, String> listed = new LinkedHashMap<>();
        for (String line : section.lines().toList()) {
            Matcher m = ROW.matcher(line.strip());
            if (m.matches()) {
                listed.put(m.group(1), m.group(2).strip());
            }
        }
        ReadLimits d = ReadLimits.DEFAULT;
        Map<String, String> expected = new LinkedHashMap<>();
        expected.put(ReadLimits.MAX_BYTES, (d.maxBytes() >> 30) + " GiB");
        expected.put(ReadLimits.MAX_NODES, String.format(Locale.ROOT, "%,d", d.maxNodes()));
        expected.put(ReadLimits.MAX_DEPTH, Integer.toString(d.maxDepth()));
        expected.put(ReadLimits.MAX_STRING, (d.maxString() >> 20) + " MiB");
        expected.put(ReadLimits.MAX_NUMBER, String.format(Locale.ROOT, "%,d", d.maxNumber()));
        assertEquals(d.maxBytes(), (d.maxBytes() >> 30) << 30, "--max-bytes is a whole number of GiB");
        assertEquals(d.maxString(), (d.maxString() >> 20) << 20, "--max-string is a whole number of MiB");
        assertEquals(expected, listed);
        // the read options are exactly these, and every command that reads a file has them all
        Set<String> readOptions = CommandLine.Model.CommandSpec.forAnnotatedObject(new ReadOptions()).options().stream()
                .flatMap(o -> Arrays.stream(o.names())).filter(n -> n.startsWith("--max-")).collect(Collectors.toSet());
        assertEquals(expected.keySet(), readOptions);
        java.util.ArrayDeque<CommandLine> todo = new java.util.ArrayDeque<>(new CommandLine(new Main()).getSubcommands().values());
        int checked = 0;
        while (!todo.isEmpty()) {
            CommandLine c = todo.pop();
            todo.addAll(c.getSubcommands().values());
            CommandLine.Model.CommandSpec spec = c.getCommandSpec();
            // an input file: a Path argument other than the outputs (-o, --to-params, the demo's DIR)
            boolean takesFile = spec.args().stream()
                    .filter(a -> !(a instanceof CommandLine.Model.OptionSpec o
                            && Arrays.asList(o.names()).stream().anyMatch(n -> n.equals("-o") || n.equals("--to-params"))))
                    .filter(a -> !"DIR".equals(a.paramLabel()))
                    .anyMatch(a -> a.type() == Path.class || Arrays.asList(a.auxiliaryTypes()).contains(Path.class));
            if (!takesFile || spec.name().equals("help")) {
                continue;
            }
            Set<String> names = spec.options().stream().flatMap(o -> Arrays.stream(o.names())).collect(Collectors.toSet());
            assertTrue(names.containsAll(readOptions), spec.qualifiedName() + " lacks some of " + readOptions);
            checked++;
        }
        assertTrue(checked >= 10, checked + " commands take files");
    }
}
