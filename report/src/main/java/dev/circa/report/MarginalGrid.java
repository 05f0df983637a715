package dev.circa.report;

import dev.circa.engine.ExactMarginals;
import dev.circa.format.Family;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;

/**
 * The values at which a variable's marginal is drawn. A real variable: {@code points} cell midpoints over a
 * range that covers the mass of every component of its mixture with a weight above {@value #NEGLIGIBLE}
 * of the largest (from the components' parameters: normal mean +/- 6 sd, lognormal exp(mu +/- 6 sigma),
 * exponential [0, 12/rate], gamma mean +/- 6 sd cut at 0, beta [0, 1], uniform its interval). Midpoints
 * never touch a bounded support's edge, where a density may be infinite. A binary or categorical variable:
 * its states. A count: every count from the smallest to the largest the components cover, thinned to at
 * most {@code maxCounts} evenly spaced counts.
 *
 * @param x the values
 * @param labels per value its label for a discrete variable (state name or count), else {@code null}
 */
record MarginalGrid(double[] x, String[] labels) {
    /** Components lighter than this share of the heaviest do not widen the range. */
    static final double NEGLIGIBLE = 1e-9;
    private static final double SPREAD = 6;

    boolean discrete() {
        return labels != null;
    }

    static MarginalGrid of(ExactMarginals m, Variable var, int v, int points, int maxCounts) {
        if (var.type() == VariableType.BINARY || var.type() == VariableType.CATEGORICAL) {
            int k = var.stateCount();
            double[] x = new double[k];
            String[] labels = new String[k];
            for (int s = 0; s < k; s++) {
                x[s] = s;
                labels[s] = var.states().size() > s ? var.states().get(s) : Integer.toString(s);
            }
            return new MarginalGrid(x, labels);
        }
        double[] range = range(m, v);
        if (var.type() == VariableType.COUNT) {
            long lo = (long) Math.max(0, Math.floor(range[0]));
            long hi = (long) Math.max(lo, Math.ceil(range[1]));
            long span = hi - lo + 1;
            long step = Math.max(1, (span + maxCounts - 1) / maxCounts);
            int n = (int) ((span + step - 1) / step);
            double[] x = new double[n];
            String[] labels = new String[n];
            for (int k = 0; k < n; k++) {
                x[k] = lo + k * step;
                labels[k] = Long.toString(lo + k * step);
            }
            return new MarginalGrid(x, labels);
        }
        double lo = range[0];
        double hi = range[1];
        double[] x = new double[points];
        for (int k = 0; k < points; k++) {
            x[k] = lo + (k + 0.5) * (hi - lo) / points;
        }
        return new MarginalGrid(x, null);
    }

    /** [low, high] covering the heavy components of variable {@code v} under any output. */
    static double[] range(ExactMarginals m, int v) {
        int outputs = m.circuit().outputCount();
        int n = m.componentCount(v);
        double[] rel = new double[n];
        double best = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            double r = Double.NEGATIVE_INFINITY;
            for (int o = 0; o < outputs; o++) {
                r = Math.max(r, m.componentLogWeight(o, v, k) - m.logPartition(o));
            }
            rel[k] = r;
            best = Math.max(best, r);
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            if (!(rel[k] - best >= Math.log(NEGLIGIBLE))) {
                continue;
            }
            double[] p = m.componentParams(v, k);
            double[] r = support(m.componentFamily(v, k), p);
            lo = Math.min(lo, r[0]);
            hi = Math.max(hi, r[1]);
        }
        if (!Double.isFinite(lo) || !Double.isFinite(hi)) {
            return new double[] {0, 1};
        }
        if (hi <= lo) {
            return new double[] {lo - 0.5, lo + 0.5};
        }
        return new double[] {lo, hi};
    }

    private static double[] support(Family f, double[] p) {
        return switch (f) {
            case NORMAL -> new double[] {p[0] - SPREAD * p[1], p[0] + SPREAD * p[1]};
            case LOGNORMAL -> new double[] {Math.exp(p[0] - SPREAD * p[1]), Math.exp(p[0] + SPREAD * p[1])};
            case EXPONENTIAL -> new double[] {0, 2 * SPREAD / p[0]};
            case GAMMA -> {
                double mean = p[0] / p[1];
                double sd = Math.sqrt(p[0]) / p[1];
                yield new double[] {Math.max(0, mean - SPREAD * sd), mean + SPREAD * sd};
            }
            case BETA -> new double[] {0, 1};
            case UNIFORM -> new double[] {p[0], p[1]};
            case POISSON -> new double[] {0, p[0] + SPREAD * Math.sqrt(p[0]) + 3};
            case BINOMIAL -> {
                double mean = p[0] * p[1];
                double sd = Math.sqrt(p[0] * p[1] * (1 - p[1]));
                yield new double[] {Math.max(0, mean - SPREAD * sd - 3), Math.min(p[0], mean + SPREAD * sd + 3)};
            }
            default -> new double[] {Double.NaN, Double.NaN};
        };
    }
}
