package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.npz.NpyArray;
import dev.circa.converter.npz.NpzArchive;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** convert's messages point at what the user wrote: the array of the archive, the options, the line and column. */
class ConvertMessagesTest {
    // example-regions.json and example-params.npz: written by NumPy 1.24 for K=3, I=2, C=1 (fixtures/npz/SOURCE.md)
    private static final String REGIONS = "../fixtures/npz/example-regions.json";
    private static final String PARAMS = "../fixtures/npz/example-params.npz";

    @TempDir
    Path tmp;

    /** The NumPy archive with the first row of {@code name} scaled by {@code factor}. */
    private Path scaled(String name, double factor) throws Exception {
        NpzArchive a = NpzArchive.read(Path.of(PARAMS), Long.MAX_VALUE);
        List<NpyArray> arrays = new ArrayList<>();
        for (NpyArray x : a.arrays()) {
            if (x.name().equals(name)) {
                double[] v = x.values().clone();
                for (int j = 0; j < x.dim(1); j++) {
                    v[j] *= factor;
                }
                x = NpyArray.ofDoubles(name, x.shape(), v);
            }
            arrays.add(x);
        }
        Path p = tmp.resolve("params.npz");
        NpzArchive.of(arrays).write(p, false);
        return p;
    }

    @Test
    void npzWeightsNotAddingToOne_reportedAtTheArrayAndRow_notAtANodeOfAnUnwrittenCircuit() throws Exception {
        NpzArchive a = NpzArchive.read(Path.of(PARAMS), Long.MAX_VALUE);
        String weights = a.names().stream().filter(n -> n.endsWith(".weights")).findFirst().orElseThrow();
        Path p = scaled(weights, 1.05);
        Path out = tmp.resolve("c.json");
        Cli.Result r = Cli.run("convert", REGIONS, "--params", p.toString(), "--sums", "3", "--inputs", "2", "-o", out.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertEquals(1, r.messages(), r::toString);
        assertTrue(r.message().startsWith("circa: " + p + ": array " + weights + ": row [0, :] "), r::toString);
        assertTrue(r.message().contains("adds to 1.0499999") && r.message().contains("expected 1 within 1.0E-9"), r::toString);
        assertFalse(r.err().contains("/nodes/"), r::toString);
        assertFalse(Files.exists(out));
        // the NumPy-written archive itself converts
        assertEquals(ExitStatus.OK, Cli.run("convert", REGIONS, "--params", PARAMS, "--sums", "3", "--inputs", "2",
                "-o", out.toString()).status());
    }

    @Test
    void npzLogWeightsNotAddingToOne_reportedAtTheArray() throws Exception {
        NpzArchive a = NpzArchive.read(Path.of(PARAMS), Long.MAX_VALUE);
        String logweights = a.names().stream().filter(n -> n.endsWith(".logweights")).findFirst().orElseThrow();
        // scaling log-weights by 1.5 moves their log-sum-exp away from 0
        Path p = scaled(logweights, 1.5);
        Cli.Result r = Cli.run("convert", REGIONS, "--params", p.toString(), "--sums", "3", "--inputs", "2",
                "-o", tmp.resolve("c.json").toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.message().contains("array " + logweights + ": row [0, :] (the weights of sum 0 of its region) has log-sum-exp"),
                r::toString);
    }

    @Test
    void npzShapeMismatch_hintsAtSumsAndInputs() {
        Cli.Result r = Cli.run("convert", REGIONS, "--params", PARAMS, "--sums", "4", "--inputs", "2",
                "-o", tmp.resolve("c.json").toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.message().contains(": has shape ("), r::toString);
        assertTrue(r.message().contains("compiling with K=4, I=2, C=1); check that --sums, --inputs and --outputs match"),
                r::toString);
    }
}
