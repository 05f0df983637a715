package dev.circa.report;

import dev.circa.format.io.ReadLimits;
import dev.circa.validator.regression.Tolerance;
import java.nio.file.Path;
import java.util.List;

/**
 * What a report includes besides the model itself.
 *
 * @param references reference sets to check against (CSV, as {@code circa check})
 * @param limits read limits for the reference sets
 * @param tolerance the pass rule of the checks, or {@code null} for the document's {@code checks} values (else 1e-9)
 * @param pairs variable pairs drawn as 2-D marginals, at most {@link #MAX_PAIRS} (see {@link VariablePairs})
 * @param producer the program that writes the report, e.g. {@code circa 0.1.0}
 * @param certificateState the state of a certificate given with the model, or {@code null} when none was given
 */
public record ReportOptions(List<Path> references, ReadLimits limits, Tolerance tolerance, List<int[]> pairs,
        String producer, String certificateState) {
    /** Pairs drawn at most. */
    public static final int MAX_PAIRS = 6;

    public ReportOptions {
        references = List.copyOf(references);
        pairs = List.copyOf(pairs);
        if (pairs.size() > MAX_PAIRS) {
            throw new IllegalArgumentException(pairs.size() + " pairs asked for; at most " + MAX_PAIRS + " are drawn");
        }
    }

    /** No reference sets, no pairs, default limits. */
    public static ReportOptions defaults(String producer) {
        return new ReportOptions(List.of(), ReadLimits.DEFAULT, null, List.of(), producer, null);
    }

    public ReportOptions withReferences(List<Path> refs) {
        return new ReportOptions(refs, limits, tolerance, pairs, producer, certificateState);
    }

    public ReportOptions withLimits(ReadLimits l) {
        return new ReportOptions(references, l, tolerance, pairs, producer, certificateState);
    }

    public ReportOptions withTolerance(Tolerance t) {
        return new ReportOptions(references, limits, t, pairs, producer, certificateState);
    }

    public ReportOptions withPairs(List<int[]> p) {
        return new ReportOptions(references, limits, tolerance, p, producer, certificateState);
    }

    public ReportOptions withCertificateState(String state) {
        return new ReportOptions(references, limits, tolerance, pairs, producer, state);
    }
}
