package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code circa regions random} and {@code circa regions grid}. */
class RegionsCommandTest {
    @TempDir
    Path tmp;

    @Test
    void grid_3x3_halvingGivesABinaryTreeOfNineCells() throws Exception {
        Path out = tmp.resolve("g.json");
        Cli.Result r = Cli.run("regions", "grid", "--height", "3", "--width", "3", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        // By hand: halving down to single cells is a binary tree with 9 leaves, so 8 splits (partitions)
        // and 9 + 8 = 17 regions (a full binary tree with n leaves has n - 1 inner nodes, common practice).
        assertEquals("wrote " + out + ": 9 variables, 17 regions, 8 partitions", r.err().strip());
        RegionGraph g = new RegionGraphReader().read(out);
        assertEquals("r0c0", g.variables().get(0).name());
        assertEquals("r2c2", g.variables().get(8).name());
        assertPartitionsCoverTheirRegions(g);
    }

    @Test
    void random_seed7_sameAsTheGoldenFileAndEveryPartitionCoversItsRegion() throws Exception {
        Path out = tmp.resolve("r.json");
        Cli.Result r = Cli.run("regions", "random", "--vars", "6", "--depth", "2", "--repeats", "2", "--seed", "7",
                "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        // Golden file written by circa itself (fixtures/regions/SOURCE.md): guards the seeded splits.
        assertEquals(Files.readString(Path.of("..", "fixtures", "regions", "random-n6-d2-r2-seed7.json")),
                Files.readString(out));
        RegionGraph g = new RegionGraphReader().read(out);
        assertEquals(6, g.variables().size());
        // Two repeats of the root: the root has two partitions (FORMAT.md section 3).
        assertEquals(2, g.partitions().stream().filter(p -> p.region() == 0).count());
        assertPartitionsCoverTheirRegions(g);
    }

    @Test
    void random_bothVariableSources_status2() {
        Cli.Result r = Cli.run("regions", "random", "--vars", "3", "--variables", "v.json", "--depth", "1",
                "-o", tmp.resolve("x.json").toString());
        Cli.assertUnusable(r, "--vars", "exactly one of");
    }

    @Test
    void random_hundredMillionVariables_refusedBeforeWorkNamingMaxVars() {
        // 1e8 variables took 6.4 GB and 50 s (measured); at any depth they pass the default --max-vars (1e7)
        // before anything is allocated (Cli.run's guard stops a run that does the work)
        for (String depth : new String[] {"0", "1", "3"}) {
            Path out = tmp.resolve("big.json");
            Cli.Result r = Cli.run("regions", "random", "--vars", "100000000", "--depth", depth, "-o", out.toString());
            Cli.assertUnusable(r, "--max-vars", "100000000 variables");
            assertTrue(r.err().startsWith("circa: a random region graph of 100000000 variables is more than the limit of"
                    + " 10000000 set by --max-vars") && r.err().contains("raise it with --max-vars"), r::describe);
            assertFalse(Files.exists(out), "nothing written");
        }
        // with --max-vars raised, 1e8 variables split to depth 3 hold 1e8 + 3 * 1e8 variable references, past
        // the default --max-nodes (2e8)
        Path out = tmp.resolve("big.json");
        Cli.Result r = Cli.run("regions", "random", "--vars", "100000000", "--depth", "3", "--max-vars", "100000000",
                "-o", out.toString());
        Cli.assertUnusable(r, "--max-nodes", "100000000 variables");
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    void random_variablesFilePastMaxVars_refusedNamingIt() throws Exception {
        Path vars = Files.writeString(tmp.resolve("v.json"), "[{\"name\": \"inlet_pressure\", \"type\": \"real\"},"
                + " {\"name\": \"valve\", \"type\": \"binary\"}, {\"name\": \"trips\", \"type\": \"count\"}]");
        Path out = tmp.resolve("three.json");
        Cli.Result r = Cli.run("regions", "random", "--variables", vars.toString(), "--depth", "1", "--max-vars", "2",
                "-o", out.toString());
        Cli.assertUnusable(r, "--max-vars", "3 variables is more than the limit of 2");
        assertFalse(Files.exists(out), "nothing written");
        Cli.Result ok = Cli.run("regions", "random", "--variables", vars.toString(), "--depth", "1", "--max-vars", "3",
                "-o", out.toString());
        assertEquals(ExitStatus.OK, ok.status(), ok::describe);
    }

    @Test
    void random_millionVariablesAtDepthOne_accepted() throws Exception {
        // within the default limits (1e6 <= 1e7 variables, 2e6 references <= 2e8): written whole
        Path out = tmp.resolve("million.json");
        Cli.Result r = Cli.run("regions", "random", "--vars", "1000000", "--depth", "1", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        assertTrue(r.err().contains("1000000 variables, 3 regions"), r::describe);
        assertTrue(Files.size(out) > 1_000_000 * 10L, "every variable written");
    }

    @Test
    void random_commandsMaxNodes_boundsTheGraph() throws Exception {
        // By hand: 100 variables at depth 2 with one repeat hold at most 100 + 1 * 100 * 2 = 300 references.
        Path out = tmp.resolve("r.json");
        Cli.Result refused = Cli.run("regions", "random", "--vars", "100", "--depth", "2", "--max-nodes", "299",
                "-o", out.toString());
        Cli.assertUnusable(refused, "--max-nodes", "300 variable references");
        assertFalse(Files.exists(out), "nothing written");
        Cli.Result ok = Cli.run("regions", "random", "--vars", "100", "--depth", "2", "--max-nodes", "300",
                "-o", out.toString());
        assertEquals(ExitStatus.OK, ok.status(), ok::describe);
        assertEquals(100, new RegionGraphReader().read(out).variables().size());
    }

    @Test
    void regions_withoutSubcommand_status2() {
        Cli.Result r = Cli.run("regions");
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains("choose random or grid"), r::describe);
    }

    /** Each partition's parts are disjoint and their union is the partitioned region (FORMAT.md section 3). */
    private static void assertPartitionsCoverTheirRegions(RegionGraph g) {
        Map<Integer, int[]> vars = new HashMap<>();
        for (Region region : g.regions()) {
            vars.put(region.id(), region.vars());
        }
        for (Partition p : g.partitions()) {
            int[] union = Arrays.stream(p.parts()).flatMap(part -> Arrays.stream(vars.get(part))).sorted().toArray();
            int[] whole = Arrays.stream(vars.get(p.region())).sorted().toArray();
            assertArrayEquals(whole, union, "partition of region " + p.region());
        }
    }
}
