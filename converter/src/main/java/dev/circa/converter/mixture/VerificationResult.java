package dev.circa.converter.mixture;

import dev.circa.validator.analysis.Numbers;
import java.util.List;
import java.util.Locale;

/**
 * The comparison of a converted circuit's log-density with its source's at sampled points.
 * A point passes when |circuit - source| &lt;= atol + rtol * |source| (both -inf also passes).
 *
 * @param variables the variable names, in row order
 * @param points the number of points compared (sampled points plus the same with variables missing)
 * @param failures the number of points beyond tolerance
 * @param maxAbsDifference the largest |circuit - source| (infinite when exactly one is -inf)
 * @param maxRelDifference the largest |circuit - source| / max(1, |source|)
 * @param worst the points with the largest differences, largest first (at most {@link #WORST})
 * @param atol the absolute tolerance used
 * @param rtol the relative tolerance used
 */
public record VerificationResult(List<String> variables, int points, int failures, double maxAbsDifference,
        double maxRelDifference, List<Difference> worst, double atol, double rtol) {
    /** How many worst points are kept. */
    public static final int WORST = 10;

    public VerificationResult {
        variables = List.copyOf(variables);
        worst = List.copyOf(worst);
    }

    /**
     * One compared point.
     *
     * @param point its number among the compared points (0-based; the second half have variables missing)
     * @param withMissing whether some variables were missing (marginalised)
     * @param values the point, NaN for missing; callers must not modify
     * @param sourceLogDensity the source's log-density
     * @param circuitLogDensity the circuit's log-density
     * @param absDifference |circuit - source|
     * @param relDifference |circuit - source| / max(1, |source|)
     */
    public record Difference(int point, boolean withMissing, double[] values, double sourceLogDensity,
            double circuitLogDensity, double absDifference, double relDifference) {
    }

    /** Whether every point agreed within tolerance. */
    public boolean passed() {
        return failures == 0;
    }

    /** A few lines for people: what was compared, the largest differences, the verdict, the worst points on failure. */
    public String summary() {
        StringBuilder sb = new StringBuilder();
        if (points == 0) {
            return "not verified (0 points asked)";
        }
        sb.append(String.format(Locale.ROOT, "verified at %d points (%d sampled from the source, the same with "
                + "random variables missing): max abs difference %s, max rel difference %s (atol %s, rtol %s): %s",
                points, points / 2, num(maxAbsDifference), num(maxRelDifference), num(atol), num(rtol),
                passed() ? "passed" : failures + " point" + (failures == 1 ? "" : "s") + " beyond tolerance"));
        if (!passed()) {
            for (Difference d : worst) {
                sb.append(String.format(Locale.ROOT, "%n  point %d {%s}: source %s, circuit %s, abs difference %s",
                        d.point(), values(d.values()), num(d.sourceLogDensity()), num(d.circuitLogDensity()),
                        num(d.absDifference())));
            }
        }
        return sb.toString();
    }

    private String values(double[] v) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < v.length; i++) {
            if (Double.isNaN(v[i])) {
                continue;
            }
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(variables.get(i)).append(": ").append(num(v[i]));
        }
        return sb.toString();
    }

    private static String num(double v) {
        return Numbers.format(v, 6);
    }
}
