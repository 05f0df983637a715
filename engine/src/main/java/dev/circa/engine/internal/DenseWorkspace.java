package dev.circa.engine.internal;

import org.ejml.data.DMatrixRMaj;

/**
 * The buffers {@link DenseKernel} needs for chunks of up to {@code rows} rows of one circuit's blocks,
 * allocated once; one per evaluator.
 */
public final class DenseWorkspace {
    final int rows;
    /** Linear product values of a block, n x rows (product-major, like the value array). */
    final DMatrixRMaj products;
    /** The block's sums before the log, K x rows. */
    final DMatrixRMaj sums;
    /** Per part of a block, its per-row maximum. */
    final double[] partMax;
    /** Per segment of a block, the sum of its parts' maxima. */
    final double[] segMax;
    /** Per row, the block's largest segment maximum. */
    final double[] blockMax;
    /** Per row, 1 when a segment maximum is NaN or +inf: the row takes the exact path. */
    final double[] check;
    /** Exponentials of one part, size x rows. */
    final double[] partExp;
    /** One row of products, while a segment is expanded. */
    final double[] row;
    /** One row's input log-densities of every fused product's children. */
    final double[] fused;
    /** One row's value of every fused product, by {@link DenseBlocks#fusedOut}. */
    final double[] fusedValue;

    /** Buffers for {@code blocks} and chunks of up to {@code rows} rows. */
    public DenseWorkspace(DenseBlocks blocks, int rows) {
        this.rows = rows;
        this.products = new DMatrixRMaj(Math.max(1, blocks.maxWidth), rows);
        this.sums = new DMatrixRMaj(Math.max(1, blocks.maxSums), rows);
        this.partMax = new double[Math.max(1, blocks.maxParts) * rows];
        this.segMax = new double[Math.max(1, blocks.maxSegments) * rows];
        this.blockMax = new double[rows];
        this.check = new double[rows];
        this.partExp = new double[Math.max(1, blocks.maxPartSize) * rows];
        this.row = new double[rows];
        this.fused = new double[blocks.fusedVar.length];
        this.fusedValue = new double[blocks.fusedCount];
    }
}
