package dev.circa.engine;

/**
 * What {@link CompiledCircuit#denseBlockSummary()} found.
 *
 * @param blocks number of dense blocks (groups of sums sharing one child list of cross products)
 * @param sums number of sums inside those blocks
 * @param edges edges evaluated inside blocks: the blocks' sum edges plus the edges of the products only
 *     they use
 */
public record DenseBlockSummary(int blocks, int sums, long edges) {
}
