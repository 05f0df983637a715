package dev.circa.engine;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The contract for the dense-block path, forced onto every sum whose children are all products (so the
 * small circuits of the contract run through the matrix kernel, not only the large blocks the automatic
 * choice would take).
 */
class DenseBlockEvaluatorTest extends EvaluatorContractTest {
    @Override
    protected Variant create(CompiledCircuit circuit) {
        Evaluator e = Evaluator.everyCandidateBlock(circuit);
        assertTrue(e.usesDenseBlocks() || circuit.edgeCount() == 0 || !hasSumOverProducts(circuit),
                "the forced dense path takes every sum over products");
        return of(e);
    }

    static boolean hasSumOverProducts(CompiledCircuit circuit) {
        for (int i = 0; i < circuit.nodeCount(); i++) {
            if (circuit.kind(i) != NodeKind.SUM) {
                continue;
            }
            boolean all = true;
            for (int e = circuit.childStart()[i]; e < circuit.childStart()[i + 1]; e++) {
                all &= circuit.kind(circuit.childIndex()[e]) == NodeKind.PRODUCT;
            }
            if (all) {
                return true;
            }
        }
        return false;
    }
}
