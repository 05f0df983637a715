package dev.circa.spark;

import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.FormatException;
import java.io.Serializable;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.sql.Row;

/**
 * First pass over a reference CSV read as lines: per file split, its lines and its CSV records (the
 * header not counted), so that the second pass can number each stretch's lines and rows as in the
 * whole file; the first split also gives the header line.
 */
final class CsvStretchCount implements FlatMapFunction<Iterator<Row>, CsvStretchCount.Count> {
    private static final long serialVersionUID = 1L;
    private final SparkModel model;

    CsvStretchCount(SparkModel model) {
        this.model = model;
    }

    /**
     * One split's counts.
     *
     * @param start the split's byte offset
     * @param lines its lines
     * @param records its records, the header not counted
     * @param header the header line (first split only, else null)
     * @param headerLine the header's line number (first split only)
     * @param readWhole whether the file must be read whole by circa's reader ({@link LineStretches.Stretch#readWhole})
     */
    record Count(long start, long lines, long records, String header, int headerLine, boolean readWhole)
            implements Serializable {
    }

    @Override
    public Iterator<Count> call(Iterator<Row> rows) {
        List<Count> counts = new ArrayList<>();
        LineStretches stretches = new LineStretches(rows);
        while (stretches.hasNext()) {
            long start = stretches.start();
            LineStretches.Stretch text = stretches.next("");
            CsvReader csv = new CsvReader(text, "", model.limits());
            long records = 0;
            String header = null;
            int headerLine = 0;
            try {
                List<String> rec;
                while ((rec = csv.next()) != null) {
                    if (start == 0 && header == null) {
                        header = String.join(",", rec.stream().map(dev.circa.format.csv.CellValues::quote).toList());
                        headerLine = csv.line();
                    } else {
                        records++;
                    }
                }
            } catch (FormatException e) {
                // the second pass meets the same problem and reports it with the file's line numbers
            }
            text.drain();
            counts.add(new Count(start, text.lines(), records, header, headerLine, text.readWhole()));
        }
        return counts.iterator();
    }
}
