package dev.circa.report;

import dev.circa.validator.regression.CaseSink;
import java.util.SplittableRandom;

/**
 * What the regression plots need from every case, in bounded memory: a seeded uniform sample of at most
 * {@value #KEEP} (reference, computed) pairs for the scatter (reservoir sampling), and a histogram of
 * log10 |computed - reference| over fixed bins from {@value #LOW} to {@value #HIGH} (cases outside are
 * counted in the end bins), with the exact matches and the non-finite disagreements counted apart.
 */
final class CaseSample implements CaseSink {
    static final int KEEP = 2000;
    static final double LOW = -17;
    static final double HIGH = 2;
    static final double BIN = 0.5;

    final double[] expected = new double[KEEP];
    final double[] computed = new double[KEEP];
    final long[] bins = new long[(int) Math.round((HIGH - LOW) / BIN)];
    long seen;
    long exact;
    long nonFinite;
    double minAbsExpected = Double.POSITIVE_INFINITY;
    double maxAbsExpected;
    private final SplittableRandom random = new SplittableRandom(0);

    @Override
    public void accept(int output, double expected, double computed, boolean passed) {
        if (!Double.isFinite(expected) || !Double.isFinite(computed)) {
            if (expected != computed) {
                nonFinite++;
            } else {
                exact++;
            }
            return;
        }
        minAbsExpected = Math.min(minAbsExpected, Math.abs(expected));
        maxAbsExpected = Math.max(maxAbsExpected, Math.abs(expected));
        long k = seen++;
        int slot = k < KEEP ? (int) k : (int) random.nextLong(k + 1);
        if (slot < KEEP) {
            this.expected[slot] = expected;
            this.computed[slot] = computed;
        }
        double err = Math.abs(computed - expected);
        if (err == 0) {
            exact++;
            return;
        }
        int bin = (int) Math.floor((Math.log10(err) - LOW) / BIN);
        bins[Math.max(0, Math.min(bins.length - 1, bin))]++;
    }

    /** Points kept for the scatter. */
    int kept() {
        return (int) Math.min(seen, KEEP);
    }

    /** The bin edges, {@code bins.length + 1} of them. */
    double[] edges() {
        double[] e = new double[bins.length + 1];
        for (int k = 0; k < e.length; k++) {
            e[k] = LOW + k * BIN;
        }
        return e;
    }
}
