package dev.circa.engine.internal;

/**
 * The buffers {@link DenseKernel} needs for chunks of up to {@code rows} rows of one circuit's blocks,
 * allocated once; one per evaluator.
 */
public final class DenseWorkspace {
    final int rows;
    /** One row: a block's linear product values. */
    final double[] products;
    /** One row: a block's sums before the log. */
    final double[] sums;
    /** One row: per part of a block, its maximum. */
    final double[] partMax;
    /** One row: per segment of a block, the sum of its parts' maxima. */
    final double[] segMax;
    /** One row: the exponentials of one part. */
    final double[] partExp;
    /** One row's input log-densities of every fused product's children. */
    final double[] fused;
    /** One row's value of every fused product, by {@link DenseBlocks#fusedOut}. */
    final double[] fusedValue;
    /** The blocks at every row of a chunk of several rows. */
    final ChunkBlocks chunk;
    /** The chunk's data variable-major, for the input log-densities of several rows. */
    final InputColumns columns;

    /** Buffers for {@code blocks} and chunks of up to {@code rows} rows. */
    public DenseWorkspace(DenseBlocks blocks, int rows) {
        this.rows = rows;
        this.products = new double[Math.max(1, blocks.maxWidth)];
        this.sums = new double[Math.max(1, blocks.maxSums)];
        this.partMax = new double[Math.max(1, blocks.maxParts)];
        this.segMax = new double[Math.max(1, blocks.maxSegments)];
        this.partExp = new double[Math.max(1, blocks.maxPartSize)];
        this.fused = new double[blocks.fusedVar.length];
        this.fusedValue = new double[blocks.fusedCount];
        this.chunk = new ChunkBlocks(blocks, rows);
        this.columns = new InputColumns(rows);
    }
}
