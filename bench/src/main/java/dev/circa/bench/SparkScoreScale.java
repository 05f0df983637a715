package dev.circa.bench;

import dev.circa.format.io.ReadLimits;
import dev.circa.spark.CircaSpark;
import dev.circa.spark.CircuitScorer;
import dev.circa.spark.DataFiles;
import dev.circa.spark.ScoredOutput;
import dev.circa.spark.SparkModel;
import java.io.BufferedReader;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;
import org.apache.spark.api.java.function.ForeachPartitionFunction;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;

/**
 * Rows per second of {@code circa-spark score} on {@code local[2]} beside {@code circa eval} on the same
 * rows, in the same run (both in this JVM, one after the other), their ratio, and where the Spark run's
 * time goes: start-up (session and model), reading (rows parsed, nothing evaluated), evaluation (the
 * scored rows drained, minus reading) and writing (the whole command, minus the rest). Not a test.
 *
 * <p>The model and rows are the torch peer's ({@code ../shared/bench/torch_peer.py}): make them once,
 * then run from the repository root:
 * <pre>
 * python3 ../shared/bench/torch_peer.py make OUT --vars 256 --depth 5 --repeats 8 --sums 10 --inputs 10
 * ./circa convert OUT/regions.json --params OUT/params.npz --sums 10 --inputs 10 -o OUT/circuit.json
 * mvn -B -q package -pl bench -am -DskipTests
 * java -Xmx3g --add-opens=java.base/java.lang=ALL-UNNAMED --add-opens=java.base/java.lang.invoke=ALL-UNNAMED \
 *     --add-opens=java.base/java.nio=ALL-UNNAMED --add-opens=java.base/sun.nio.ch=ALL-UNNAMED --add-opens=java.base/java.util=ALL-UNNAMED \
 *     -cp bench/target/benchmarks.jar:$(cat spark/target/spark-classpath.txt) \
 *     dev.circa.bench.SparkScoreScale OUT [ROWS]
 * </pre>
 * ROWS (default 10^6) are the peer's {@code data.csv} rows repeated, written once to {@code OUT/data-ROWS.csv}.
 */
public final class SparkScoreScale {
    private SparkScoreScale() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = Path.of(args[0]);
        long rows = args.length > 1 ? Long.parseLong(args[1]) : 1_000_000L;
        Path circuit = dir.resolve("circuit.json");
        Path data = rowsFile(dir, rows);
        System.out.printf(Locale.ROOT, "model %s, %d rows of %s (%.0f MB)%n", circuit, rows, data, Files.size(data) / 1e6);

        Path evalOut = dir.resolve("bench-eval.csv");
        long t0 = System.nanoTime();
        int status = dev.circa.cli.Main.run(new String[] {"eval", circuit.toString(), "--data", data.toString(), "-o",
            evalOut.toString()}, new PrintWriter(new StringWriter()), new PrintWriter(System.err, true));
        double eval = seconds(t0);
        check(status == 0, "circa eval failed");

        Path sparkOut = dir.resolve("bench-spark-out");
        delete(sparkOut);
        t0 = System.nanoTime();
        status = CircaSpark.run(new String[] {"score", circuit.toString(), "--data", data.toString(), "-o", sparkOut.toString(),
            "--master", "local[2]"}, new PrintWriter(System.out, true), new PrintWriter(System.err, true));
        double spark = seconds(t0);
        check(status == 0, "circa-spark score failed");
        check(sameRows(evalOut, sparkOut), "circa-spark score and circa eval differ");

        // where the time goes: the same work in phases, in a fresh session
        t0 = System.nanoTime();
        SparkSession session = SparkSession.builder().master("local[2]").appName("circa-bench").config("spark.ui.enabled", "false")
                .config("spark.driver.bindAddress", "127.0.0.1").config("spark.driver.host", "127.0.0.1").getOrCreate();
        session.sparkContext().setLogLevel("WARN");
        SparkModel model = SparkModel.load(circuit, ReadLimits.DEFAULT, new PrintWriter(System.err, true));
        double startUp = seconds(t0);
        Dataset<Row> input = DataFiles.read(session, data.toString());
        t0 = System.nanoTime();
        input.foreachPartition((ForeachPartitionFunction<Row>) it -> it.forEachRemaining(r -> { }));
        double reading = seconds(t0);
        Dataset<Row> scored = CircuitScorer.of(model).requireAllVariables(false).score(input);
        t0 = System.nanoTime();
        scored.foreachPartition((ForeachPartitionFunction<Row>) it -> it.forEachRemaining(r -> { }));
        double readEval = seconds(t0);
        Path phaseOut = dir.resolve("bench-spark-phases");
        delete(phaseOut);
        t0 = System.nanoTime();
        ScoredOutput.write(scored, 1, phaseOut.toString(), false);
        double all = seconds(t0);
        session.stop();
        double evaluation = Math.max(0, readEval - reading);
        double writing = Math.max(0, all - readEval);

        System.out.printf(Locale.ROOT, "circa eval (1 thread)          %8.1f s  %10.0f rows/s%n", eval, rows / eval);
        System.out.printf(Locale.ROOT, "circa-spark score (local[2])   %8.1f s  %10.0f rows/s%n", spark, rows / spark);
        System.out.printf(Locale.ROOT, "ratio spark / eval (rows/s)    %8.2f%n", eval / spark);
        System.out.printf(Locale.ROOT, "spark phases (a second, warm session): start-up %.1f s, reading %.1f s, "
                + "evaluation %.1f s, writing %.1f s (sum %.1f s)%n", startUp, reading, evaluation, writing,
                startUp + reading + evaluation + writing);
        System.out.printf(Locale.ROOT, "outputs equal: yes (%d rows)%n", rows);
    }

    private static Path rowsFile(Path dir, long rows) throws IOException {
        Path file = dir.resolve("data-" + rows + ".csv");
        if (Files.exists(file)) {
            return file;
        }
        List<String> source = Files.readAllLines(dir.resolve("data.csv"));
        Path tmp = dir.resolve("data-" + rows + ".csv.tmp");
        try (BufferedWriter w = Files.newBufferedWriter(tmp)) {
            w.write(source.get(0));
            w.write('\n');
            for (long r = 0; r < rows; r++) {
                w.write(source.get(1 + (int) (r % (source.size() - 1))));
                w.write('\n');
            }
        }
        return Files.move(tmp, file);
    }

    /** Whether the part files, headers dropped, hold eval's rows in the same order. */
    private static boolean sameRows(Path evalOut, Path folder) throws IOException {
        List<Path> parts;
        try (Stream<Path> s = Files.list(folder)) {
            parts = s.filter(p -> p.getFileName().toString().startsWith("part-")).sorted().toList();
        }
        try (BufferedReader e = Files.newBufferedReader(evalOut)) {
            e.readLine();
            for (Path p : parts) {
                try (BufferedReader r = Files.newBufferedReader(p)) {
                    r.readLine();
                    String line;
                    while ((line = r.readLine()) != null) {
                        if (!line.equals(e.readLine())) {
                            return false;
                        }
                    }
                }
            }
            return e.readLine() == null;
        }
    }

    private static void delete(Path p) throws IOException {
        if (Files.exists(p)) {
            try (Stream<Path> s = Files.walk(p)) {
                List<Path> all = new ArrayList<>(s.sorted(Comparator.reverseOrder()).toList());
                for (Path q : all) {
                    Files.delete(q);
                }
            }
        }
    }

    private static void check(boolean ok, String what) {
        if (!ok) {
            throw new IllegalStateException(what);
        }
    }

    private static double seconds(long t0) {
        return (System.nanoTime() - t0) / 1e9;
    }
}
