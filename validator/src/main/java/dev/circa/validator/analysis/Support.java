package dev.circa.validator.analysis;

import java.util.Arrays;

/**
 * Where a node can be positive on one variable: a union of disjoint closed intervals, sorted, over
 * the reals or over the integers. Two supports over the reals are disjoint when they meet in a set
 * of measure zero (FORMAT.md: determinism holds up to such sets); over the integers, when they share no value.
 */
public final class Support {
    /** The whole real line. */
    public static final Support REAL_LINE = new Support(new double[] {Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY}, false);
    /** [0, inf) over the reals. */
    public static final Support NON_NEGATIVE = new Support(new double[] {0, Double.POSITIVE_INFINITY}, false);
    /** 0, 1, 2, ... */
    public static final Support COUNTS = new Support(new double[] {0, Double.POSITIVE_INFINITY}, true);

    private final double[] bounds;
    private final boolean discrete;

    /** @param bounds lo0, hi0, lo1, hi1, ... sorted, disjoint; not copied */
    public Support(double[] bounds, boolean discrete) {
        this.bounds = bounds;
        this.discrete = discrete;
    }

    /** The integer values in {@code mask}, e.g. the states with non-zero probability. */
    public static Support ofStates(boolean[] mask) {
        double[] b = new double[mask.length * 2];
        int m = 0;
        for (int i = 0; i < mask.length; i++) {
            if (!mask[i]) {
                continue;
            }
            if (m > 0 && b[m - 1] == i - 1) {
                b[m - 1] = i;
            } else {
                b[m++] = i;
                b[m++] = i;
            }
        }
        return new Support(Arrays.copyOf(b, m), true);
    }

    /** The interval [lo, hi]. */
    public static Support interval(double lo, double hi, boolean discrete) {
        return new Support(new double[] {lo, hi}, discrete);
    }

    public boolean isEmpty() {
        return bounds.length == 0;
    }

    public boolean discrete() {
        return discrete;
    }

    int intervals() {
        return bounds.length / 2;
    }

    double lo(int k) {
        return bounds[2 * k];
    }

    double hi(int k) {
        return bounds[2 * k + 1];
    }

    /** Whether an intersection of two intervals counts: positive length over the reals, a shared value over the integers. */
    boolean counts(double lo, double hi) {
        return discrete ? lo <= hi : lo < hi;
    }

    /** The part of this support that is also in {@code o}, kept only where it {@link #counts counts}. */
    public Support intersect(Support o) {
        if (this == o) {
            return this;
        }
        double[] r = new double[bounds.length + o.bounds.length];
        int m = 0;
        int i = 0;
        int j = 0;
        while (i < intervals() && j < o.intervals()) {
            double lo = Math.max(lo(i), o.lo(j));
            double hi = Math.min(hi(i), o.hi(j));
            if (counts(lo, hi)) {
                r[m++] = lo;
                r[m++] = hi;
            }
            if (hi(i) < o.hi(j)) {
                i++;
            } else {
                j++;
            }
        }
        return new Support(Arrays.copyOf(r, m), discrete && o.discrete);
    }

    /** The union of two supports. */
    public Support union(Support o) {
        if (this == o) {
            return this;
        }
        double[] all = new double[bounds.length + o.bounds.length];
        int[] order = new int[intervals() + o.intervals()];
        double[] lo = new double[order.length];
        double[] hi = new double[order.length];
        for (int k = 0; k < intervals(); k++) {
            lo[k] = lo(k);
            hi[k] = hi(k);
        }
        for (int k = 0; k < o.intervals(); k++) {
            lo[intervals() + k] = o.lo(k);
            hi[intervals() + k] = o.hi(k);
        }
        Integer[] idx = new Integer[order.length];
        for (int k = 0; k < idx.length; k++) {
            idx[k] = k;
        }
        Arrays.sort(idx, (a, b) -> Double.compare(lo[a], lo[b]));
        int m = 0;
        boolean d = discrete && o.discrete;
        for (Integer k : idx) {
            double glue = d ? 1 : 0;
            if (m > 0 && lo[k] <= all[m - 1] + glue) {
                all[m - 1] = Math.max(all[m - 1], hi[k]);
            } else {
                all[m++] = lo[k];
                all[m++] = hi[k];
            }
        }
        return new Support(Arrays.copyOf(all, m), d);
    }

    /** A value inside this (non-empty) support, away from its ends when it is an interval of the reals. */
    public double pick() {
        double lo = lo(0);
        double hi = hi(0);
        if (discrete) {
            return Double.isInfinite(lo) ? Math.min(0, hi) : lo;
        }
        if (Double.isInfinite(lo) && Double.isInfinite(hi)) {
            return 0;
        }
        if (Double.isInfinite(lo)) {
            return hi - 1;
        }
        if (Double.isInfinite(hi)) {
            return lo + 1;
        }
        return lo + (hi - lo) / 2;
    }

    /** Whether the support is the same as {@code o}. */
    public boolean sameAs(Support o) {
        return this == o || (discrete == o.discrete && Arrays.equals(bounds, o.bounds));
    }
}
