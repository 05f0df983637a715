package dev.circa.format;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/**
 * Locations of nodes read in two parts: the second part's reader counts its first node on its line 2,
 * column 1; appended with where that line starts in the file, every node reads back at its place in
 * the file (the second part's first line shifted by the start column too), also when more nodes are
 * recorded after the two parts met.
 */
class NodeLocationsTest {
    @Test
    void secondPartTranslatedToTheFile() {
        NodeLocations.Recorder first = new NodeLocations.Recorder();
        for (int i = 0; i < 3000; i++) {
            first.add(2 + i, 1);
        }
        NodeLocations.Recorder second = new NodeLocations.Recorder();
        second.add(2, 1);
        second.add(2, 40);
        for (int i = 0; i < 2000; i++) {
            second.add(3 + i, 5);
        }
        // the second part's line 2 is the file's line 3002, starting at column 7
        first.appendAll(second, 3002, 7);
        NodeLocations built = first.build();
        assertEquals(2, built.line(0));
        assertEquals(3001, built.line(2999));
        assertEquals(3002, built.line(3000));
        assertEquals(7, built.column(3000));
        assertEquals(3002, built.line(3001));
        assertEquals(46, built.column(3001));
        assertEquals(3003, built.line(3002));
        assertEquals(5, built.column(3002));
        assertEquals(5002, built.line(5001));
        assertEquals(0, built.line(5002), "past the last node: unknown");

        first.add(9000, 3);
        NodeLocations more = first.build();
        assertEquals(46, more.column(3001));
        assertEquals(5002, more.line(5001));
        assertEquals(9000, more.line(5002));
        assertEquals(3, more.column(5002));
    }
}
