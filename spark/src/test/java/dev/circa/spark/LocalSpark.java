package dev.circa.spark;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;
import org.apache.spark.sql.SparkSession;

/** One local Spark session per test class, on the loopback only, and the test data of this module. */
final class LocalSpark {
    /** The pump-station regimes circuit: real, categorical (labels), binary and count variables. */
    static final Path REGIMES = Path.of("../fixtures/mixtures/pump-station-regimes.circuit.json");

    private LocalSpark() {
    }

    static SparkSession start() {
        return SparkSession.builder().master("local[2]").appName("circa-test")
                .config("spark.ui.enabled", "false")
                .config("spark.driver.bindAddress", "127.0.0.1")
                .config("spark.driver.host", "127.0.0.1")
                .config("spark.sql.shuffle.partitions", "2")
                .getOrCreate();
    }

    /** Result of a command run in-process. */
    record Run(int status, String out, String err) {
    }

    static Run circa(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = dev.circa.cli.Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(status, out.toString(), err.toString());
    }

    static Run circaSpark(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = CircaSpark.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(status, out.toString(), err.toString());
    }

    /**
     * A seeded data CSV for {@link #REGIMES} of {@code rows} rows: about 10% empty cells, valve by label
     * (some quoted) or by state index, a comment line and a blank line.
     */
    static Path regimesData(Path dir, int rows, long seed) {
        Random rnd = new Random(seed);
        StringBuilder sb = new StringBuilder("inlet_pressure,outlet_pressure,motor_current,valve,alarm,restarts\n");
        String[] labels = {"closed", "half", "open"};
        for (int r = 0; r < rows; r++) {
            if (r == 7) {
                sb.append("# a comment line, skipped\n\n");
            }
            String valve = rnd.nextBoolean() ? labels[rnd.nextInt(3)] : Integer.toString(rnd.nextInt(3));
            if (r % 11 == 0) {
                valve = "\"" + valve + "\"";
            }
            String[] cells = {
                String.format(Locale.ROOT, "%.4f", 3 + 0.5 * rnd.nextGaussian()),
                String.format(Locale.ROOT, "%.4f", 5 + rnd.nextGaussian()),
                Double.toString(12 + 2 * rnd.nextGaussian()),
                valve,
                Integer.toString(rnd.nextInt(2)),
                Integer.toString(rnd.nextInt(5))};
            for (int c = 0; c < cells.length; c++) {
                if (rnd.nextInt(10) == 0) {
                    cells[c] = "";
                }
            }
            sb.append(String.join(",", cells)).append('\n');
        }
        return write(dir.resolve("regimes-" + rows + ".csv"), sb.toString());
    }

    static Path write(Path file, String text) {
        try {
            return Files.writeString(file, text);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The concatenated lines of a folder's part files in name order, each file's header dropped; and the header. */
    static String[] parts(Path folder) throws IOException {
        StringBuilder body = new StringBuilder();
        String header = null;
        try (var files = Files.list(folder)) {
            for (Path p : files.filter(f -> f.getFileName().toString().startsWith("part-")).sorted().toList()) {
                String text = Files.readString(p);
                if (text.isEmpty()) {
                    continue;
                }
                int nl = text.indexOf('\n');
                header = text.substring(0, nl + 1);
                body.append(text.substring(nl + 1));
            }
        }
        return new String[] {header, body.toString()};
    }
}
