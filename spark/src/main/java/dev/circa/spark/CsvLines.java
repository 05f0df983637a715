package dev.circa.spark;

import dev.circa.format.csv.CellValues;
import java.util.Iterator;
import java.util.NoSuchElementException;
import org.apache.spark.api.java.function.MapPartitionsFunction;
import org.apache.spark.sql.Row;

/**
 * A scored partition as the lines of a CSV part file, written as {@code circa eval} writes its output:
 * the header, then each row with its cells as read (text columns) and its log-densities formatted by
 * the same {@link CellValues} calls; an empty partition gives no lines.
 */
final class CsvLines implements MapPartitionsFunction<Row, String> {
    private static final long serialVersionUID = 1L;
    private final String[] header;
    private final int scoreColumns;

    CsvLines(String[] header, int scoreColumns) {
        this.header = header;
        this.scoreColumns = scoreColumns;
    }

    @Override
    public Iterator<String> call(Iterator<Row> rows) {
        return new Iterator<>() {
            private boolean headerDone;
            private final StringBuilder sb = new StringBuilder();

            @Override
            public boolean hasNext() {
                return rows.hasNext();
            }

            @Override
            public String next() {
                if (!rows.hasNext()) {
                    throw new NoSuchElementException();
                }
                sb.setLength(0);
                if (!headerDone) {
                    headerDone = true;
                    for (int c = 0; c < header.length; c++) {
                        sb.append(c == 0 ? "" : ",").append(CellValues.quote(header[c]));
                    }
                    return sb.toString();
                }
                Row r = rows.next();
                int first = r.length() - scoreColumns;
                for (int c = 0; c < r.length(); c++) {
                    if (c > 0) {
                        sb.append(',');
                    }
                    if (c >= first) {
                        sb.append(CellValues.formatLogDensity(r.getDouble(c)));
                    } else if (!r.isNullAt(c)) {
                        sb.append(CellValues.quote(String.valueOf(r.get(c))));
                    }
                }
                return sb.toString();
            }
        };
    }
}
