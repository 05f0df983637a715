package dev.circa.spark;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.IoMessages;

import dev.circa.format.io.InputFiles;
import dev.circa.format.io.TextDecoding;
import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.NoSuchFileException;
import java.util.Arrays;
import java.util.Comparator;
import org.apache.hadoop.fs.FSDataInputStream;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
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

    /**
     * The rows of {@code path} (a file or a folder of part files). A CSV file is UTF-8, UTF-16 or UTF-32
     * with or without a byte-order mark, detected from its first bytes as circa's own readers do (a
     * folder: from its first part file); the mark is not part of the first column's name.
     */
    public static Dataset<Row> read(SparkSession spark, String path) throws FormatException {
        requireExists(spark, path);
        if (path.endsWith(".parquet")) {
            return spark.read().parquet(path);
        }
        Charset cs = encoding(spark, path);
        // Spark's line reader knows the line breaks of UTF-8 only: other texts are read whole
        boolean multiLine = !cs.equals(StandardCharsets.UTF_8) || hasQuotedLineBreak(spark.read().text(path));
        Dataset<Row> rows = spark.read().option("header", "true").option("inferSchema", "false").option("comment", "#")
                .option("quote", "\"").option("escape", "\"").option("mode", "FAILFAST").option("encoding", cs.name())
                .option("multiLine", Boolean.toString(multiLine)).csv(path);
        String first = rows.columns().length > 0 ? rows.columns()[0] : "";
        return first.startsWith("\uFEFF") ? rows.withColumnRenamed(first, first.substring(1)) : rows;
    }

    /**
     * Refuses a path (no wildcard in it) that names nothing, before Spark is asked to read it: Spark's
     * own answer is a logged stack trace and a message in its words.
     */
    static void requireExists(SparkSession spark, String path) throws FormatException {
        if (path.chars().anyMatch(ch -> "*?[{".indexOf(ch) >= 0)) {
            return;
        }
        Path p = new Path(path);
        boolean exists;
        try {
            exists = p.getFileSystem(spark.sparkContext().hadoopConfiguration()).exists(p);
        } catch (IOException e) {
            throw new FormatException(path, 0, 0, null, IoMessages.of(e));
        }
        if (!exists) {
            throw new FormatException(path, 0, 0, null, IoMessages.of(new NoSuchFileException(path)));
        }
    }

    /** The text encoding of {@code path}'s first bytes (of its first part file for a folder); UTF-8 for gzip. */
    private static Charset encoding(SparkSession spark, String path) {
        Path p = new Path(path);
        try {
            FileSystem fs = p.getFileSystem(spark.sparkContext().hadoopConfiguration());
            Path file = p;
            if (fs.getFileStatus(p).isDirectory()) {
                FileStatus[] parts = fs.listStatus(p, q -> !q.getName().startsWith("_") && !q.getName().startsWith("."));
                if (parts.length == 0) {
                    return StandardCharsets.UTF_8;
                }
                Arrays.sort(parts, Comparator.comparing(s -> s.getPath().getName()));
                file = parts[0].getPath();
            }
            if (InputFiles.isGzipName(file.getName())) {
                return StandardCharsets.UTF_8;
            }
            try (FSDataInputStream in = fs.open(file)) {
                byte[] head = new byte[4];
                return TextDecoding.encoding(head, in.readNBytes(head, 0, 4));
            }
        } catch (FileNotFoundException e) {
            return StandardCharsets.UTF_8; // a wildcard pattern (a missing path was refused before): Spark's reader says which
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * Whether some line of {@code lines} (a text dataset, column {@code value}) opens a quoted cell that
     * goes on to the next line; stops at the first one found.
     */
    static boolean hasQuotedLineBreak(Dataset<Row> lines) {
        return !lines.where(ODD_QUOTES).isEmpty();
    }
}
