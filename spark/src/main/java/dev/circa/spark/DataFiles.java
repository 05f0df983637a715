package dev.circa.spark;

import org.apache.spark.sql.Column;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.functions;

/**
 * Reads a data set by its name's ending: Parquet for {@code .parquet}, else CSV as circa reads it
 * (FORMAT.md section 5: a header, every cell text, {@code #} comment lines, quotes doubled inside
 * quoted cells, a quoted cell may hold line breaks, an empty cell null).
 *
 * <p>A CSV file is split into partitions at line breaks, which is right only when no quoted cell holds
 * one: a record that spans a split boundary would be cut in two. So the lines are looked at first
 * ({@link #hasQuotedLineBreak}); when a cell holds a line break, each file is read whole by one task
 * (Spark's multi-line reader, which does not split a file), whatever the split size.
 */
public final class DataFiles {
    /**
     * A line with an odd number of {@code "}: a quoted cell opens on it and goes on past its end (in a
     * well-formed line every quoted cell has its two quotes and its doubled ones). A comment line with
     * an odd number counts too: it only makes the reading take the safe way.
     */
    private static final Column ODD_QUOTES = functions.expr("(length(value) - length(replace(value, '\"', ''))) % 2 = 1");

    private DataFiles() {
    }

    /** The rows of {@code path} (a file or a folder of part files). */
    public static Dataset<Row> read(SparkSession spark, String path) {
        if (path.endsWith(".parquet")) {
            return spark.read().parquet(path);
        }
        boolean multiLine = hasQuotedLineBreak(spark.read().text(path));
        return spark.read().option("header", "true").option("inferSchema", "false").option("comment", "#")
                .option("quote", "\"").option("escape", "\"").option("mode", "FAILFAST")
                .option("multiLine", Boolean.toString(multiLine)).csv(path);
    }

    /**
     * Whether some line of {@code lines} (a text dataset, column {@code value}) opens a quoted cell that
     * goes on to the next line; stops at the first one found.
     */
    static boolean hasQuotedLineBreak(Dataset<Row> lines) {
        return !lines.where(ODD_QUOTES).isEmpty();
    }
}
