package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.Evaluator;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

class RegionConverterTest {
    private static final Path PARAMS = Path.of("..", "fixtures", "npz", "example-params.npz");
    private static final RegionConverter.Verification CHECK = new RegionConverter.Verification(50, 1, 1e-9, 1e-9);

    @Test
    void convert_numpyParameters_matchesReferenceAndNamesTheFile() throws Exception {
        RegionConverter.Result r = RegionConverter.convert(RegionCompilerTest.example(), RegionCompilerTest.k3i2c1(),
                ParameterSource.file(PARAMS), CHECK, ReadLimits.DEFAULT);
        assertTrue(r.passed(), r.summary());
        assertTrue(r.validation().valid(), r.validation().toString());
        assertEquals(50 * 3 + 1, r.verification().points(), r.summary());
        String provenance = r.circuit().provenance().source();
        assertTrue(provenance.endsWith(", parameters " + PARAMS), provenance);
        // NumPy/SciPy-written reference log-densities (fixtures/npz/SOURCE.md), rows without missing values
        Evaluator e = new Evaluator(r.compiled());
        List<double[]> rows = RegionCompilerTest.referenceRows();
        int checked = 0;
        for (double[] row : rows) {
            double[] x = java.util.Arrays.copyOf(row, row.length - 1);
            if (java.util.Arrays.stream(x).anyMatch(Double::isNaN)) {
                continue;
            }
            double want = row[row.length - 1];
            double[] got = new double[1];
            e.logDensity(x, 1, got);
            assertEquals(want, got[0], 1e-9 * Math.max(1, Math.abs(want)));
            checked++;
        }
        assertTrue(checked > 0);
    }

    @Test
    void convert_seed_provenanceNamesTheSeed() throws Exception {
        RegionConverter.Result r = RegionConverter.convert(GridRegions.generate(2, 2),
                new CompileOptions(2, 2, 1, java.util.Map.of()), ParameterSource.seed(3), CHECK, ReadLimits.DEFAULT);
        assertTrue(r.passed(), r.summary());
        assertTrue(r.circuit().provenance().source().endsWith(", seed 3"), r.circuit().provenance().source());
    }

    @Test
    void convert_overMaxNodes_refusedBeforeReadingParameters() throws Exception {
        // a missing parameter file is not read: the size guard comes first
        FormatException e = assertThrows(LimitExceededException.class, () -> RegionConverter.convert(
                RegionCompilerTest.example(), RegionCompilerTest.k3i2c1(), ParameterSource.file(Path.of("no-such.npz")),
                CHECK, ReadLimits.DEFAULT.withMaxNodes(5)));
        assertTrue(e.getMessage().contains("--max-nodes"), e.getMessage());
    }
}
