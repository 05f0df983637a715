package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ConvertCommandTest {
    private static final String MIXTURE = "../fixtures/mixtures/pump-station-regimes.yaml";
    private static final String REGIONS = "../fixtures/npz/example-regions.json";
    private static final String PARAMS = "../fixtures/npz/example-params.npz";
    private static final String REFERENCE = "../fixtures/npz/example-reference.csv";

    @TempDir
    Path tmp;

    @Test
    void convert_demoMixture_verifiedWrittenAndValid() {
        Path out = tmp.resolve("regimes.json");
        Cli.Result r = Cli.run("convert", MIXTURE, "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        assertTrue(r.err().contains("passed"), r.err());
        assertEquals(0, Cli.run("validate", out.toString()).status());
    }

    @Test
    void convert_numpyParameters_reproducesNumpyScipyReference() {
        Path out = tmp.resolve("stations.json");
        Cli.Result r = Cli.run("convert", REGIONS, "--params", PARAMS, "--sums", "3", "--inputs", "2",
                "--outputs", "1", "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        // example-reference.csv: log-densities computed with NumPy 1.24 and SciPy 1.10 (fixtures/npz/SOURCE.md).
        Cli.Result check = Cli.run("check", out.toString(), "--reference", REFERENCE);
        assertEquals(0, check.status(), check.out() + check.err());
        assertTrue(check.out().contains("6 cases, 0 failures"), check.out());
    }

    @Test
    void convert_wrongShapeParameters_status2NamesTheArray() {
        Path out = tmp.resolve("stations.json");
        Cli.Result r = Cli.run("convert", REGIONS, "--params", PARAMS, "--sums", "4", "--inputs", "2",
                "-o", out.toString());
        assertEquals(2, r.status(), r.err());
        assertTrue(r.err().contains("weights"), r.err());
        assertFalse(Files.exists(out));
    }

    @Test
    void regionsRandomConvertExport_roundTripReproducesParameters() throws Exception {
        Path rg = tmp.resolve("rg.json");
        Path c1 = tmp.resolve("c1.json");
        Path p = tmp.resolve("p.npz");
        Path c2 = tmp.resolve("c2.json");
        assertEquals(0, Cli.run("regions", "random", "--vars", "6", "--depth", "2", "--repeats", "2",
                "--seed", "3", "-o", rg.toString()).status());
        assertEquals(0, Cli.run("convert", rg.toString(), "--seed", "5", "--sums", "2", "--inputs", "3",
                "-o", c1.toString()).status());
        assertEquals(0, Cli.run("convert", c1.toString(), "--to-params", p.toString(), "--regions",
                rg.toString()).status());
        Cli.Result back = Cli.run("convert", rg.toString(), "--params", p.toString(), "--sums", "2", "--inputs",
                "3", "-o", c2.toString());
        assertEquals(0, back.status(), back.err());
        Cli.Result cmp = Cli.run("compare", c1.toString(), c2.toString());
        assertEquals(0, cmp.status(), cmp.out() + cmp.err());
        assertTrue(cmp.out().contains("structurally identical"), cmp.out());
    }

    @Test
    void regionsGrid_writesRegionGraphThatCompiles() throws Exception {
        Path rg = tmp.resolve("grid.json");
        assertEquals(0, Cli.run("regions", "grid", "--height", "2", "--width", "3", "-o", rg.toString()).status());
        String text = Files.readString(rg);
        assertTrue(text.contains("\"r1c2\""), text);
        Path c = tmp.resolve("grid-circuit.json");
        assertEquals(0, Cli.run("convert", rg.toString(), "--sums", "2", "--inputs", "2", "-o", c.toString()).status());
        Cli.Result v = Cli.run("validate", "--format", "json", c.toString());
        assertEquals(0, v.status(), v.out());
        assertTrue(v.out().contains("\"structuredDecomposable\" : true"), v.out());
    }

    @Test
    void convert_circuitWithoutToParams_status2() {
        Cli.Result r = Cli.run("convert", "../fixtures/circuits/pump-station.json", "-o", tmp.resolve("x.json").toString());
        assertEquals(2, r.status());
        assertTrue(r.err().contains("already a circuit"), r.err());
    }

    @Test
    void convert_outputNamingInput_refused() throws Exception {
        Path copy = tmp.resolve("m.yaml");
        Files.copy(Path.of(MIXTURE), copy);
        byte[] before = Files.readAllBytes(copy);
        Cli.Result r = Cli.run("convert", copy.toString(), "-o", copy.toString());
        assertEquals(2, r.status(), r.err());
        assertArrayEquals(before, Files.readAllBytes(copy));
    }
}
