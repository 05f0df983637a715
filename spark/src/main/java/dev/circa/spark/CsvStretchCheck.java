package dev.circa.spark;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.csv.CsvReader;
import dev.circa.validator.regression.ReferenceSetReader;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;

/**
 * Second pass over a reference CSV read as lines: each file split is read by the validator's
 * reference-set reader (after the header line), numbered with the lines and rows of the splits before
 * it, and checked by the validator's regression check; gives one partial report per split.
 */
final class CsvStretchCheck implements FlatMapFunction<Iterator<Row>, PartialReport> {
    private static final long serialVersionUID = 1L;
    private final Broadcast<SparkModel> model;
    private final String file;
    private final String header;
    private final long[] starts;
    private final long[] linesBefore;
    private final long[] rowsBefore;
    private final double atol;
    private final double rtol;

    CsvStretchCheck(Broadcast<SparkModel> model, String file, String header, long[] starts, long[] linesBefore,
                    long[] rowsBefore, Tolerance tolerance) {
        this.model = model;
        this.file = file;
        this.header = header;
        this.starts = starts;
        this.linesBefore = linesBefore;
        this.rowsBefore = rowsBefore;
        this.atol = tolerance.atol();
        this.rtol = tolerance.rtol();
    }

    @Override
    public Iterator<PartialReport> call(Iterator<Row> rows) throws Exception {
        SparkModel m = model.value();
        CompiledCircuit c = m.compiled();
        List<String> outputs = m.outputNames();
        List<PartialReport> parts = new ArrayList<>();
        LineStretches stretches = new LineStretches(rows);
        while (stretches.hasNext()) {
            long start = stretches.start();
            int k = Arrays.binarySearch(starts, start);
            boolean first = start == 0;
            LineStretches.Stretch text = stretches.next(first ? "" : header + "\n");
            int firstLine = first ? 1 : Math.toIntExact(linesBefore[k]);
            CsvReader csv = new CsvReader(text, file, m.limits(), firstLine);
            RegressionCheck check = new RegressionCheck(c, new Tolerance(atol, rtol));
            check.checkReference(new ReferenceSetReader(csv, c.variables(), outputs, rowsBefore[k]));
            text.drain();
            parts.add(new PartialReport(check.report()));
        }
        return parts.iterator();
    }
}
