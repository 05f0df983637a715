package dev.circa.validator.regression;

import java.util.ArrayList;
import java.util.List;

/** Accumulates case results in bounded memory: counts, maxima per output and the worst cases. */
final class ReportBuilder {
    private final Tolerance tolerance;
    private final String[] outputNames;
    private final long[] cases;
    private final long[] failures;
    private final double[] maxAbs;
    private final double[] maxRel;
    private final CaseResult[] worst = new CaseResult[CheckReport.WORST];
    private int worstCount;
    private final CaseSink sink;

    ReportBuilder(Tolerance tolerance, List<String> outputNames, CaseSink sink) {
        this.tolerance = tolerance;
        this.sink = sink;
        this.outputNames = outputNames.toArray(new String[0]);
        int n = this.outputNames.length;
        cases = new long[n];
        failures = new long[n];
        maxAbs = new double[n];
        maxRel = new double[n];
    }

    Tolerance tolerance() {
        return tolerance;
    }

    /** Records one case; allocates only when the case enters the worst list. */
    void add(String source, long row, long line, String pointer, int output, double expected, double computed) {
        boolean passed = tolerance.passes(computed, expected);
        double excess = tolerance.excess(computed, expected);
        cases[output]++;
        if (sink != null) {
            sink.accept(output, expected, computed, passed);
        }
        if (!passed) {
            failures[output]++;
        }
        double abs = computed == expected ? 0 : Math.abs(computed - expected);
        maxAbs[output] = maxNaN(maxAbs[output], abs);
        if (expected != 0 && Double.isFinite(expected)) {
            maxRel[output] = maxNaN(maxRel[output], abs / Math.abs(expected));
        }
        if (worstCount == worst.length && !worse(excess, passed, worst[worstCount - 1])) {
            return;
        }
        offer(new CaseResult(source, row, line, pointer, outputNames[output], expected, computed, passed, excess));
    }

    /** Puts {@code c} among the worst cases when it is worse than the last of a full list (counts untouched). */
    void offer(CaseResult c) {
        if (worstCount == worst.length && !worse(c.excess(), c.passed(), worst[worstCount - 1])) {
            return;
        }
        int i = worstCount < worst.length ? worstCount++ : worst.length - 1;
        while (i > 0 && worse(c.excess(), c.passed(), worst[i - 1])) {
            worst[i] = worst[i - 1];
            i--;
        }
        worst[i] = c;
    }

    /** Adds the counts and largest errors of {@code part}, a report over the same outputs (its worst cases untouched). */
    void merge(CheckReport part) {
        for (OutputSummary s : part.outputs()) {
            int o = java.util.Arrays.asList(outputNames).indexOf(s.output());
            if (o < 0) {
                throw new IllegalArgumentException("a partial report names output \"" + s.output() + "\", which this check does not have");
            }
            cases[o] += s.cases();
            failures[o] += s.failures();
            maxAbs[o] = maxNaN(maxAbs[o], s.maxAbsError());
            maxRel[o] = maxNaN(maxRel[o], s.maxRelError());
        }
    }

    private static boolean worse(double excess, boolean passed, CaseResult than) {
        if (passed != than.passed()) {
            return !passed;
        }
        double e = Double.isNaN(excess) ? Double.POSITIVE_INFINITY : excess;
        double t = Double.isNaN(than.excess()) ? Double.POSITIVE_INFINITY : than.excess();
        return e > t;
    }

    private static double maxNaN(double a, double b) {
        return Double.isNaN(a) || Double.isNaN(b) ? Double.NaN : Math.max(a, b);
    }

    CheckReport build() {
        long total = 0;
        long fails = 0;
        double abs = 0;
        double rel = 0;
        List<OutputSummary> outs = new ArrayList<>();
        for (int o = 0; o < outputNames.length; o++) {
            if (cases[o] == 0) {
                continue;
            }
            total += cases[o];
            fails += failures[o];
            abs = maxNaN(abs, maxAbs[o]);
            rel = maxNaN(rel, maxRel[o]);
            outs.add(new OutputSummary(outputNames[o], cases[o], failures[o], maxAbs[o], maxRel[o]));
        }
        List<CaseResult> w = new ArrayList<>(worstCount);
        for (int i = 0; i < worstCount; i++) {
            w.add(worst[i]);
        }
        return new CheckReport(tolerance, total, fails, abs, rel, w, outs);
    }
}
