package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/**
 * A string with a lone UTF-16 surrogate (JSON text may spell one as an escape, RFC 8259 section 8.2)
 * is not Unicode text: no UTF-8 file or CSV cell can hold it, so a label or name made of it could not
 * round-trip. Every reader refuses it, located, with the reason; a surrogate pair is a character.
 */
class LoneSurrogateTest {
    private static String circuit(String label) {
        return "{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [{\"name\": \"valve\","
                + " \"type\": \"categorical\", \"states\": [\"a\", \"" + label + "\"]}], \"nodes\": [{\"id\": 0,"
                + " \"input\": \"categorical\", \"var\": 0, \"probs\": [0.5, 0.5]}], \"outputs\": [{\"name\": \"joint\", \"node\": 0}]}";
    }

    @Test
    void read_loneSurrogateInALabel_locatedError() {
        for (String escape : new String[] {"\\ud800", "x\\udc00", "\\ud83d"}) {
            FormatException e = assertThrows(FormatException.class, () -> new CircuitReader()
                    .read(new ByteArrayInputStream(circuit(escape).getBytes(StandardCharsets.UTF_8)), "s.json"));
            assertTrue(e.getMessage().startsWith("s.json:1:"), e.getMessage());
            assertTrue(e.getMessage().contains("lone surrogate"), e.getMessage());
        }
    }

    @Test
    void read_surrogatePair_oneCharacterKept() throws FormatException {
        CircuitDocument doc = new CircuitReader()
                .read(new ByteArrayInputStream(circuit("\\ud83d\\ude00").getBytes(StandardCharsets.UTF_8)), "s.json");
        assertEquals("\ud83d\ude00", doc.variables().get(0).states().get(1));
    }
}
