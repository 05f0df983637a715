package dev.circa.spark;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;

/**
 * Reads a data set by its name's ending: Parquet for {@code .parquet}, else CSV as circa reads it
 * (FORMAT.md section 5: a header, every cell text, {@code #} comment lines, quotes doubled inside
 * quoted cells, an empty cell null).
 */
public final class DataFiles {
    private DataFiles() {
    }

    /** The rows of {@code path} (a file or a folder of part files). */
    public static Dataset<Row> read(SparkSession spark, String path) {
        if (path.endsWith(".parquet")) {
            return spark.read().parquet(path);
        }
        return spark.read().option("header", "true").option("inferSchema", "false").option("comment", "#")
                .option("quote", "\"").option("escape", "\"").option("mode", "FAILFAST").option("multiLine", "false")
                .csv(path);
    }
}
