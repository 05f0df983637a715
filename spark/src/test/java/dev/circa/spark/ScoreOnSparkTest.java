package dev.circa.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.ReadLimits;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.Dataset;
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
 * Scoring on Spark against the single-machine engine: the reference is {@code circa eval}'s output on
 * the same rows, run in-process, compared bit for bit (its numbers are Double.toString, which reads
 * back exactly).
 */
class ScoreOnSparkTest {
    private static SparkSession spark;
    @TempDir
    static Path dir;
    private static Path data;
    private static String evalOut;

    @BeforeAll
    static void start() throws IOException {
        spark = LocalSpark.start();
        data = LocalSpark.regimesData(dir, 3000, 18);
        LocalSpark.Run eval = LocalSpark.circa("eval", LocalSpark.REGIMES.toString(), "--data", data.toString(),
                "-o", dir.resolve("eval.csv").toString());
        assertEquals(0, eval.status(), eval.err());
        evalOut = Files.readString(dir.resolve("eval.csv"));
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    private static SparkModel model() throws Exception {
        return SparkModel.load(LocalSpark.REGIMES, ReadLimits.DEFAULT, new PrintWriter(new StringWriter()));
    }

    @Test
    void score_csvSplitInto1_3_8Partitions_partFilesEqualCircaEvalOutput() throws IOException {
        long size = Files.size(data);
        for (int n : new int[] {1, 3, 8}) {
            Path out = dir.resolve("scored-" + n);
            LocalSpark.Run run = LocalSpark.circaSpark("score", LocalSpark.REGIMES.toString(), "--data", data.toString(),
                    "-o", out.toString(), "--conf", "spark.sql.files.maxPartitionBytes=" + (size / n + 1));
            assertEquals(0, run.status(), run.err());
            String[] parts = LocalSpark.parts(out);
            int nl = evalOut.indexOf('\n');
            assertEquals(evalOut.substring(0, nl + 1), parts[0], "header as circa eval writes it");
            assertEquals(evalOut.substring(nl + 1), parts[1], n + " partitions: rows and numbers as circa eval writes them");
            try (var files = Files.list(out)) {
                assertEquals(n, files.filter(f -> f.getFileName().toString().startsWith("part-")).count());
            }
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void score_withCertificate_sameOutput_changedModelRefusedBeforeAnyWork() throws IOException {
        Path model = dir.resolve("certified.json");
        Files.copy(LocalSpark.REGIMES, model);
        Path cert = dir.resolve("certified.cert.json");
        LocalSpark.Run certify = LocalSpark.circa("certify", model.toString(), "-o", cert.toString());
        assertEquals(0, certify.status(), certify.err());
        Path out = dir.resolve("scored-certified");
        LocalSpark.Run run = LocalSpark.circaSpark("score", model.toString(), "--certificate", cert.toString(),
                "--data", data.toString(), "-o", out.toString());
        assertEquals(0, run.status(), run.err());
        String[] parts = LocalSpark.parts(out);
        assertEquals(evalOut, parts[0] + parts[1], "a certified load scores exactly as circa eval");

        Files.writeString(model, Files.readString(model) + " "); // still valid JSON, no longer the certified bytes
        Path out2 = dir.resolve("scored-changed");
        LocalSpark.Run changed = LocalSpark.circaSpark("score", model.toString(), "--certificate", cert.toString(),
                "--data", data.toString(), "-o", out2.toString());
        assertEquals(2, changed.status(), changed.err());
        assertFalse(Files.exists(out2), "nothing written");
    }

    @Test
    void score_datasetIn1_3_8Partitions_bitIdenticalToCircaEval() throws Exception {
        List<Row> rows = new ArrayList<>();
        List<Long> expected = new ArrayList<>();
        String[] lines = evalOut.split("\n");
        for (int i = 1; i < Math.min(lines.length, 1001); i++) {
            String[] cells = lines[i].split(",", -1);
            Object[] values = new Object[6];
            for (int c = 0; c < 6; c++) {
                String cell = cells[c].replace("\"", "");
                values[c] = cell.isEmpty() ? null : c < 3 ? (Object) Double.parseDouble(cell) : c == 3 ? cell : (Object) Long.parseLong(cell);
            }
            rows.add(RowFactory.create(values));
            expected.add(Double.doubleToLongBits(Double.parseDouble(cells[6])));
        }
        StructType schema = new StructType().add("inlet_pressure", DataTypes.DoubleType).add("outlet_pressure", DataTypes.DoubleType)
                .add("motor_current", DataTypes.DoubleType).add("valve", DataTypes.StringType)
                .add("alarm", DataTypes.LongType).add("restarts", DataTypes.IntegerType);
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        CircuitScorer scorer = CircuitScorer.of(model());
        for (int n : new int[] {1, 3, 8}) {
            List<Row> typed = new ArrayList<>();
            for (Row r : rows) {
                Object[] v = new Object[6];
                for (int c = 0; c < 6; c++) {
                    v[c] = c == 5 && !r.isNullAt(5) ? (Object) ((Long) r.get(5)).intValue() : r.get(c);
                }
                typed.add(RowFactory.create(v));
            }
            Dataset<Row> ds = spark.createDataFrame(jsc.parallelize(typed, n), schema);
            assertEquals(n, ds.rdd().getNumPartitions());
            List<Row> scored = scorer.score(ds).collectAsList();
            assertEquals(expected.size(), scored.size());
            for (int i = 0; i < scored.size(); i++) {
                assertEquals(expected.get(i), Double.doubleToLongBits(scored.get(i).getDouble(6)), n + " partitions, row " + (i + 1));
            }
        }
    }

    @Test
    void score_givenColumns_parquetOutput_bitIdenticalToCircaEvalGiven() throws IOException {
        LocalSpark.Run eval = LocalSpark.circa("eval", LocalSpark.REGIMES.toString(), "--data", data.toString(),
                "--given", "valve,alarm", "-o", dir.resolve("eval-given.csv").toString());
        assertEquals(0, eval.status(), eval.err());
        Path out = dir.resolve("given.parquet");
        LocalSpark.Run run = LocalSpark.circaSpark("score", LocalSpark.REGIMES.toString(), "--data", data.toString(),
                "--given", "valve,alarm", "--output-format", "parquet", "-o", out.toString(),
                "--conf", "spark.sql.files.maxPartitionBytes=" + (Files.size(data) / 3 + 1));
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
        assertEquals(0, run.status(), run.err());
        String[] lines = Files.readString(dir.resolve("eval-given.csv")).split("\n");
        // the part files in name order hold the input's splits in order
        List<Long> got = new ArrayList<>();
        try (var files = Files.list(out)) {
            for (Path p : files.filter(f -> f.getFileName().toString().startsWith("part-")).sorted().toList()) {
                for (Row r : spark.read().parquet(p.toString()).collectAsList()) {
                    got.add(Double.doubleToLongBits(r.getDouble(r.fieldIndex("log_density"))));
                }
            }
        }
        List<Long> want = new ArrayList<>();
        for (int i = 1; i < lines.length; i++) {
            String[] cells = lines[i].split(",", -1);
            want.add(Double.doubleToLongBits(cells[6].equals("-inf") ? Double.NEGATIVE_INFINITY : Double.parseDouble(cells[6])));
        }
        assertEquals(want.size(), got.size());
        for (int i = 0; i < want.size(); i++) {
            assertEquals(want.get(i), got.get(i), "row " + (i + 1));
        }
    }

    @Test
    void score_variableWithoutColumn_errorNamesTheColumnBeforeAnyWork() throws Exception {
        Dataset<Row> ds = spark.createDataFrame(List.of(RowFactory.create(3.0, "open")),
                new StructType().add("inlet_pressure", DataTypes.DoubleType).add("valve", DataTypes.StringType));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> CircuitScorer.of(model()).score(ds));
        assertTrue(e.getMessage().contains("no column \"outlet_pressure\""), e.getMessage());
        LocalSpark.Run run = LocalSpark.circaSpark("score", LocalSpark.REGIMES.toString(), "--data", data.toString(),
                "--given", "valve,pump_speed", "-o", dir.resolve("never").toString());
        assertEquals(2, run.status());
        assertTrue(run.err().contains("\"pump_speed\" is not a variable"), run.err());
        assertTrue(Files.notExists(dir.resolve("never")));
    }

    @Test
    void score_columnOfWrongType_errorNamesTheColumnBeforeAnyWork() throws Exception {
        StructType schema = new StructType().add("inlet_pressure", DataTypes.DoubleType).add("outlet_pressure", DataTypes.DoubleType)
                .add("motor_current", DataTypes.DoubleType).add("valve", DataTypes.DoubleType)
                .add("alarm", DataTypes.LongType).add("restarts", DataTypes.LongType);
        Dataset<Row> ds = spark.createDataFrame(List.of(RowFactory.create(3.0, 5.0, 12.0, 1.0, 0L, 1L)), schema);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> CircuitScorer.of(model()).score(ds));
        assertTrue(e.getMessage().startsWith("column \"valve\" has type double"), e.getMessage());
    }

    @Test
    void score_unknownLabel_jobFailsNamingColumnLabelAndRow() throws IOException {
        Path bad = LocalSpark.write(dir.resolve("bad-label.csv"),
                "inlet_pressure,outlet_pressure,motor_current,valve,alarm,restarts\n3.0,5.0,12.0,open,0,1\n3.1,5.2,12.5,ajar,1,0\n");
        LocalSpark.Run run = LocalSpark.circaSpark("score", LocalSpark.REGIMES.toString(), "--data", bad.toString(),
                "-o", dir.resolve("bad-out").toString());
        assertEquals(2, run.status());
        assertTrue(run.err().startsWith("circa-spark: column valve: \"ajar\" is not a value of valve"), run.err());
        assertTrue(run.err().contains("inlet_pressure=3.1"), run.err());
        assertTrue(Files.notExists(dir.resolve("bad-out").resolve("_SUCCESS")));
    }
}
