package dev.circa.spark;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Encoders;
import org.apache.spark.sql.Row;

/**
 * Writes a scored dataset into a folder through Spark's committers (the folder is complete, with its
 * {@code _SUCCESS} marker, or the job failed): CSV part files with the header and numbers of
 * {@code circa eval}, or Parquet.
 */
public final class ScoredOutput {
    private ScoredOutput() {
    }

    /**
     * Writes {@code scored}, whose last {@code scoreColumns} columns are log-densities, to {@code folder}.
     *
     * @param parquet Parquet when true, else CSV part files
     */
    public static void write(Dataset<Row> scored, int scoreColumns, String folder, boolean parquet) {
        if (parquet) {
            scored.write().parquet(folder);
        } else {
            scored.mapPartitions(new CsvLines(scored.columns(), scoreColumns), Encoders.STRING()).write().text(folder);
        }
    }
}
