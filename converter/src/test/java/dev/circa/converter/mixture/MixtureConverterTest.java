package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureReader;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.junit.jupiter.api.Test;

/** End to end: mixture document, circuit, engine evaluation, verification. */
class MixtureConverterTest {
    private static final Path DEMO = Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml");

    @Test
    void convert_demoFixture_verifiedAndValid() throws Exception {
        MixtureDocument doc = MixtureReader.read(DEMO, ReadLimits.DEFAULT);
        MixtureConverter.Result r = MixtureConverter.convert(doc, MixtureOptions.DEFAULT);
        assertTrue(r.verification().passed(), r.summary());
        assertEquals(2000, r.verification().points());
        assertTrue(r.summary().contains("passed"), r.summary());
        // the fixture has two definitions and two block-diagonal covariances (read off the file)
        assertEquals(2, r.definitions());
        assertEquals(2, r.splitCovariances());
        ConversionAssertions.assertValid(r.circuit());
    }

    @Test
    void convert_formatExample_circuitEqualsScipyReferences() throws Exception {
        CircuitDocument c = ConversionAssertions.convertVerified(ConverterStructureTest.read(
                ConverterStructureTest.FORMAT_EXAMPLE), MixtureOptions.DEFAULT);
        double[] log = ConversionAssertions.circuitLogDensity(c, new double[] {3.0, 2, 2.1, Double.NaN}, 2);
        // SciPy 1.10 reference values for this model, from FORMAT.md section 5
        assertEquals(0.18261296103078395, log[0], 1e-12);
        assertEquals(-2.1428574782131147, log[1], 1e-12);
    }

    @Test
    void convert_permutedBlockDiagonalCovariance_densityEqualsCommonsMathFullGaussian() throws Exception {
        MixtureDocument doc = ConverterStructureTest.read(ConverterStructureTest.BLOCK_DIAGONAL);
        CircuitDocument c = ConversionAssertions.convertVerified(doc, MixtureOptions.DEFAULT);
        double[][] cov = {{2.0, 0.0, 0.7, 0.0}, {0.0, 1.0, 0.0, 0.0}, {0.7, 0.0, 1.5, 0.0}, {0.0, 0.0, 0.0, 0.25}};
        MultivariateNormalDistribution full = new MultivariateNormalDistribution(new double[] {1, 2, 3, 4}, cov);
        full.reseedRandomGenerator(11);
        int n = 200;
        double[][] x = full.sample(n);
        double[] data = new double[n * 4];
        for (int r = 0; r < n; r++) {
            System.arraycopy(x[r], 0, data, r * 4, 4);
        }
        double[] log = ConversionAssertions.circuitLogDensity(c, data, n);
        for (int r = 0; r < n; r++) {
            // commons-math3 3.6.1: the density of the whole 4-dimensional normal
            double expected = full.density(x[r]);
            assertEquals(expected, Math.exp(log[r]), 1e-10 * expected, "point " + r);
        }
    }

    @Test
    void convert_circuitThatDisagrees_verificationFailsWithWorstPoints() throws Exception {
        MixtureDocument doc = ConverterStructureTest.read(ConverterStructureTest.FORMAT_EXAMPLE);
        // the circuit evaluated is the conversion with its root weights changed from 0.85/0.15 to 0.86/0.14
        MixtureConverter.Result r = MixtureConverter.convert(doc, MixtureOptions.DEFAULT, circuit -> {
            List<Node> nodes = new ArrayList<>(circuit.nodes());
            SumNode root = (SumNode) nodes.get(nodes.size() - 1);
            nodes.set(nodes.size() - 1, new SumNode(root.id(), root.label(), root.children(),
                    new double[] {0.86, 0.14}, false));
            return EngineDensity.of(CircuitDocument.builder().variables(circuit.variables()).nodes(nodes)
                    .outputs(circuit.outputs()).build());
        });
        assertFalse(r.verification().passed());
        assertTrue(r.verification().failures() > 0);
        assertTrue(r.verification().maxAbsDifference() > 1e-3);
        assertEquals(VerificationResult.WORST, r.verification().worst().size());
        assertTrue(r.summary().contains("beyond tolerance"), r.summary());
        assertTrue(r.summary().contains("inlet_pressure"), r.summary());
    }

    @Test
    void convert_sameSeed_sameVerification() throws Exception {
        MixtureDocument doc = MixtureReader.read(DEMO, ReadLimits.DEFAULT);
        MixtureOptions o = MixtureOptions.DEFAULT.withSeed(5).withVerifyPoints(300);
        VerificationResult a = MixtureConverter.convert(doc, o).verification();
        VerificationResult b = MixtureConverter.convert(doc, o).verification();
        assertEquals(a.maxAbsDifference(), b.maxAbsDifference());
        assertEquals(a.worst().get(0).point(), b.worst().get(0).point());
    }

    @Test
    void toCircuit_demoFixture_matchesGoldenCircuitBytes() throws Exception {
        // golden file written by this converter when the fixture was made and reviewed by hand against it;
        // a change in node order, ids, sharing or numbers shows here
        CircuitDocument c = MixtureConverter.toCircuit(MixtureReader.read(DEMO, ReadLimits.DEFAULT),
                MixtureOptions.DEFAULT);
        java.io.ByteArrayOutputStream out = new java.io.ByteArrayOutputStream();
        new dev.circa.format.io.CircuitWriter().write(c, out);
        assertEquals(java.nio.file.Files.readString(DEMO.resolveSibling("pump-station-regimes.circuit.json")),
                out.toString(java.nio.charset.StandardCharsets.UTF_8));
    }

    @Test
    void convert_schemaCorpus_validReadAndConvertedInvalidRejected() throws Exception {
        // the mixture corpus of the bundled JSON Schema (fixtures/schema-corpus/mixture): what the schema
        // accepts is read, and converts and verifies unless it breaks a rule the schema cannot state;
        // what it rejects ends in one located message
        Path corpus = Path.of("..", "fixtures", "schema-corpus", "mixture");
        List<Path> valid;
        List<Path> invalid;
        try (var v = java.nio.file.Files.list(corpus.resolve("valid"));
                var i = java.nio.file.Files.list(corpus.resolve("invalid"))) {
            valid = v.sorted().toList();
            invalid = i.sorted().toList();
        }
        assertFalse(valid.isEmpty());
        assertFalse(invalid.isEmpty());
        int converted = 0;
        for (Path p : valid) {
            MixtureDocument doc = MixtureReader.read(p, ReadLimits.DEFAULT);
            try {
                MixtureConverter.toCircuit(doc, MixtureOptions.DEFAULT);
            } catch (dev.circa.format.io.FormatException e) {
                // the schema cannot state decomposability, smoothness or coverage of the variables
                assertTrue(e.problem().contains("(decomposable)") || e.problem().contains("(smooth)")
                        || e.problem().contains("never uses it"), e.getMessage());
                continue;
            }
            ConversionAssertions.convertVerified(doc, MixtureOptions.DEFAULT.withVerifyPoints(200));
            converted++;
        }
        assertTrue(converted >= 2, "converted " + converted);
        for (Path p : invalid) {
            dev.circa.format.io.FormatException e = org.junit.jupiter.api.Assertions.assertThrows(
                    dev.circa.format.io.FormatException.class,
                    () -> MixtureConverter.toCircuit(MixtureReader.read(p, ReadLimits.DEFAULT), MixtureOptions.DEFAULT),
                    p.toString());
            assertTrue(e.line() > 0, e.getMessage());
        }
    }
}
