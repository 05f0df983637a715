package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * Help texts are whole and point at the repository's documentation (issue 15): no description cut
 * with "...", each subcommand listed with a full first sentence, its own help a flowing paragraph.
 */
class CliHelpTest {
    private static String run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        assertEquals(0, status, err::toString);
        return out.toString();
    }

    /** Every command path: "validate", "regions random", ... */
    private static List<String[]> commands() {
        List<String[]> out = new ArrayList<>();
        List<CommandLine> todo = new ArrayList<>(new CommandLine(new Main()).getSubcommands().values());
        while (!todo.isEmpty()) {
            CommandLine c = todo.remove(0);
            String q = c.getCommandSpec().qualifiedName();
            if (q.endsWith(" help")) {
                continue;
            }
            out.add(q.substring("circa ".length()).split(" "));
            todo.addAll(c.getSubcommands().values());
        }
        return out;
    }

    @Test
    void everyDescription_oneHeaderSentence_thenOneParagraph() {
        CommandLine root = new CommandLine(new Main());
        for (CommandLine sub : root.getSubcommands().values()) {
            Main.summarise(sub.getCommandSpec());
        }
        List<CommandLine> todo = new ArrayList<>(root.getSubcommands().values());
        while (!todo.isEmpty()) {
            CommandLine c = todo.remove(0);
            todo.addAll(c.getSubcommands().values());
            CommandLine.Model.UsageMessageSpec u = c.getCommandSpec().usageMessage();
            String name = c.getCommandSpec().qualifiedName();
            if (name.endsWith(" help")) {
                continue;
            }
            assertEquals(1, u.header().length, name);
            assertTrue(u.header()[0].endsWith("."), name + ": " + u.header()[0]);
            assertTrue(u.description().length <= 1, name + ": the description keeps its source's line breaks");
        }
    }

    @Test
    void listOfSubcommands_fullSentences_neverCut() {
        String help = run("--help");
        assertFalse(help.contains("..."), help);
        for (String[] c : commands()) {
            if (c.length == 1) {
                assertTrue(help.contains("  " + c[0] + " "), help);
            }
        }
    }

    @Test
    void everySubcommandsHelp_neverCut_andFlowsAsOneParagraph() {
        for (String[] c : commands()) {
            String[] args = java.util.Arrays.copyOf(c, c.length + 1);
            args[c.length] = "--help";
            String help = run(args);
            String joined = String.join(" ", c);
            // " ..." at the end of a sentence was the mark of a cut description ("FILE..." is a repeatable argument)
            assertFalse(help.contains(" ...\n") || help.contains(" ...)"), joined + ":\n" + help);
            // help points at the repository's docs/, never at design files a clone does not have
            assertFalse(help.contains("FORMAT.md") || help.contains("CLI.md"), joined + ":\n" + help);
        }
    }

    @Test
    void render_keepsNodeLabels() throws Exception {
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("render-labels");
        java.nio.file.Path c = dir.resolve("labelled.json");
        java.nio.file.Files.writeString(c, """
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "flow", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 1, "sd": 1, "label": "steady"},
                       {"id": 1, "input": "normal", "var": 0, "mean": 4, "sd": 2, "label": "surging"},
                       {"id": 2, "sum": [0, 1], "weights": [0.5, 0.5], "label": "regimes"}],
             "outputs": [{"name": "joint", "node": 2}]}
            """);
        run("render", c.toString(), "-o", dir.resolve("labelled.dot").toString());
        String dot = java.nio.file.Files.readString(dir.resolve("labelled.dot"));
        assertTrue(dot.contains("#0 normal\\nsteady") && dot.contains("#1 normal\\nsurging") && dot.contains("#2 sum\\nregimes"), dot);
    }
}
