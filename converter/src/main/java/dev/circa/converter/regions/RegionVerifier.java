package dev.circa.converter.regions;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.BatchRunner;
import java.util.Locale;

/**
 * Checks a compiled circuit against the region-by-region evaluation of the parameters it was
 * compiled from ({@link RegionTensorEvaluator}): on N points drawn from the model (ancestral
 * sampling with a seeded {@link SplitMix64}), the same points with random variables missing (each
 * cell missing with probability 1/2), N random assignments that ignore the model (real values
 * uniform in [-4, 16), counts uniform in 0..20, states uniform; each cell missing with probability
 * 1/2; values outside an input's support must give -inf on both sides), and the point with every
 * variable missing: 3N + 1 rows. A point passes when
 * |circuit - direct| {@literal <=} atol + rtol * |direct| for every output; -inf matches only -inf.
 * Both sides take all rows in one batch on every processor: the engine through a {@link BatchRunner}
 * (its dense-block fast path), the direct evaluation in blocks of rows on as many threads; neither
 * side's values depend on the thread count. Stateless.
 */
public final class RegionVerifier {
    /** A circuit evaluation: {@code out[row * outputs + o]} = log value of output o at row (NaN = missing). */
    @FunctionalInterface
    public interface CircuitEvaluation {
        void logDensity(double[] data, int rows, double[] out);
    }

    /**
     * The outcome of a verification.
     *
     * @param points rows compared (each over every output)
     * @param maxAbsDifference the largest |circuit - direct|
     * @param maxRelDifference the largest |circuit - direct| / max(1, |direct|)
     * @param failures rows where some output was out of tolerance
     * @param passed whether every row passed
     */
    public record Result(int points, double maxAbsDifference, double maxRelDifference, int failures, boolean passed) {
        /** One line for people, e.g. for standard error. */
        public String summary() {
            return String.format(Locale.ROOT, "%s: %d points, max abs difference %.3g, max rel difference %.3g, %d failed",
                    passed ? "verified" : "NOT verified", points, maxAbsDifference, maxRelDifference, failures);
        }
    }

    private RegionVerifier() {
    }

    /**
     * Compares the engine's evaluation of {@code circuit} (compiled from {@code params}) with the
     * direct evaluation of {@code params}.
     *
     * @param sampled N: points drawn; 3N + 1 rows are compared
     * @throws IllegalArgumentException when the circuit's variables or outputs do not match
     */
    public static Result verify(RegionParameters params, CompiledCircuit circuit, int sampled, long seed, double atol,
            double rtol) {
        if (circuit.variableCount() != params.structure().variables().size()
                || circuit.outputCount() != params.options().outputs()) {
            throw new IllegalArgumentException("the circuit has " + circuit.variableCount() + " variables and "
                    + circuit.outputCount() + " outputs; the region graph compiles to "
                    + params.structure().variables().size() + " and " + params.options().outputs());
        }
        try (BatchRunner runner = BatchRunner.onAllProcessors(circuit)) {
            return verify(params, runner::logDensity, sampled, seed, atol, rtol);
        }
    }

    /**
     * Compares {@code circuit} with the direct evaluation of {@code params}.
     *
     * @param sampled N: points drawn; 3N + 1 rows are compared
     */
    public static Result verify(RegionParameters params, CircuitEvaluation circuit, int sampled, long seed,
            double atol, double rtol) {
        int nv = params.structure().variables().size();
        int rows = 3 * sampled + 1;
        double[] data = new double[rows * nv];
        RegionSampler sampler = new RegionSampler(params, seed);
        SplitMix64 mask = new SplitMix64(seed ^ 0x6D697373696E67L);
        int c = params.options().outputs();
        for (int i = 0; i < sampled; i++) {
            sampler.sample(i % c, data, i);
        }
        for (int i = 0; i < sampled; i++) {
            for (int v = 0; v < nv; v++) {
                double x = data[i * nv + v];
                data[(sampled + i) * nv + v] = mask.nextDouble() < 0.5 ? Double.NaN : x;
            }
        }
        for (int i = 0; i < sampled; i++) {
            for (int v = 0; v < nv; v++) {
                dev.circa.format.Variable var = params.structure().variables().get(v);
                double x = switch (var.type()) {
                    case REAL -> mask.uniform(-4, 16);
                    case COUNT -> mask.nextInt(21);
                    case BINARY, CATEGORICAL -> mask.nextInt(var.stateCount());
                };
                data[(2 * sampled + i) * nv + v] = mask.nextDouble() < 0.5 ? Double.NaN : x;
            }
        }
        for (int v = 0; v < nv; v++) {
            data[(rows - 1) * nv + v] = Double.NaN;
        }
        double[] direct = new double[rows * c];
        double[] got = new double[rows * c];
        new RegionTensorEvaluator(params).logDensity(data, rows, direct, Runtime.getRuntime().availableProcessors());
        circuit.logDensity(data, rows, got);
        return compare(direct, got, rows, c, atol, rtol);
    }

    static Result compare(double[] direct, double[] got, int rows, int c, double atol, double rtol) {
        double maxAbs = 0;
        double maxRel = 0;
        int failures = 0;
        for (int row = 0; row < rows; row++) {
            boolean bad = false;
            for (int o = 0; o < c; o++) {
                double want = direct[row * c + o];
                double have = got[row * c + o];
                double diff;
                if (want == have) {
                    diff = 0;
                } else if (Double.isNaN(want) || Double.isNaN(have) || Double.isInfinite(want) || Double.isInfinite(have)) {
                    diff = Double.POSITIVE_INFINITY;
                } else {
                    diff = Math.abs(have - want);
                }
                maxAbs = Math.max(maxAbs, diff);
                maxRel = Math.max(maxRel, diff / Math.max(1, Math.abs(want)));
                if (!(diff <= atol + rtol * Math.abs(want))) {
                    bad = true;
                }
            }
            if (bad) {
                failures++;
            }
        }
        return new Result(rows, maxAbs, maxRel, failures, failures == 0);
    }
}
