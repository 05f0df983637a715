package dev.circa.converter.reference;

/**
 * Log-sum-exp over the whole range of doubles, for the source evaluators: never forms
 * {@code inf - inf} or {@code 0 * inf}. A term with weight 0 (log-weight -inf) is absent, whatever its
 * value, so a zero weight on a child of value +inf adds nothing; a term of +inf makes the sum +inf; a
 * NaN term makes it NaN (so that the verification reports it). Stateless.
 */
public final class LogSumExp {
    private LogSumExp() {
    }

    /** log(e^a + e^b): -inf and -inf give -inf, +inf and anything but NaN gives +inf. */
    public static double add(double a, double b) {
        if (Double.isNaN(a) || Double.isNaN(b)) {
            return Double.NaN;
        }
        double m = Math.max(a, b);
        if (m == Double.NEGATIVE_INFINITY || m == Double.POSITIVE_INFINITY) {
            return m;
        }
        double lo = Math.min(a, b);
        return lo == Double.NEGATIVE_INFINITY ? m : m + Math.log1p(Math.exp(lo - m));
    }

    /**
     * log(sum_j w_j e^(v_j)) over {@code j < count}: {@code weights} are w_j, or log w_j when
     * {@code logWeights}. The largest term is factored out, so no term overflows or underflows
     * unless it is negligible; terms are added in order of j.
     */
    public static double weighted(double[] weights, boolean logWeights, double[] values, int count) {
        double m = Double.NEGATIVE_INFINITY;
        for (int j = 0; j < count; j++) {
            double lw = logWeights ? weights[j] : Math.log(weights[j]);
            if (lw == Double.NEGATIVE_INFINITY) {
                continue;
            }
            double t = lw + values[j];
            if (Double.isNaN(t)) {
                return Double.NaN;
            }
            m = Math.max(m, t);
        }
        if (m == Double.NEGATIVE_INFINITY || m == Double.POSITIVE_INFINITY) {
            return m;
        }
        double sum = 0;
        for (int j = 0; j < count; j++) {
            double lw = logWeights ? weights[j] : Math.log(weights[j]);
            if (lw != Double.NEGATIVE_INFINITY) {
                sum += Math.exp(lw + values[j] - m);
            }
        }
        return m + Math.log(sum);
    }
}
