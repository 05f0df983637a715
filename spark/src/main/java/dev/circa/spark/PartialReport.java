package dev.circa.spark;

import dev.circa.validator.regression.CaseResult;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.OutputSummary;
import dev.circa.validator.regression.Tolerance;
import java.io.Serializable;
import java.util.ArrayList;
import java.util.List;

/** A {@link CheckReport} of one stretch of a reference set, in a form tasks send back to the driver. */
final class PartialReport implements Serializable {
    private static final long serialVersionUID = 1L;

    private final List<Object[]> outputs = new ArrayList<>();
    private final List<Object[]> worst = new ArrayList<>();

    PartialReport(CheckReport r) {
        for (OutputSummary o : r.outputs()) {
            outputs.add(new Object[] {o.output(), o.cases(), o.failures(), o.maxAbsError(), o.maxRelError()});
        }
        for (CaseResult c : r.worst()) {
            worst.add(new Object[] {c.source(), c.row(), c.line(), c.pointer(), c.output(), c.expected(), c.computed(),
                c.passed(), c.excess()});
        }
    }

    /** The report again; totals are not needed by {@code RegressionCheck.include}, which sums the outputs. */
    CheckReport toReport(Tolerance tolerance) {
        List<OutputSummary> outs = new ArrayList<>();
        for (Object[] o : outputs) {
            outs.add(new OutputSummary((String) o[0], (Long) o[1], (Long) o[2], (Double) o[3], (Double) o[4]));
        }
        List<CaseResult> cases = new ArrayList<>();
        for (Object[] c : worst) {
            cases.add(new CaseResult((String) c[0], (Long) c[1], (Long) c[2], (String) c[3], (String) c[4], (Double) c[5],
                    (Double) c[6], (Boolean) c[7], (Double) c[8]));
        }
        return new CheckReport(tolerance, 0, 0, 0, 0, cases, outs);
    }
}
