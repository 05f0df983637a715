package dev.circa.converter.mixture;

import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Compares a circuit with its source mixture at points sampled from the source, then at the same
 * points with each variable missing with probability 1/2 (the source then gives its marginal).
 * Not for application code.
 */
final class Verifier {
    /** Mixed into the seed for the choice of missing variables, so it differs from the sample's stream. */
    private static final long MISSING_STREAM = 0x9E3779B97F4A7C15L;

    private Verifier() {
    }

    static VerificationResult verify(CheckedModel model, CircuitLogDensity circuit, int n, double atol, double rtol,
            long seed) {
        List<String> names = new ArrayList<>();
        for (Variable v : model.graph().document().variables()) {
            names.add(v.name());
        }
        int vars = names.size();
        if (n == 0) {
            return new VerificationResult(names, 0, 0, 0, 0, List.of(), atol, rtol);
        }
        int rows = 2 * n;
        double[] data = new double[rows * vars];
        MixtureSampler.of(model, seed).sample(n, data);
        System.arraycopy(data, 0, data, n * vars, n * vars);
        SplittableRandom missing = new SplittableRandom(seed ^ MISSING_STREAM);
        for (int c = n * vars; c < rows * vars; c++) {
            if (missing.nextBoolean()) {
                data[c] = Double.NaN;
            }
        }
        double[] source = new double[rows];
        MixtureDensity.of(model).logDensity(data, rows, source);
        double[] got = new double[rows];
        circuit.logDensity(data, rows, got);
        double maxAbs = 0;
        double maxRel = 0;
        int failures = 0;
        double[] abs = new double[rows];
        double[] rel = new double[rows];
        for (int r = 0; r < rows; r++) {
            double a = got[r];
            double b = source[r];
            if (a == b) {
                abs[r] = 0;
                rel[r] = 0;
            } else {
                double d = Math.abs(a - b);
                abs[r] = Double.isNaN(d) ? Double.POSITIVE_INFINITY : d;
                rel[r] = Double.isFinite(b) ? abs[r] / Math.max(1, Math.abs(b)) : Double.POSITIVE_INFINITY;
                if (!(d <= atol + rtol * Math.abs(b))) {
                    failures++;
                }
            }
            maxAbs = Math.max(maxAbs, abs[r]);
            maxRel = Math.max(maxRel, rel[r]);
        }
        Integer[] order = new Integer[rows];
        for (int r = 0; r < rows; r++) {
            order[r] = r;
        }
        Arrays.sort(order, Comparator.comparingDouble((Integer r) -> -abs[r]).thenComparingInt(r -> r));
        List<VerificationResult.Difference> worst = new ArrayList<>();
        for (int k = 0; k < Math.min(VerificationResult.WORST, rows); k++) {
            int r = order[k];
            worst.add(new VerificationResult.Difference(r, r >= n, Arrays.copyOfRange(data, r * vars, (r + 1) * vars),
                    source[r], got[r], abs[r], rel[r]));
        }
        return new VerificationResult(names, rows, failures, maxAbs, maxRel, worst, atol, rtol);
    }
}
