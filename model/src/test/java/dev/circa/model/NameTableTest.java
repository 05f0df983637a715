package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The name table behind variable and label lookups: every name found at its position, every other name
 * missed, also among names whose {@link String#hashCode()} is the same, and with tables of every fill.
 */
class NameTableTest {
    /**
     * Six names of one hash code: "Aa" and "BB" hash alike (31 * 'A' + 'a' = 31 * 'B' + 'B' = 2112), and
     * so does any concatenation of equally many of them (String.hashCode is polynomial in the
     * characters; common practice). The test checks the premise itself.
     */
    private static final List<String> COLLIDING = List.of("AaAa", "AaBB", "BBAa", "BBBB", "AaAaAa", "BBBBBB");

    @Test
    void find_collidingHashes_eachNameAtItsPosition() {
        assertEquals("Aa".hashCode(), "BB".hashCode());
        assertEquals("AaAa".hashCode(), "BBBB".hashCode());
        assertEquals("AaAaAa".hashCode(), "BBBBBB".hashCode());
        for (boolean intern : new boolean[] {false, true}) {
            NameTable t = new NameTable(COLLIDING, intern);
            for (int p = 0; p < COLLIDING.size(); p++) {
                // an equal name that is another object, as a caller holds after parsing
                assertEquals(p, t.find(new String(COLLIDING.get(p).toCharArray())), COLLIDING.get(p));
                assertEquals(p, t.find(COLLIDING.get(p)));
            }
            // same hash code as names in the table, not in the table
            assertEquals(-1, t.find("BBAaBB"));
            assertEquals(-1, t.find("AaBBAa"));
            assertEquals(-1, t.find("Aa"));
        }
    }

    @Test
    void find_everySizeAndFill_everyNameFoundOthersMissed() {
        Random rnd = new Random(14);
        for (int n = 0; n <= 300; n += n < 20 ? 1 : 37) {
            List<String> names = new ArrayList<>();
            Map<String, Integer> reference = new HashMap<>();
            while (names.size() < n) {
                String s = Integer.toString(rnd.nextInt(1 << 20), 36);
                if (reference.putIfAbsent(s, names.size()) == null) {
                    names.add(s);
                }
            }
            NameTable t = new NameTable(names, n % 2 == 0);
            for (String s : names) {
                assertEquals(reference.get(s), t.find(new String(s.toCharArray())), s);
                assertEquals(reference.get(s), t.find(s), s);
            }
            for (int k = 0; k < 200; k++) {
                String s = Integer.toString(rnd.nextInt(1 << 20), 36) + "_";
                assertEquals(-1, t.find(s), s);
            }
        }
    }

    @Test
    void find_nullEmptyAndRepeatedNames_missedOrFirstPosition() {
        NameTable t = new NameTable(List.of("closed", "half", "closed", "", "open"), true);
        assertEquals(0, t.find("closed"));
        assertEquals(1, t.find("half"));
        assertEquals(3, t.find(""));
        assertEquals(4, t.find("open"));
        assertEquals(-1, t.find(null));
        assertEquals(-1, t.find("Closed"));
        assertEquals(-1, NameTable.EMPTY.find(""));
        assertEquals(-1, NameTable.EMPTY.find("x"));
    }
}
