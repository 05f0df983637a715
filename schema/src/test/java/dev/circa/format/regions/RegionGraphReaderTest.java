package dev.circa.format.regions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.io.FormatException;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RegionGraphReaderTest {
    /** Source: shared/data/npz/example-regions.json (a region graph written beside NumPy files, README there). */
    private static final Path EXAMPLE = Path.of("..", "fixtures", "npz", "example-regions.json");

    @TempDir
    Path tmp;

    @Test
    void read_exampleDocument_regionsAndPartitionsInOrder() throws IOException {
        RegionGraph g = new RegionGraphReader().read(EXAMPLE);
        assertEquals(4, g.variables().size());
        assertEquals("restarts", g.variables().get(3).name());
        assertEquals(9, g.regions().size());
        assertArrayEquals(new int[] {0, 1, 2, 3}, g.regions().get(0).vars());
        assertEquals(4, g.partitions().size());
        assertEquals(0, g.partitions().get(1).region());
        assertArrayEquals(new int[] {3, 4}, g.partitions().get(1).parts());
        SourceLocation l = g.regionLocation(1);
        assertEquals("/regions/1", l.pointer());
        assertTrue(l.line() > 20, l.toString());
    }

    @Test
    void writeThenRead_example_sameGraphAndCanonicalOrder() throws IOException {
        RegionGraph g = new RegionGraphReader().read(EXAMPLE);
        Path out = tmp.resolve("g.json");
        new RegionGraphWriter().write(g, out, EXAMPLE);
        String text = Files.readString(out);
        assertTrue(text.indexOf("\"format\"") < text.indexOf("\"version\"")
                && text.indexOf("\"version\"") < text.indexOf("\"variables\"")
                && text.indexOf("\"variables\"") < text.indexOf("\"regions\"")
                && text.indexOf("\"regions\"") < text.indexOf("\"partitions\""), text);
        RegionGraph h = new RegionGraphReader().read(out);
        assertEquals(g.variables(), h.variables());
        assertEquals(g.regions().size(), h.regions().size());
        for (int i = 0; i < g.regions().size(); i++) {
            assertEquals(g.regions().get(i).id(), h.regions().get(i).id());
            assertArrayEquals(g.regions().get(i).vars(), h.regions().get(i).vars());
        }
        for (int i = 0; i < g.partitions().size(); i++) {
            assertEquals(g.partitions().get(i).region(), h.partitions().get(i).region());
            assertArrayEquals(g.partitions().get(i).parts(), h.partitions().get(i).parts());
        }
        ByteArrayOutputStream again = new ByteArrayOutputStream();
        new RegionGraphWriter().write(h, again);
        assertEquals(text, again.toString(StandardCharsets.UTF_8));
        assertThrows(FormatException.class, () -> new RegionGraphWriter().write(g, EXAMPLE, EXAMPLE));
    }

    @Test
    void write_example_conformsToRegionsSchema() throws IOException {
        RegionGraph g = new RegionGraphReader().read(EXAMPLE);
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new RegionGraphWriter().write(g, out);
        tools.jackson.databind.JsonNode tree = dev.circa.format.io.JsonInput.mapperFor(dev.circa.format.io.ReadLimits.DEFAULT)
                .readTree(out.toByteArray());
        assertEquals(List.of(), dev.circa.format.schema.SchemaCatalog.get()
                .validate(dev.circa.format.schema.SchemaCatalog.Kind.REGIONS, tree));
    }

    @Test
    void read_membersInAnyOrder_sameGraph() throws FormatException {
        String json = """
                {"partitions": [{"parts": [1, 2], "region": 0}],
                 "regions": [{"vars": [0, 1], "id": 0}, {"id": 1, "vars": [0]}, {"id": 2, "vars": [1]}],
                 "variables": [{"type": "real", "name": "inlet_pressure"}, {"name": "alarm", "type": "binary"}],
                 "version": "1.0", "format": "circa.regions"}
                """;
        RegionGraph g = new RegionGraphReader().readString(json, "any.json");
        assertEquals(3, g.regions().size());
        assertArrayEquals(new int[] {1, 2}, g.partitions().get(0).parts());
    }

    @Test
    void read_newerMinorUnknownProperty_ignoredAsFinding() throws FormatException {
        String json = """
                {"format": "circa.regions", "version": "1.3", "variables": [{"name": "a", "type": "real"}],
                 "regions": [{"id": 0, "vars": [0], "weight": 2}], "future": true}
                """;
        RegionGraph g = new RegionGraphReader().readString(json, "new.json");
        assertEquals(2, g.findings().size());
        assertEquals(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR, g.findings().get(0).kind());
        assertEquals(List.of(), g.partitions());
    }

    @Test
    void read_malformed_locatedErrors() {
        record Case(String json, int line, int column, String pointer, String fragment) {
        }
        String head = "{\"format\": \"circa.regions\", \"version\": \"1.0\",\n\"variables\": [{\"name\": \"a\", \"type\": \"real\"}],\n";
        List<Case> cases = List.of(
                new Case(head + "\"regions\": [{\"id\": 0, \"vars\": [0]}, {\"vars\": [0]}]}", 3, 37, "/regions/1",
                        "a region needs an \"id\""),
                new Case(head + "\"regions\": [{\"id\": 0, \"vars\": \"x\"}]}", 3, 31, "/regions/0/vars",
                        "expected an array of integers"),
                new Case(head + "\"regions\": [{\"id\": -1, \"vars\": [0]}]}", 3, 20, "/regions/0/id", "out of range"),
                new Case(head + "\"regions\": [{\"id\": 0, \"vars\": [0], \"colour\": 1}]}", 3, 46,
                        "/regions/0/colour", "unknown property \"colour\" in a region"),
                new Case(head + "\"regions\": [{\"id\": 0, \"vars\": [0]}],\n\"partitions\": [{\"region\": 0}]}", 4, 16,
                        "/partitions/0", "needs \"parts\""),
                new Case("{\"format\": \"circa.circuit\", \"version\": \"1.0\"}", 1, 12, "/format", "unknown format"),
                new Case("{\"format\": \"circa.regions\", \"version\": \"2.0\"}", 1, 40, "/version", "unsupported major version"),
                new Case(head + "\"partitions\": []}", 1, 1, "", "missing \"regions\""),
                new Case("\n  {\"format\": \"circa.regions\", \"version\": \"1.0\", \"regions\": []}", 2, 3, "",
                        "missing \"variables\""));
        for (Case c : cases) {
            FormatException e = assertThrows(FormatException.class, () -> new RegionGraphReader().readString(c.json(), "g.json"),
                    c.fragment());
            assertTrue(e.getMessage().contains(c.fragment()), e.getMessage());
            assertEquals(c.pointer(), e.pointer(), e.getMessage());
            assertEquals(c.line(), e.line(), e.getMessage());
            assertEquals(c.column(), e.column(), e.getMessage());
            assertEquals("g.json", e.file());
        }
    }
}
