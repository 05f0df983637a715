package dev.circa.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * CSV files whose quoted cells hold line breaks (RFC 4180 section 2, rule 6), split by Spark at line
 * breaks into 1, 3 and 8 partitions: scoring gives {@code circa eval}'s output and the distributed check
 * {@code circa check}'s report and status, both run in-process on the same files. And text that is not
 * UTF-8 as Spark's line reader takes it (a malformed byte far into the file; UTF-16): the same message or
 * report as {@code circa check}.
 */
class CsvTextOnSparkTest {
    /** Valve states whose labels hold a line break, a comma and quotes. */
    private static final String[] LABELS = {"closed", "half\nopen", "open, \"stuck\"\nat the top\n"};
    private static final int[] PARTITIONS = {1, 3, 8};
    private static SparkSession spark;
    @TempDir
    static Path dir;
    private static Path circuit;
    private static Path data;
    private static Path reference;
    private static String evalOut;

    @BeforeAll
    static void start() throws IOException {
        spark = LocalSpark.start();
        circuit = LocalSpark.write(dir.resolve("valve-notes.json"), """
                {"format": "circa.circuit", "version": "1.0", "name": "valve-notes",
                 "variables": [{"name": "inlet_pressure", "type": "real", "unit": "bar"},
                               {"name": "valve", "type": "categorical",
                                "states": ["closed", "half\\nopen", "open, \\"stuck\\"\\nat the top\\n"]}],
                 "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                           {"id": 1, "input": "categorical", "var": 1, "probs": [0.05, 0.15, 0.8]},
                           {"id": 2, "product": [0, 1]},
                           {"id": 3, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                           {"id": 4, "input": "categorical", "var": 1, "probs": [0.6, 0.3, 0.1]},
                           {"id": 5, "product": [3, 4]},
                           {"id": 6, "sum": [2, 5], "weights": [0.85, 0.15]}],
                 "outputs": [{"name": "joint", "node": 6}]}
                """);
        Random rnd = new Random(16);
        StringBuilder sb = new StringBuilder("inlet_pressure,valve\n");
        for (int r = 0; r < 600; r++) {
            if (r == 100) {
                sb.append("# a comment line, skipped\n\n");
            }
            String pressure = rnd.nextInt(10) == 0 ? "" : String.format(Locale.ROOT, "%.4f", 3 + 0.5 * rnd.nextGaussian());
            int k = rnd.nextInt(3);
            String valve = rnd.nextInt(10) == 0 ? "" : rnd.nextInt(5) == 0 ? Integer.toString(k)
                    : "\"" + LABELS[k].replace("\"", "\"\"") + "\"";
            sb.append(pressure).append(',').append(valve).append('\n');
        }
        data = LocalSpark.write(dir.resolve("valve-notes.csv"), sb.toString());
        LocalSpark.Run eval = LocalSpark.circa("eval", circuit.toString(), "--data", data.toString(),
                "-o", dir.resolve("eval.csv").toString());
        assertEquals(0, eval.status(), eval.err());
        evalOut = Files.readString(dir.resolve("eval.csv"));
        // the reference set: circa eval's records (read back by circa's CSV reader, so that the quoted
        // line breaks stay inside their cells), every 37th log-density moved by 1e-6 so that it fails
        StringBuilder ref = new StringBuilder();
        try (dev.circa.format.csv.CsvReader csv = dev.circa.format.csv.CsvReader.open(dir.resolve("eval.csv"),
                dev.circa.format.io.ReadLimits.DEFAULT)) {
            java.util.List<String> rec;
            for (int i = 0; (rec = csv.next()) != null; i++) {
                String ld = rec.get(2);
                if (i > 0 && i % 37 == 0 && !ld.equals("-inf")) {
                    ld = Double.toString(Double.parseDouble(ld) + 1e-6);
                }
                ref.append(dev.circa.format.csv.CellValues.quote(rec.get(0))).append(',')
                        .append(dev.circa.format.csv.CellValues.quote(rec.get(1))).append(',').append(ld).append('\n');
            }
        }
        reference = LocalSpark.write(dir.resolve("reference.csv"), ref.toString());
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    @Test
    void score_quotedLineBreaksAcrossSplits_partFilesEqualCircaEvalOutput() throws IOException {
        assertTrue(evalOut.contains("\"half\nopen\""), "the output holds quoted line breaks as circa eval writes them");
        long size = Files.size(data);
        for (int n : PARTITIONS) {
            Path out = dir.resolve("scored-" + n);
            LocalSpark.Run run = LocalSpark.circaSpark("score", circuit.toString(), "--data", data.toString(),
                    "-o", out.toString(), "--conf", "spark.sql.files.maxPartitionBytes=" + (size / n + 1));
            assertEquals(0, run.status(), run.err());
            String[] parts = LocalSpark.parts(out);
            assertEquals(evalOut, parts[0] + parts[1], n + " splits: rows and numbers as circa eval writes them");
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void score_utf8AndUtf16WithByteOrderMark_partFilesEqualCircaEvalOutput() throws IOException {
        // the byte-order mark U+FEFF in UTF-8 and UTF-16LE (The Unicode Standard, section 23.8), by the JDK's encoders
        String text = "\uFEFF" + Files.readString(data);
        for (java.nio.charset.Charset cs : new java.nio.charset.Charset[] {java.nio.charset.StandardCharsets.UTF_8,
            java.nio.charset.StandardCharsets.UTF_16LE}) {
            Path marked = dir.resolve("marked-" + cs.name() + ".csv");
            Files.write(marked, text.getBytes(cs));
            Path out = dir.resolve("scored-" + cs.name());
            LocalSpark.Run run = LocalSpark.circaSpark("score", circuit.toString(), "--data", marked.toString(),
                    "-o", out.toString(), "--conf", "spark.sql.files.maxPartitionBytes=" + (text.length() / 3 + 1));
            assertEquals(0, run.status(), run.err());
            String[] parts = LocalSpark.parts(out);
            assertEquals(evalOut, parts[0] + parts[1], cs.name() + " with a byte-order mark: as circa eval of the plain file");
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void check_quotedLineBreaksAcrossSplits_reportAndStatusEqualCircaCheck() throws IOException {
        long size = Files.size(reference);
        for (String format : new String[] {"text", "json"}) {
            LocalSpark.Run single = LocalSpark.circa("check", circuit.toString(), "--reference", reference.toString(),
                    "--format", format);
            assertEquals(1, single.status(), single.err());
            assertFalse(single.out().isEmpty());
            for (int n : PARTITIONS) {
                LocalSpark.Run spread = LocalSpark.circaSpark("check", circuit.toString(), "--reference",
                        reference.toString(), "--format", format,
                        "--conf", "spark.sql.files.maxPartitionBytes=" + (size / n + 1));
                assertEquals(single.status(), spread.status(), spread.err());
                assertEquals(single.out(), spread.out(), n + " splits, " + format);
            }
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void check_fileEndsInsideAQuotedCell_oneLocatedMessageAsCircaCheck() throws IOException {
        String text = Files.readString(reference);
        Path cut = LocalSpark.write(dir.resolve("cut.csv"), text.substring(0, text.lastIndexOf("\"half") + 3));
        LocalSpark.Run single = LocalSpark.circa("check", circuit.toString(), "--reference", cut.toString());
        LocalSpark.Run spread = LocalSpark.circaSpark("check", circuit.toString(), "--reference", cut.toString(),
                "--conf", "spark.sql.files.maxPartitionBytes=" + (Files.size(cut) / 3 + 1));
        assertEquals(2, single.status(), single.err());
        assertEquals(2, spread.status(), spread.err());
        assertTrue(single.err().contains("the file ends inside a quoted field"), single.err());
        assertEquals(single.err().replace("circa:", "circa-spark:"), spread.err());
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void check_malformedByteOnRow500_sameLocatedMessageAsCircaCheck() throws IOException {
        // 0xFF never occurs in UTF-8 (RFC 3629 section 1): Spark's line reader would make it U+FFFD
        byte[] text = Files.readAllBytes(reference);
        String ascii = Files.readString(reference); // ASCII only: character and byte positions agree
        text[ascii.indexOf("closed", ascii.length() * 4 / 5) + 2] = (byte) 0xFF;
        Path bad = dir.resolve("malformed.csv");
        Files.write(bad, text);
        LocalSpark.Run single = LocalSpark.circa("check", circuit.toString(), "--reference", bad.toString());
        assertEquals(2, single.status(), single.err());
        assertTrue(single.err().contains("byte 0xFF is not UTF-8 text"), single.err());
        for (int n : new int[] {1, 3}) {
            LocalSpark.Run spread = LocalSpark.circaSpark("check", circuit.toString(), "--reference", bad.toString(),
                    "--conf", "spark.sql.files.maxPartitionBytes=" + (text.length / n + 1));
            assertEquals(single.err().replace("circa:", "circa-spark:"), spread.err(), n + " splits");
            assertEquals(2, spread.status());
        }
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void check_utf16WithByteOrderMark_sameReportAsCircaCheck() throws IOException {
        // the byte-order mark U+FEFF and UTF-16LE (The Unicode Standard, section 23.8), by the JDK's encoder
        Path utf16 = dir.resolve("reference-utf16.csv");
        Files.write(utf16, ("\uFEFF" + Files.readString(reference)).getBytes(java.nio.charset.StandardCharsets.UTF_16LE));
        LocalSpark.Run single = LocalSpark.circa("check", circuit.toString(), "--reference", utf16.toString());
        assertEquals(1, single.status(), single.err());
        LocalSpark.Run spread = LocalSpark.circaSpark("check", circuit.toString(), "--reference", utf16.toString(),
                "--conf", "spark.sql.files.maxPartitionBytes=" + (Files.size(utf16) / 3 + 1));
        assertEquals(single.status(), spread.status(), spread.err());
        assertEquals(single.out(), spread.out());
        spark.conf().unset("spark.sql.files.maxPartitionBytes");
    }

    @Test
    void hasQuotedLineBreak_onlyWhenALineOpensAQuotedCell() {
        assertTrue(DataFiles.hasQuotedLineBreak(spark.read().text(data.toString())));
        Path plain = LocalSpark.write(dir.resolve("plain.csv"), "inlet_pressure,valve\n3.0,\"closed\"\n2.5,\"a \"\"b\"\"\"\n");
        assertFalse(DataFiles.hasQuotedLineBreak(spark.read().text(plain.toString())));
    }
}
