package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphWriter;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class GeneratorsTest {
    @Test
    void splitMix64_anySeed_sameStreamAsJdkSplittableRandom() {
        // Source: java.util.SplittableRandom (JDK 17), whose nextLong() is SplitMix64 with the same
        // golden-ratio increment and variant-13 mixing constants.
        for (long seed : new long[] {0, 1, -1, 42, 0x123456789ABCDEFL}) {
            SplitMix64 ours = new SplitMix64(seed);
            SplittableRandom jdk = new SplittableRandom(seed);
            for (int i = 0; i < 1000; i++) {
                assertEquals(jdk.nextLong(), ours.nextLong());
            }
        }
    }

    @Test
    void splitMix64_gammaDraws_meanAndVarianceOfGamma() {
        // Gamma(shape, 1) has mean shape and variance shape (handbook fact, from memory); 200,000 draws.
        for (double shape : new double[] {0.5, 1, 3.5}) {
            SplitMix64 r = new SplitMix64(7);
            int n = 200_000;
            double sum = 0;
            double sq = 0;
            for (int i = 0; i < n; i++) {
                double g = r.nextGamma(shape);
                sum += g;
                sq += g * g;
            }
            double mean = sum / n;
            double var = sq / n - mean * mean;
            assertEquals(shape, mean, 5 * Math.sqrt(shape / n) + 1e-3, "mean for shape " + shape);
            assertEquals(shape, var, 0.05 * shape + 0.02, "variance for shape " + shape);
        }
    }

    @Test
    void random_sameSeed_sameBytesAndValidSplits() throws IOException {
        List<Variable> vars = RandomRegions.realVariables(13);
        RegionGraph a = RandomRegions.generate(vars, 3, 4, 99);
        assertArrayEquals(bytes(a), bytes(RandomRegions.generate(vars, 3, 4, 99)));
        assertFalse(java.util.Arrays.equals(bytes(a), bytes(RandomRegions.generate(vars, 3, 4, 100))));
        RegionStructure s = RegionStructure.of(a);
        assertEquals(4, s.partitionsOf(s.root()).length);
        int[] depth = new int[a.regions().size()];
        for (Partition p : a.partitions()) {
            assertEquals(2, p.parts().length);
            for (int q : p.parts()) {
                assertTrue(a.regions().get(q).vars().length >= 1);
                depth[q] = depth[p.region()] + 1;
            }
        }
        for (int r = 0; r < depth.length; r++) {
            assertTrue(depth[r] <= 3);
            boolean leaf = s.isLeaf(r);
            assertEquals(leaf, depth[r] == 3 || a.regions().get(r).vars().length == 1, "region " + r);
        }
        assertEquals("x12", a.variables().get(12).name());
        assertEquals(VariableType.REAL, a.variables().get(12).type());
    }

    @Test
    void random_depthZero_rootOnly() throws FormatException {
        RegionGraph g = RandomRegions.generate(RandomRegions.realVariables(3), 0, 2, 1);
        assertEquals(1, g.regions().size());
        assertEquals(0, g.partitions().size());
        RegionStructure.of(g);
    }

    @Test
    void grid_twoByThree_splitsAsCliMdSays() throws FormatException {
        // Expected regions derived by hand from the rule of CLI.md: split the longer side (height on ties)
        // at floor(length / 2), breadth first. Variables r<row>c<col> row-major: r0c0=0 ... r1c2=5.
        RegionGraph g = GridRegions.generate(2, 3);
        List<int[]> want = List.of(new int[] {0, 1, 2, 3, 4, 5}, new int[] {0, 3}, new int[] {1, 2, 4, 5},
                new int[] {0}, new int[] {3}, new int[] {1, 2}, new int[] {4, 5}, new int[] {1}, new int[] {2},
                new int[] {4}, new int[] {5});
        assertEquals(want.size(), g.regions().size());
        for (int i = 0; i < want.size(); i++) {
            Region r = g.regions().get(i);
            assertEquals(i, r.id());
            assertArrayEquals(want.get(i), r.vars(), "region " + i);
        }
        assertEquals("r1c2", g.variables().get(5).name());
        assertEquals(5, g.partitions().size());
        assertArrayEquals(new int[] {1, 2}, g.partitions().get(0).parts());
        RegionStructure s = RegionStructure.of(g);
        for (int r = 0; r < s.regionCount(); r++) {
            assertEquals(s.vars(r).length == 1, s.isLeaf(r));
        }
    }

    @Test
    void grid_oneCell_rootIsLeaf() throws FormatException {
        RegionGraph g = GridRegions.generate(1, 1);
        assertEquals(1, g.regions().size());
        assertTrue(RegionStructure.of(g).isLeaf(0));
    }

    @Test
    void generated_randomAndGrid_conformToRegionsSchema() throws IOException {
        for (RegionGraph g : List.of(GridRegions.generate(3, 5), RandomRegions.generate(RandomRegions.realVariables(9), 4, 3, 8))) {
            tools.jackson.databind.JsonNode tree = dev.circa.format.io.JsonInput
                    .mapperFor(dev.circa.format.io.ReadLimits.DEFAULT).readTree(bytes(g));
            assertEquals(List.of(), dev.circa.format.schema.SchemaCatalog.get()
                    .validate(dev.circa.format.schema.SchemaCatalog.Kind.REGIONS, tree));
        }
    }

    private static byte[] bytes(RegionGraph g) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new RegionGraphWriter().write(g, out);
        return out.toByteArray();
    }

    @Test
    void readVariables_jsonArray_variablesOrLocatedError(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir)
            throws IOException {
        java.nio.file.Path ok = dir.resolve("vars.json");
        java.nio.file.Files.writeString(ok, "[{\"name\": \"inlet_pressure\", \"type\": \"real\", \"unit\": \"bar\"},\n"
                + " {\"name\": \"valve\", \"type\": \"categorical\", \"states\": [\"closed\", \"half\", \"open\"]}]");
        List<Variable> vars = RandomRegions.readVariables(ok, dev.circa.format.io.ReadLimits.DEFAULT);
        assertEquals(2, vars.size());
        assertEquals(3, vars.get(1).stateCount());
        RegionStructure.of(RandomRegions.generate(vars, 2, 2, 5));
        java.nio.file.Path bad = dir.resolve("bad.json");
        java.nio.file.Files.writeString(bad, "[{\"name\": \"valve\", \"type\": \"real\",\n \"colour\": 1}]");
        FormatException e = org.junit.jupiter.api.Assertions.assertThrows(FormatException.class,
                () -> RandomRegions.readVariables(bad, dev.circa.format.io.ReadLimits.DEFAULT));
        assertTrue(e.getMessage().contains("unknown property \"colour\""), e.getMessage());
        assertEquals(2, e.line());
        java.nio.file.Path obj = dir.resolve("obj.json");
        java.nio.file.Files.writeString(obj, "{}");
        FormatException f = org.junit.jupiter.api.Assertions.assertThrows(FormatException.class,
                () -> RandomRegions.readVariables(obj, dev.circa.format.io.ReadLimits.DEFAULT));
        assertTrue(f.getMessage().contains("expected a JSON array of variables"), f.getMessage());
    }

    @Test
    void goldenFiles_randomGraphAndSeededCompile_sameBytes() throws IOException {
        // Golden files written by this code (fixtures/regions/SOURCE.md): a seed must keep giving the same bytes.
        java.nio.file.Path dir = java.nio.file.Path.of("..", "fixtures", "regions");
        assertArrayEquals(java.nio.file.Files.readAllBytes(dir.resolve("random-n6-d2-r2-seed7.json")),
                bytes(RandomRegions.generate(RandomRegions.realVariables(6), 2, 2, 7)));
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new dev.circa.format.io.CircuitWriter().write(RegionCompiler.compile(GridRegions.generate(2, 2),
                new CompileOptions(2, 2, 1, java.util.Map.of()), 3), out);
        assertArrayEquals(java.nio.file.Files.readAllBytes(dir.resolve("grid-2x2-k2-i2-seed3.circuit.json")), out.toByteArray());
    }
}
