package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RenderCommandTest {
    @TempDir
    Path dir;

    @Test
    void render_exampleWithScopes_writesDotFile() throws Exception {
        Path out = dir.resolve("pump.dot");
        Cli.Result r = Cli.run("render", CheckCommandTest.EXAMPLE.toString(), "-o", out.toString(), "--scopes");
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        String dot = Files.readString(out);
        // Graphviz DOT language (common practice): a digraph with one statement per line here
        assertTrue(dot.startsWith("digraph circuit {\n") && dot.endsWith("}\n"), dot);
        assertTrue(dot.contains("n6 -> n2 [label=\"0.850\"];"), dot);
        assertTrue(dot.contains("{inlet_pressure, valve}"), dot);
    }

    @Test
    void render_aboveMaxRenderNodes_summaryByScope() throws Exception {
        Path out = dir.resolve("summary.dot");
        Cli.Result r = Cli.run("render", CheckCommandTest.EXAMPLE.toString(), "-o", out.toString(), "--max-render-nodes", "3");
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        assertTrue(r.err().contains("7 nodes is more than --max-render-nodes 3: drawing a summary by scope"), r::toString);
        String dot = Files.readString(out);
        assertTrue(dot.contains("2 products\\n{inlet_pressure, valve}"), dot);
        assertTrue(dot.contains("[label=\"2 edges\"]"), dot);
    }
}
