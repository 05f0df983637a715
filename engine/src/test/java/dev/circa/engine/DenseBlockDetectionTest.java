package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.internal.DenseBlocks;
import dev.circa.format.Family;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitReader;
import org.junit.jupiter.api.Test;

/**
 * Which structures the automatic path takes as dense blocks: the compile rule of FORMAT.md section 3 (K
 * sums of a region over the cross products of its partitions' parts) wherever it occurs, and nothing else.
 */
class DenseBlockDetectionTest {
    @Test
    void denseBlockSummary_regionGraphCircuit_everyInnerRegionIsOneBlock() {
        for (long seed = 1; seed <= 6; seed++) {
            RandomCircuits rc = RandomCircuits.regionGraph(seed, 8, 4, 3, 4, 0.3, false);
            CompiledCircuit circuit = rc.compile();
            DenseBlocks blocks = circuit.denseBlocks();
            long sums = 0;
            long edges = 0;
            for (int r = 0; r < rc.regionSums.size(); r++) {
                int[] regionSums = rc.regionSums.get(r);
                int[] products = rc.regionProducts.get(r);
                sums += regionSums.length;
                edges += (long) regionSums.length * products.length;
                int first = circuit.nodeIndexOfId(regionSums[0]);
                // with K = 4 sums (the root too) over parts of 3 or 4 nodes, K x n is at least 16 and at least
                // twice the exponentials, so every region pays
                assertEquals(DenseBlocks.BLOCK, blocks.action[first], "seed " + seed + " region " + r);
                for (int s = 1; s < regionSums.length; s++) {
                    assertEquals(DenseBlocks.BLOCK_SUM, blocks.action[circuit.nodeIndexOfId(regionSums[s])], "later sum");
                }
                for (int p : products) {
                    // a region's products are used by its sums only: never materialised
                    assertEquals(DenseBlocks.SKIP, blocks.action[circuit.nodeIndexOfId(p)], "product " + p);
                    edges += circuit.childStart()[p + 1] - circuit.childStart()[p];
                }
            }
            DenseBlockSummary summary = circuit.denseBlockSummary();
            assertEquals(rc.regionSums.size(), summary.blocks(), "seed " + seed);
            assertEquals(sums, summary.sums(), "seed " + seed);
            assertEquals(edges, summary.edges(), "seed " + seed);
            assertTrue(new Evaluator(circuit).usesDenseBlocks(), "automatic path");
            // values are kept only while read: fewer slots than evaluated nodes
            int evaluated = 0;
            for (int i = 0; i < circuit.nodeCount(); i++) {
                evaluated += blocks.action[i] == DenseBlocks.SKIP ? 0 : 1;
            }
            assertTrue(blocks.slotCount < evaluated, "seed " + seed + ": " + blocks.slotCount + " slots for "
                    + evaluated + " evaluated nodes");
            assertFalse(new Evaluator(circuit, Evaluator.Mode.GENERIC).usesDenseBlocks(), "generic path");
        }
    }

    @Test
    void denseBlocks_crossProductOfThreeGroups_segmentHasThreePartsInOrder() {
        TestCircuits t = new TestCircuits();
        for (int v = 0; v < 3; v++) {
            t.variable("inlet_pressure_" + v, VariableType.REAL);
        }
        int[][] groups = new int[3][];
        int[] sizes = {2, 3, 4};
        for (int v = 0; v < 3; v++) {
            groups[v] = new int[sizes[v]];
            for (int j = 0; j < sizes[v]; j++) {
                groups[v][j] = t.input(Family.NORMAL, v, j, 1);
            }
        }
        int[] products = new int[24];
        int at = 0;
        for (int a = 0; a < 2; a++) {
            for (int b = 0; b < 3; b++) {
                for (int c = 0; c < 4; c++) {
                    products[at++] = t.product(groups[0][a], groups[1][b], groups[2][c]);
                }
            }
        }
        double[] w = new double[24];
        java.util.Arrays.fill(w, 1.0 / 24);
        t.output("joint", t.sum(w, products));
        DenseBlocks blocks = t.compile().denseBlocks();
        assertEquals(1, blocks.blockCount(), "one block");
        assertEquals(1, blocks.segStart[1] - blocks.segStart[0], "one segment");
        assertEquals(3, blocks.partStart[1] - blocks.partStart[0], "three parts");
        for (int p = 0; p < 3; p++) {
            int[] group = java.util.Arrays.copyOfRange(blocks.groupNode, blocks.groupStart[p], blocks.groupStart[p + 1]);
            org.junit.jupiter.api.Assertions.assertArrayEquals(groups[p], group, "part " + p);
        }
    }

    @Test
    void denseBlocks_listOfTwoCrossProducts_twoSegments() {
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL)
                .variable("motor_current", VariableType.REAL);
        int[] a = {t.input(Family.NORMAL, 0, 0, 1), t.input(Family.NORMAL, 0, 1, 1), t.input(Family.NORMAL, 0, 2, 1)};
        int[] b = {t.input(Family.NORMAL, 1, 0, 1), t.input(Family.NORMAL, 1, 1, 1), t.input(Family.NORMAL, 1, 2, 1)};
        int[] list = new int[18];
        int at = 0;
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                list[at++] = t.product(a[i], b[j]);
            }
        }
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                list[at++] = t.product(b[i], a[j]);
            }
        }
        double[] w = new double[18];
        java.util.Arrays.fill(w, 1.0 / 18);
        t.output("joint", t.sum(w, list));
        t.sum(w, list);
        DenseBlocks blocks = t.compile().denseBlocks();
        assertEquals(1, blocks.blockCount(), "one block");
        assertEquals(2, blocks.segStart[1] - blocks.segStart[0], "two partitions, two segments");
        assertEquals(9, blocks.segLength[1], "second segment");
    }

    @Test
    void denseBlockSummary_pumpStationExample_noBlocks() throws Exception {
        CompiledCircuit circuit = CompiledCircuit.compile(new CircuitReader().read(EvaluatorContractTest.PUMP_STATION));
        // one sum over two products: 2 edges, below the size at which a block pays
        assertEquals(new DenseBlockSummary(0, 0, 0), circuit.denseBlockSummary());
        assertFalse(new Evaluator(circuit).usesDenseBlocks());
    }

    @Test
    void denseBlockSummary_sumsWithAnInputChild_noBlock() {
        TestCircuits t = new TestCircuits().variable("inlet_pressure", VariableType.REAL)
                .variable("motor_current", VariableType.REAL);
        int[] children = new int[9];
        int[] a = new int[3];
        int[] b = new int[3];
        for (int j = 0; j < 3; j++) {
            a[j] = t.input(Family.NORMAL, 0, j, 1);
            b[j] = t.input(Family.NORMAL, 1, j, 1);
        }
        for (int i = 0; i < 8; i++) {
            children[i] = t.product(a[i / 3], b[i % 3]);
        }
        children[8] = t.input(Family.NORMAL, 0, 5, 1);
        double[] w = new double[9];
        java.util.Arrays.fill(w, 1.0 / 9);
        for (int s = 0; s < 4; s++) {
            t.sum(w, children);
        }
        t.output("joint", t.nodes().size() - 1);
        assertEquals(0, t.compile().denseBlockSummary().blocks(), "an input child breaks the pattern");
    }

    @Test
    void denseBlockSummary_sumsWithDistinctListsOfUnrelatedProducts_noBlock() {
        RandomCircuits rc = RandomCircuits.unstructured(7, 5, 12, 400, false);
        CompiledCircuit circuit = rc.compile();
        assertEquals(0, circuit.denseBlockSummary().blocks(), "no shared lists, no cross products");
        assertFalse(new Evaluator(circuit).usesDenseBlocks());
        assertTrue(Evaluator.everyCandidateBlock(circuit).usesDenseBlocks(), "the forced path still finds candidates");
    }

    @Test
    void denseBlocks_productAlsoUsedElsewhere_materialised() {
        RandomCircuits rc = RandomCircuits.regionGraph(3, 6, 3, 3, 1, 0, false);
        int[] products = rc.regionProducts.get(0);
        int shared = products[1];
        rc.t.output("also", rc.t.product(shared));
        CompiledCircuit circuit = rc.compile();
        DenseBlocks blocks = circuit.denseBlocks();
        assertEquals(DenseBlocks.GENERIC, blocks.action[shared], "a product with another parent is evaluated");
        assertEquals(DenseBlocks.SKIP, blocks.action[products[0]], "the others are not");
    }
}
