package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.regions.RegionGraphReader;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The rules of FORMAT.md section 3 for region graphs, one invalid document per rule. */
class RegionStructureTest {
    private static final String HEAD = """
            {"format": "circa.regions", "version": "1.0",
            "variables": [{"name": "inlet_pressure", "type": "real"}, {"name": "valve", "type": "categorical",
              "states": ["closed", "open"]}, {"name": "alarm", "type": "binary"}],
            """;

    @Test
    void of_example_rootOrderAndLeaves() throws IOException {
        // Source: shared/data/npz/example-regions.json
        RegionStructure s = RegionStructure.of(new RegionGraphReader().read(Path.of("..", "fixtures", "npz",
                "example-regions.json")));
        assertEquals(0, s.id(s.root()));
        assertArrayEquals(new int[] {0, 1}, s.partitionsOf(s.root()));
        assertTrue(s.isLeaf(3));
        int[] order = s.order();
        assertEquals(s.root(), order[order.length - 1]);
        int[] rank = new int[order.length];
        for (int i = 0; i < order.length; i++) {
            rank[order[i]] = i;
        }
        for (int p = 0; p < s.partitionCount(); p++) {
            for (int q : s.parts(p)) {
                assertTrue(rank[q] < rank[s.partitionRegion(p)], "part after its region");
            }
        }
    }

    @Test
    void of_invalidGraphs_locatedMessages() {
        record Case(String body, String pointer, int line, String fragment) {
        }
        List<Case> cases = List.of(
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]},
                        {"id": 0, "vars": [0]}]}""", "/regions/1", 5, "region id 0 appears twice"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 2, 1]}]}""", "/regions/0", 4, "are not sorted and unique"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 1, 2]}]}""", "/regions/0", 4, "are not sorted and unique"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 3]}]}""", "/regions/0", 4, "names variable 3"),
                new Case("""
                        "regions": [{"id": 0, "vars": []}]}""", "/regions/0", 4, "has no variables"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1, 2]}],
                        "partitions": [{"region": 0, "parts": [1, 5]}]}""", "/partitions/0", 5, "names part 5"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1, 2]}],
                        "partitions": [{"region": 0, "parts": [1, 2]},
                          {"region": 1, "parts": [2]}]}""", "/partitions/1", 6, "has 1 part; expected at least 2"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0, 1]}, {"id": 2, "vars": [1, 2]}],
                        "partitions": [{"region": 0, "parts": [1, 2]}]}""", "/partitions/0", 5,
                        "variable 1 (valve) is in more than one"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1]}],
                        "partitions": [{"region": 0, "parts": [1, 2]}]}""", "/partitions/0", 5, "cover 2 of its 3 variables"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1, 2]}],
                        "partitions": [{"region": 0, "parts": [1, 2]}]}""", "/partitions/0", 5,
                        "variable 2 (alarm), which is not in region 0"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1, 2]},
                          {"id": 3, "vars": [2]}],
                        "partitions": [{"region": 0, "parts": [1, 2]}]}""", "/regions/3", 5, "are both roots"),
                new Case("""
                        "regions": [{"id": 4, "vars": [0, 1]}]}""", "/regions/0", 4, "has 2 of the 3 variables"),
                new Case("""
                        "regions": [{"id": 0, "vars": [0, 1, 2]}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1, 2]}],
                        "partitions": [{"region": 9, "parts": [1, 2]}]}""", "/partitions/0", 5, "names region 9"));
        for (Case c : cases) {
            FormatException e = assertThrows(FormatException.class,
                    () -> RegionStructure.of(new RegionGraphReader().readString(HEAD + c.body(), "rg.json")), c.fragment());
            assertTrue(e.getMessage().contains(c.fragment()), e.getMessage() + "\n expected " + c.fragment());
            assertEquals(c.pointer(), e.pointer(), e.getMessage());
            assertEquals(c.line(), e.line(), e.getMessage());
            assertTrue(e.column() > 0, e.getMessage());
            assertTrue(e.getMessage().startsWith("rg.json:" + c.line() + ":"), e.getMessage());
        }
    }

    @Test
    void of_badVariables_pointerAtVariable() {
        record Case(String vars, String pointer, String fragment) {
        }
        List<Case> cases = List.of(
                new Case("[{\"name\": \"valve\", \"type\": \"real\"}, {\"name\": \"valve\", \"type\": \"count\"}]",
                        "/variables/1", "used by variables 0 and 1"),
                new Case("[{\"name\": \"valve\", \"type\": \"categorical\", \"states\": [\"open\"]}, "
                        + "{\"name\": \"alarm\", \"type\": \"binary\"}]", "/variables/0", "expected at least 2 unique state labels"),
                new Case("[{\"name\": \"valve\", \"type\": \"real\"}, {\"name\": \"alarm\", \"type\": \"binary\","
                        + " \"states\": [\"off\", \"on\", \"stuck\"]}]", "/variables/1", "expected none or 2 unique labels"));
        for (Case c : cases) {
            String doc = "{\"format\": \"circa.regions\", \"version\": \"1.0\", \"variables\": " + c.vars()
                    + ", \"regions\": [{\"id\": 0, \"vars\": [0, 1]}]}";
            FormatException e = assertThrows(FormatException.class,
                    () -> RegionStructure.of(new RegionGraphReader().readString(doc, "v.json")));
            assertTrue(e.getMessage().contains(c.fragment()), e.getMessage());
            assertEquals(c.pointer(), e.pointer());
            // the variable's own line and column: where its object starts in the one-line document
            int at = doc.indexOf("[{") + 1;
            if (c.pointer().endsWith("/1")) {
                at = doc.indexOf("}, {", at) + 3;
            }
            assertEquals(1, e.line(), e.getMessage());
            assertEquals(at + 1, e.column(), e.getMessage());
            assertTrue(e.getMessage().startsWith("v.json:1:" + (at + 1) + ": "), e.getMessage());
        }
    }

    @Test
    void of_noRegionsOrNoVariables_locatedAtTheArray() {
        String noRegions = "{\"format\": \"circa.regions\", \"version\": \"1.0\",\n"
                + "\"variables\": [{\"name\": \"x\", \"type\": \"real\"}],\n\"regions\": []}";
        FormatException e = assertThrows(FormatException.class,
                () -> RegionStructure.of(new RegionGraphReader().readString(noRegions, "r.json")));
        assertTrue(e.getMessage().startsWith("r.json:3:12: a region graph needs at least one region"), e.getMessage());
        String noVariables = "{\"format\": \"circa.regions\", \"version\": \"1.0\",\n"
                + "\"variables\": [],\n\"regions\": [{\"id\": 0, \"vars\": []}]}";
        FormatException v = assertThrows(FormatException.class,
                () -> RegionStructure.of(new RegionGraphReader().readString(noVariables, "r.json")));
        assertTrue(v.getMessage().startsWith("r.json:2:14: a region graph needs at least one variable"), v.getMessage());
    }
}
