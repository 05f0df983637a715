package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Where the first half's reader guesses the nodes array starts: the first {@code "nodes"} member name
 * (after a brace or a comma, before a colon and a bracket) in the file's first bytes, whatever the size
 * of the header before it up to {@link NodeArrayHead#SEARCH_BYTES}; never a string that merely holds the
 * word, and nothing when the array starts later. (A wrong guess costs only time: the reader checks it.)
 */
class NodeArrayHeadTest {
    @TempDir
    Path dir;

    private long bracket(String text) throws Exception {
        Path file = dir.resolve("pump-head.json");
        Files.writeString(file, text, StandardCharsets.UTF_8);
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            return NodeArrayHead.nodesBracket(ch, (int) Math.min(Files.size(file), NodeArrayHead.SEARCH_BYTES));
        }
    }

    private static String header(int variables) {
        StringBuilder sb = new StringBuilder("{\"format\": \"circa.circuit\", \"version\": \"1.0\",\n\"variables\": [");
        for (int v = 0; v < variables; v++) {
            sb.append(v == 0 ? "" : ", ").append("{\"name\": \"bearing_temperature_").append(v).append("\", \"type\": \"real\"}");
        }
        return sb.append("],\n").toString();
    }

    @Test
    void foundAfterHeadersOfEverySize() throws Exception {
        // 1 variable, then headers past the first window (256 KiB) and the second (1 MiB)
        for (int variables : new int[] {1, 6_000, 30_000}) {
            String head = header(variables);
            String text = head + "\"nodes\" :\n [{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 0, \"sd\": 1}],"
                    + " \"outputs\": [{\"name\": \"joint\", \"node\": 0}]}";
            assertEquals(head.length() + "\"nodes\" :\n ".length(), bracket(text), variables + " variables");
        }
    }

    @Test
    void wordsThatAreNotTheMemberAreNotTaken() throws Exception {
        String decoys = "{\"name\": \"nodes\", \"description\": \"see \\\"nodes\\\": [1]\", \"nodes_old\": [1], \"x\": \"nodes\"\n";
        String text = decoys + ", \"nodes\": [{\"id\": 0}]}";
        assertEquals(text.indexOf("\"nodes\": [") + "\"nodes\": ".length(), bracket(text));
        assertEquals(-1, bracket("{\"name\": \"nodes\", \"description\": \"\\\"nodes\\\": [\"}"));
        assertEquals(-1, bracket("{\"nodes\": {\"a\": 1}}"), "a member that is no array");
    }

    @Test
    void notLookedForBeyondTheSearchedBytes() throws Exception {
        String head = header(120_000);
        assertEquals(true, head.length() > NodeArrayHead.SEARCH_BYTES, "a header longer than the search");
        assertEquals(-1, bracket(head + "\"nodes\": [], \"outputs\": []}"));
    }
}
