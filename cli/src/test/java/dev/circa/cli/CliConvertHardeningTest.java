package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Hostile and malformed sources of {@code convert} (issue 8): each ends with status 2 and one
 * message naming the file, no stack trace, and no output; an existing output stays as it was.
 */
class CliConvertHardeningTest {
    private static final Path MIXTURE = Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml");
    private static final byte[] OLD = "old output\n".getBytes(java.nio.charset.StandardCharsets.UTF_8);

    @TempDir
    Path dir;
    private Path out;

    @BeforeEach
    void setUp() throws IOException {
        out = dir.resolve("out.json");
        Files.write(out, OLD);
    }

    private void assertRefused(Cli.Result r, String name, String fragment) throws IOException {
        Cli.assertUnusable(r, name, fragment);
        assertArrayEquals(OLD, Files.readAllBytes(out), "the existing output changed");
        try (var s = Files.list(dir)) {
            assertFalse(s.anyMatch(p -> p.getFileName().toString().endsWith(".tmp")), "a temporary file was left");
        }
    }

    /** One root over n single-variable leaves in one partition: I^n products from a file of a few hundred bytes. */
    static String starGraph(int n) {
        StringBuilder sb = new StringBuilder("{\"format\": \"circa.regions\", \"version\": \"1.0\", \"variables\": [");
        for (int i = 0; i < n; i++) {
            sb.append(i > 0 ? ", " : "").append("{\"name\": \"x").append(i).append("\", \"type\": \"real\"}");
        }
        sb.append("],\n\"regions\": [{\"id\": 0, \"vars\": [");
        for (int i = 0; i < n; i++) {
            sb.append(i > 0 ? ", " : "").append(i);
        }
        sb.append("]}");
        for (int i = 0; i < n; i++) {
            sb.append(", {\"id\": ").append(i + 1).append(", \"vars\": [").append(i).append("]}");
        }
        sb.append("],\n\"partitions\": [{\"region\": 0, \"parts\": [");
        for (int i = 0; i < n; i++) {
            sb.append(i > 0 ? ", " : "").append(i + 1);
        }
        return sb.append("]}]}\n").toString();
    }

    @Test
    void convert_regionGraphWhoseCircuitExplodes_status2NamingTheFile() throws IOException {
        for (int n : new int[] {14, 24}) {
            Path g = dir.resolve("star-" + n + ".json");
            Files.writeString(g, starGraph(n));
            assertRefused(Cli.run("convert", g.toString(), "-o", out.toString()), g.toString(), "--max-nodes");
        }
        // 3 leaves of 4 inputs, 4^3 products and 1 sum: 77 nodes (FORMAT.md section 3, counted by hand)
        Path g = dir.resolve("star-3.json");
        Files.writeString(g, starGraph(3));
        Cli.Result r = Cli.run("convert", g.toString(), "-o", out.toString(), "--max-nodes", "76");
        assertRefused(r, g.toString(), "would have 77 nodes");
        Cli.Result raised = Cli.run("convert", g.toString(), "-o", out.toString(), "--max-nodes", "77");
        assertEquals(ExitStatus.OK, raised.status(), raised::describe);
    }

    @Test
    void convert_circuitUnderMaxNodesButBeyondTheHeap_status2InsteadOfOutOfMemory() throws IOException {
        // 13 leaves of 4 inputs: 4^13 = 67,108,864 products of 13 children each (FORMAT.md section 3, by hand):
        // under the default --max-nodes, but some 872 million child references, far beyond the test heap.
        Path g = dir.resolve("star-13.json");
        Files.writeString(g, starGraph(13));
        assertRefused(Cli.run("convert", g.toString(), "-o", out.toString()), g.toString(), "Java heap");
    }

    @Test
    void convert_mixtureUseCycle_status2NamingTheFile() throws IOException {
        Path m = dir.resolve("cycle.yaml");
        Files.writeString(m, "format: circa.mixture\nversion: \"1.0\"\nvariables:\n  - {name: x, type: real}\n"
                + "definitions:\n  a: {mixture: [{weight: 1, use: b}]}\n  b: {product: [{use: a}]}\nmodel: {use: a}\n");
        assertRefused(Cli.run("convert", m.toString(), "-o", out.toString()), m.toString(), "cycle");
    }

    @Test
    void convert_malformedSources_status2NamingTheFile() throws IOException {
        String mixture = Files.readString(MIXTURE);
        String[][] cases = {
            {"empty.yaml", "", "empty"},
            {"nan.yaml", mixture.replace("mean: 12.0", "mean: .nan"), ".nan"},
            {"anchor.yaml", mixture.replace("variables:", "variables: &v"), "anchor"},
            {"truncated.yaml", mixture.substring(0, mixture.length() / 2), ""},
            {"plain.yaml.gz", mixture, "not gzip-compressed"},
            {"deep.json", "{\"format\": \"circa.mixture\", \"version\": \"1.0\", \"extensions\": {\"x\": " + "[".repeat(200_000), "--max-depth"},
        };
        for (String[] c : cases) {
            Path p = dir.resolve(c[0]);
            Files.writeString(p, c[1]);
            assertRefused(Cli.run("convert", p.toString(), "-o", out.toString()), p.toString(), c[2]);
        }
    }

    @Test
    void convert_outputNamingTheSource_refused() throws IOException {
        Path m = dir.resolve("m.yaml");
        Files.copy(MIXTURE, m);
        String sum = Cli.sha256(m);
        Cli.assertUnusable(Cli.run("convert", m.toString(), "-o", dir + "/./m.yaml"), "m.yaml", "refusing to write over an input");
        assertEquals(sum, Cli.sha256(m));
        Cli.Result ok = Cli.run("convert", m.toString(), "-o", out.toString());
        assertEquals(ExitStatus.OK, ok.status(), ok::describe);
        assertEquals(sum, Cli.sha256(m));
    }
}
