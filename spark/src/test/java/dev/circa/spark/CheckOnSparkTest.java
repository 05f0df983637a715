package dev.circa.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The distributed check against {@code circa check} run in-process on the same files: the report
 * (text and JSON) and the exit status must be equal, whatever the number of partitions. The reference
 * set holds {@code circa eval}'s log-densities with some rows changed so that they fail.
 */
class CheckOnSparkTest {
    private static SparkSession spark;
    @TempDir
    static Path dir;
    private static Path reference;
    private static List<String[]> rows = new ArrayList<>();

    @BeforeAll
    static void start() throws IOException {
        spark = LocalSpark.start();
        Path data = LocalSpark.regimesData(dir, 2000, 1818);
        Path eval = dir.resolve("eval.csv");
        LocalSpark.Run run = LocalSpark.circa("eval", LocalSpark.REGIMES.toString(), "--data", data.toString(), "-o", eval.toString());
        assertEquals(0, run.status(), run.err());
        String[] lines = Files.readString(eval).split("\n");
        StringBuilder sb = new StringBuilder("# reference log-densities of circa eval, some rows changed to fail\n");
        sb.append(lines[0].replace("log_density", "log_density,output")).append('\n');
        String[] outputs = {"joint", "0", ""};
        for (int i = 1; i < lines.length; i++) {
            String[] cells = lines[i].split(",", -1);
            double ld = Double.parseDouble(cells[6]);
            if (i % 97 == 0) {
                ld += 1e-6 * i;
            } else if (i == 500) {
                ld = Double.NEGATIVE_INFINITY;
            } else if (i % 13 == 0) {
                ld += 1e-12;
            }
            cells[6] = ld == Double.NEGATIVE_INFINITY ? "-inf" : Double.toString(ld);
            String[] row = java.util.Arrays.copyOf(cells, 8);
            row[7] = outputs[i % 3];
            rows.add(row);
            sb.append(String.join(",", row)).append('\n');
            if (i == 1000) {
                sb.append("\n# a comment in the middle\n");
            }
        }
        reference = LocalSpark.write(dir.resolve("reference.csv"), sb.toString());
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    @Test
    void check_csvIn1And3Partitions_reportAndStatusEqualCircaCheck() throws IOException {
        for (String format : new String[] {"text", "json"}) {
            LocalSpark.Run single = LocalSpark.circa("check", LocalSpark.REGIMES.toString(), "--reference", reference.toString(),
                    "--format", format);
            assertEquals(1, single.status(), single.err());
            assertTrue(single.out().contains(format.equals("text") ? "FAIL" : "\"passed\": false"), single.out());
            for (int n : new int[] {1, 3}) {
                LocalSpark.Run spread = LocalSpark.circaSpark("check", LocalSpark.REGIMES.toString(), "--reference",
                        reference.toString(), "--format", format,
                        "--conf", "spark.sql.files.maxPartitionBytes=" + (Files.size(reference) / n + 1));
                assertEquals(single.status(), spread.status(), spread.err());
                assertEquals(single.out(), spread.out(), n + " partitions, " + format);
            }
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void check_parquetInThreeFiles_reportEqualsCircaCheckOfTheCsvButLines() {
        StructType schema = new StructType().add("inlet_pressure", DataTypes.DoubleType).add("outlet_pressure", DataTypes.DoubleType)
                .add("motor_current", DataTypes.DoubleType).add("valve", DataTypes.StringType)
                .add("alarm", DataTypes.LongType).add("restarts", DataTypes.IntegerType)
                .add("log_density", DataTypes.DoubleType).add("output", DataTypes.StringType);
        List<Row> typed = new ArrayList<>();
        for (String[] r : rows) {
            Object[] v = new Object[8];
            for (int c = 0; c < 8; c++) {
                String s = r[c].replace("\"", "");
                v[c] = s.isEmpty() && c != 7 ? null : switch (c) {
                    case 0, 1, 2 -> Double.parseDouble(s);
                    case 4 -> Long.parseLong(s);
                    case 5 -> Integer.parseInt(s);
                    case 6 -> s.equals("-inf") ? Double.NEGATIVE_INFINITY : Double.parseDouble(s);
                    default -> s;
                };
            }
            typed.add(RowFactory.create(v));
        }
        Path parquet = dir.resolve("reference.parquet");
        spark.createDataFrame(JavaSparkContext.fromSparkContext(spark.sparkContext()).parallelize(typed, 3), schema)
                .write().parquet(parquet.toString());
        LocalSpark.Run single = LocalSpark.circa("check", LocalSpark.REGIMES.toString(), "--reference", reference.toString(),
                "--format", "json");
        LocalSpark.Run spread = LocalSpark.circaSpark("check", LocalSpark.REGIMES.toString(), "--reference", parquet.toString(),
                "--format", "json");
        assertEquals(single.status(), spread.status(), spread.err());
        String expected = single.out().replace(reference.toString(), "REF").replaceAll("\"line\": [0-9]+", "\"line\": 0");
        assertEquals(expected, spread.out().replace(parquet.toString(), "REF"));
    }

    @Test
    void check_unknownColumn_oneErrorNamingItBeforeWork() throws IOException {
        Path bad = LocalSpark.write(dir.resolve("bad-header.csv"), "inlet_pressure,pump_speed,log_density\n3.0,1.0,-1.5\n");
        LocalSpark.Run single = LocalSpark.circa("check", LocalSpark.REGIMES.toString(), "--reference", bad.toString());
        LocalSpark.Run spread = LocalSpark.circaSpark("check", LocalSpark.REGIMES.toString(), "--reference", bad.toString());
        assertEquals(2, spread.status());
        assertEquals(single.err().replace("circa:", "circa-spark:"), spread.err());
    }

    @Test
    void missingInputs_oneMessageInOurWordsBeforeWork() {
        // what circa's own commands say of a path that names nothing (IoMessages), status 2 (CLI contract)
        String none = dir.resolve("no-such-reference.csv").toString();
        LocalSpark.Run check = LocalSpark.circaSpark("check", LocalSpark.REGIMES.toString(), "--reference", none);
        assertEquals(2, check.status());
        assertEquals("circa-spark: " + none + ": no such file or folder\n", check.err());
        String data = dir.resolve("no-such-data.parquet").toString();
        LocalSpark.Run score = LocalSpark.circaSpark("score", LocalSpark.REGIMES.toString(), "--data", data, "-o",
                dir.resolve("never-written").toString());
        assertEquals(2, score.status());
        assertEquals("circa-spark: " + data + ": no such file or folder\n", score.err());
        assertFalse(java.nio.file.Files.exists(dir.resolve("never-written")));
    }
}
