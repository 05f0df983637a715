package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureExamples;
import dev.circa.format.mixture.MixtureReader;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The shape of converted circuits: order, ids, sharing, block split, provenance. */
class ConverterStructureTest {
    /** The example of FORMAT.md section 4. */
    static final String FORMAT_EXAMPLE = MixtureExamples.FORMAT_EXAMPLE;

    /** A 4-dimensional normal whose covariance is block diagonal after a permutation: blocks {a, c}, {b}, {d}. */
    static final String BLOCK_DIAGONAL = """
            format: circa.mixture
            version: "1.0"
            variables: [{name: a, type: real}, {name: b, type: real}, {name: c, type: real}, {name: d, type: real}]
            model:
              vars: [a, b, c, d]
              mvnormal:
                mean: [1, 2, 3, 4]
                cov: [[2.0, 0.0, 0.7, 0.0], [0.0, 1.0, 0.0, 0.0], [0.7, 0.0, 1.5, 0.0], [0.0, 0.0, 0.0, 0.25]]
            """;

    static MixtureDocument read(String text) throws Exception {
        return MixtureReader.readString(text, "model.yaml", ReadLimits.DEFAULT);
    }

    private static void childrenFirstWithDenseIds(CircuitDocument c) throws Exception {
        ConversionAssertions.assertValid(c);
        for (int i = 0; i < c.nodes().size(); i++) {
            Node n = c.nodes().get(i);
            assertEquals(i, n.id());
            for (int k : n.children()) {
                assertTrue(k < i, "node " + i + " refers to " + k);
            }
        }
    }

    @Test
    void toCircuit_formatExample_isTheFormatExampleCircuit() throws Exception {
        CircuitDocument c = MixtureConverter.toCircuit(read(FORMAT_EXAMPLE), MixtureOptions.DEFAULT);
        childrenFirstWithDenseIds(c);
        // FORMAT.md section 2 shows the same model as a circuit of 7 nodes
        assertEquals(7, c.nodes().size());
        SumNode root = assertInstanceOf(SumNode.class, c.nodes().get(6));
        assertArrayEquals(new double[] {0.85, 0.15}, root.weights());
        assertEquals("joint", c.outputs().get(0).name());
        assertEquals(6, c.outputs().get(0).node());
        assertEquals("circa 0.1.0", c.provenance().producer());
        assertEquals("pump-station-regimes", c.name());
        assertEquals("normal-operation", c.nodes().get(root.children()[0]).label());
    }

    @Test
    void toCircuit_formatExample_sourceDensityEqualsScipyReferences() throws Exception {
        // SciPy 1.10 reference values for this model, from FORMAT.md section 5
        MixtureDensity d = MixtureDensity.of(read(FORMAT_EXAMPLE), false);
        assertEquals(0.18261296103078395, d.logDensity(new double[] {3.0, 2}, 0), 1e-12);
        assertEquals(-2.1428574782131147, d.logDensity(new double[] {2.1, Double.NaN}, 0), 1e-12);
    }

    @Test
    void toCircuit_definitionUsedTwice_oneSharedNode() throws Exception {
        CircuitDocument c = MixtureConverter.toCircuit(MixtureReader.read(java.nio.file.Path.of("..", "fixtures",
                "mixtures", "pump-station-regimes.yaml"), ReadLimits.DEFAULT), MixtureOptions.DEFAULT);
        childrenFirstWithDenseIds(c);
        List<Integer> worn = new ArrayList<>();
        for (Node n : c.nodes()) {
            if (n instanceof InputNode in && in.family() == Family.CATEGORICAL
                    && java.util.Arrays.equals(in.params(), new double[] {0.6, 0.3, 0.1})) {
                worn.add(in.id());
            }
        }
        assertEquals(1, worn.size());
        assertEquals("worn-valve", c.nodes().get(worn.get(0)).label());
        int parents = 0;
        for (Node n : c.nodes()) {
            for (int k : n.children()) {
                if (k == worn.get(0)) {
                    parents++;
                }
            }
        }
        assertEquals(2, parents);
    }

    @Test
    void toCircuit_permutedBlockDiagonalCovariance_productOfBlocks() throws Exception {
        MixtureDocument doc = read(BLOCK_DIAGONAL);
        CircuitDocument c = MixtureConverter.toCircuit(doc, MixtureOptions.DEFAULT);
        childrenFirstWithDenseIds(c);
        ProductNode root = assertInstanceOf(ProductNode.class, c.nodes().get(c.nodes().size() - 1));
        assertEquals(3, root.children().length);
        InputNode ac = (InputNode) c.nodes().get(root.children()[0]);
        assertEquals(Family.MVNORMAL, ac.family());
        assertArrayEquals(new int[] {0, 2}, ac.vars());
        assertArrayEquals(new double[] {1, 3, 2.0, 0.7, 0.7, 1.5}, ac.params());
        InputNode b = (InputNode) c.nodes().get(root.children()[1]);
        assertEquals(Family.NORMAL, b.family());
        assertArrayEquals(new double[] {2, 1}, b.params());
        InputNode d = (InputNode) c.nodes().get(root.children()[2]);
        assertArrayEquals(new double[] {4, 0.5}, d.params());
    }

    @Test
    void toCircuit_gaussianMixtureWithVariances_sumOfNormalProducts() throws Exception {
        MixtureDocument doc = read("""
                format: circa.mixture
                version: "1.0"
                variables: [{name: a, type: real}, {name: b, type: real}]
                model:
                  gaussian-mixture:
                    vars: [a, b]
                    weights: [0.25, 0.75]
                    means: [[0, 1], [2, 3]]
                    variances: [[1, 4], [0.25, 9]]
                """);
        CircuitDocument c = MixtureConverter.toCircuit(doc, MixtureOptions.DEFAULT);
        childrenFirstWithDenseIds(c);
        assertEquals(7, c.nodes().size());
        SumNode root = assertInstanceOf(SumNode.class, c.nodes().get(6));
        assertArrayEquals(new double[] {0.25, 0.75}, root.weights());
        ProductNode second = (ProductNode) c.nodes().get(root.children()[1]);
        assertArrayEquals(new double[] {2, 0.5}, ((InputNode) c.nodes().get(second.children()[0])).params());
        assertArrayEquals(new double[] {3, 3}, ((InputNode) c.nodes().get(second.children()[1])).params());
    }
}
