package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Counts in user-facing text agree with their noun: "1 product", "2 products", never "1 products" or "error(s)". */
class CountWordingTest {
    /** A string literal with a noun followed by "(s)". */
    private static final Pattern MAYBE_PLURAL = Pattern.compile("\"[^\"\\n]*[a-z]\\(s\\)[^\"\\n]*\"");

    @TempDir
    Path tmp;

    @Test
    void inspectAndValidate_oneOfEach_singularNouns() throws Exception {
        Path f = tmp.resolve("one.json");
        Files.writeString(f, """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [{"name": "x", "type": "real"}],
                 "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 0, "sd": 1},
                           {"id": 1, "product": [0]},
                           {"id": 2, "sum": [1], "weights": [1.0]}],
                 "outputs": [{"name": "p", "node": 2}]}""");
        Cli.Result inspect = Cli.run("inspect", f.toString());
        assertEquals(ExitStatus.OK, inspect.status(), inspect::toString);
        assertTrue(inspect.out().contains("  nodes:     3 (1 input, 1 product, 1 sum)\n"), inspect::toString);
        Cli.Result validate = Cli.run("validate", f.toString());
        assertEquals(ExitStatus.OK, validate.status(), validate::toString);
        assertTrue(validate.out().contains("  1 variable, 3 nodes, 2 edges, depth 2\n"), validate::toString);
    }

    @Test
    void mainSources_noNounWithParenthesisedPlural() throws Exception {
        List<String> found = new ArrayList<>();
        for (String module : List.of("schema", "engine", "validator", "converter", "model", "report", "cli", "spark")) {
            Path src = Path.of("..", module, "src", "main", "java");
            try (Stream<Path> files = Files.walk(src)) {
                for (Path p : (Iterable<Path>) files.filter(x -> x.toString().endsWith(".java"))::iterator) {
                    List<String> lines = Files.readAllLines(p);
                    for (int i = 0; i < lines.size(); i++) {
                        if (MAYBE_PLURAL.matcher(lines.get(i)).find()) {
                            found.add(p + ":" + (i + 1) + ": " + lines.get(i).strip());
                        }
                    }
                }
            }
        }
        assertTrue(found.isEmpty(), "use dev.circa.format.Counts instead: " + String.join("\n", found));
    }
}
