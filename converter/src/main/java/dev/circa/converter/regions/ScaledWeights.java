package dev.circa.converter.regions;

/**
 * The weights of each region's sums scaled for the two direct evaluations, computed once per model and shared by
 * every evaluator of it ({@link RegionTensorEvaluator#sharing()}). Log domain ({@link LogDomainPass}): each weight
 * over its sum's largest, with the log of the largest. Linear ({@link LinearPass}): each weight times 2^-g with
 * g = floor(log2 of its sum's largest), so that the largest scaled weight is in [1, 2) (exact for plain weights),
 * with g; left null when a weight is +inf or NaN, when a sum's weights are all 0 (as in the log domain: every row
 * takes the exact path), or when a log weight's g would pass 2^20. Immutable once built.
 */
final class ScaledWeights {
    /**
     * Per region with sums: weight / largest weight of its sum, sum by sum ({@code [q * children + j]}); null
     * elsewhere.
     */
    final double[][] scaled;
    /** Per region with sums: log of the largest weight of each sum (NaN when a weight is not usable as scaled). */
    final double[][] shift;
    /**
     * Per region with sums: each weight times 2^-g, g = floor(log2 of its sum's largest weight), sum by sum
     * ({@code [q * children + j]}): exact for plain weights, e^(log w - g ln 2) for log weights. Null where some
     * weight is not usable as scaled (the linear evaluation sends every row to the log-domain one).
     */
    final double[][] binaryScaled;
    /** Per region with sums: g of each sum. */
    final long[][] binaryShift;
    /** Per region with sums: 2^(g - G) for each sum, G the largest g of the region's sums (in {@link #binaryTop}). */
    final double[][] binaryRelative;
    final long[] binaryTop;

    /** The scaled weights of every region with sums of the model that {@code p} define. */
    ScaledWeights(RegionParameters p) {
        Layout layout = p.layout();
        int nr = p.structure().regionCount();
        this.scaled = new double[nr][];
        this.shift = new double[nr][];
        this.binaryScaled = new double[nr][];
        this.binaryShift = new long[nr][];
        this.binaryRelative = new double[nr][];
        this.binaryTop = new long[nr];
        for (int r = 0; r < nr; r++) {
            if (layout.hasSums(r)) {
                scale(p, layout, r);
            }
        }
    }

    /** The weights of region r's sums, scaled for both evaluations (see the class comment). */
    private void scale(RegionParameters p, Layout layout, int r) {
        int k = layout.sums(r);
        int c = layout.children(r);
        boolean log = p.logWeights(r);
        double[] sw = new double[k * c];
        double[] sh = new double[k];
        double[] bw = new double[k * c];
        long[] g = new long[k];
        boolean binary = true;
        for (int q = 0; q < k; q++) {
            double[] w = p.weights(r, q);
            double max = Double.NEGATIVE_INFINITY;
            double plainMax = 0;
            boolean usable = true;
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                usable &= lw < Double.POSITIVE_INFINITY;
                max = Math.max(max, lw);
                plainMax = log ? plainMax : Math.max(plainMax, w[j]);
            }
            // a weight of +inf or NaN (or all weights zero) has no scaled form: every row takes the exact path
            sh[q] = usable && max > Double.NEGATIVE_INFINITY ? max : Double.NaN;
            binary &= !Double.isNaN(sh[q]) && (!log || Math.abs(max) < BinaryScale.LOG_LIMIT);
            g[q] = !binary ? 0 : log ? BinaryScale.exponentOf(max) : BinaryScale.exponent(plainMax);
            for (int j = 0; j < c; j++) {
                double lw = log ? w[j] : Math.log(w[j]);
                sw[q * c + j] = Double.isNaN(sh[q]) ? 0 : Math.exp(lw - max);
                // plain weights: an exact scaling by a power of two (or an underflow far below the largest)
                bw[q * c + j] = !binary ? 0 : log ? BinaryScale.linear(w[j], g[q]) : Math.scalb(w[j], (int) -g[q]);
            }
        }
        scaled[r] = sw;
        shift[r] = sh;
        binaryScaled[r] = binary ? bw : null;
        binaryShift[r] = g;
        long top = Long.MIN_VALUE;
        for (int q = 0; q < k; q++) {
            top = Math.max(top, g[q]);
        }
        double[] relative = new double[k];
        for (int q = 0; q < k; q++) {
            relative[q] = BinaryScale.pow2(g[q] - top);
        }
        binaryRelative[r] = relative;
        binaryTop[r] = top;
    }
}
