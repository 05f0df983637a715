package dev.circa.bench;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.DenseBlockSummary;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.results.Result;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.ChainedOptionsBuilder;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;
import org.openjdk.jmh.runner.options.VerboseMode;
import tools.jackson.core.JsonToken;

/**
 * The scale table of bench/run: for region-graph circuits of about 10^5, 10^6 and 10^7 edges
 * ({@link RegionGraphWorkload}), times the file steps in this JVM (write, bare streaming parse, validation
 * by {@link Validator} beside it, streaming schema validation, read, compile, dense-block analysis; peak
 * heap of read + compile + one evaluation)
 * and runs {@link EvaluationBenchmark} with JMH (one fork per measurement, 2 warm-up and 3 measured
 * iterations of 1 s) for log-density throughput at batch 1, 64 and 1024 on 1 and 2 threads on both paths,
 * marginals and conditionals relative to density, sampling and batch-1 latency. Prints one table. To stay
 * within 15 minutes on 2 cores, circuits of {@value #LARGE} edges or more get 2 measured iterations
 * (a call can take several seconds there, so an iteration may hold one call), no generic run at batch 1024 (about a minute per call), queries and sampling at batch 64.
 * Validation beside the bare parse (which decodes every number) is timed in this JVM; {@link ValidateScale}
 * (run by bench/run after this table) times it in JVMs of its own under -Xmx512m, start-up taken out.
 *
 * <p>Run: {@code bench/run} (or {@code java -cp bench/target/benchmarks.jar dev.circa.bench.ScaleTable
 * [EDGES...]}).
 */
public final class ScaleTable {
    private static final int[] BATCHES = {1, 64, 1024};
    /** From this size on, fewer iterations, no generic batch of 1024 and queries at batch 64 (time budget). */
    private static final long LARGE = 5_000_000;
    private final List<String> columns = new ArrayList<>();
    private final Map<String, List<String>> rows = new LinkedHashMap<>();
    private final Map<String, String> notes = new LinkedHashMap<>();
    private int trials;

    private ScaleTable() {
    }

    public static void main(String[] args) throws Exception {
        long[] sizes = args.length == 0 ? new long[] {100_000, 1_000_000, 10_000_000} : new long[args.length];
        for (int i = 0; i < args.length; i++) {
            sizes[i] = Long.parseLong(args[i].replace("_", ""));
        }
        ScaleTable t = new ScaleTable();
        long t0 = System.nanoTime();
        for (long edges : sizes) {
            t.measure(edges);
        }
        t.print(sizes, (System.nanoTime() - t0) / 1e9);
    }

    private void measure(long edges) throws Exception {
        String col = String.format(Locale.ROOT, "10^%d", Math.round(Math.log10(edges)));
        columns.add(col);
        int reps = RegionGraphWorkload.repetitionsFor(edges);
        Path dir = Files.createTempDirectory("circa-scale");
        Path file = dir.resolve("region-graph.json");
        progress("%s: generating %d region trees", col, reps);
        try {
            long t = System.nanoTime();
            CircuitDocument generated = RegionGraphWorkload.build(reps, EvaluationBenchmark.CIRCUIT_SEED);
            put("generate in memory (s)", seconds(t));
            t = System.nanoTime();
            new CircuitWriter().write(generated, file);
            put("write (s)", seconds(t));
            put("file size (MiB)", String.format(Locale.ROOT, "%.0f", Files.size(file) / 1048576.0));
            generated = null;
            gc();
            t = System.nanoTime();
            long tokens = bareParse(file);
            double parseSeconds = (System.nanoTime() - t) / 1e9;
            put("bare streaming parse (s)", String.format(Locale.ROOT, "%.2f", parseSeconds));
            gc();
            t = System.nanoTime();
            ValidationReport report = new Validator(ValidationOptions.defaults()).validate(file);
            double validateSeconds = (System.nanoTime() - t) / 1e9;
            put("validate: read + every rule (s)", String.format(Locale.ROOT, "%.2f", validateSeconds)
                    + (report.valid() ? ", valid" : ", NOT valid: " + report.count(Severity.ERROR) + " errors"));
            put("validate / bare parse (this JVM; ValidateScale: own JVMs, -Xmx512m)",
                    String.format(Locale.ROOT, "%.2f", validateSeconds / parseSeconds));
            report = null;
            gc();
            t = System.nanoTime();
            int violations = SchemaCatalog.get().validateCircuit(file, ReadLimits.DEFAULT).size();
            put("schema validation, streaming (s)", seconds(t) + (violations == 0 ? "" : " (" + violations + " violations)"));
            long baseline = gc();
            resetPeaks();
            t = System.nanoTime();
            CircuitDocument doc = new CircuitReader().read(file);
            put("read (s)", seconds(t));
            t = System.nanoTime();
            CompiledCircuit circuit = CompiledCircuit.compile(doc);
            put("compile (s)", seconds(t));
            t = System.nanoTime();
            DenseBlockSummary dense = circuit.denseBlockSummary();
            put("dense-block analysis (s)", seconds(t));
            double[] data = RegionGraphWorkload.rows(1024, 0, EvaluationBenchmark.DATA_SEED);
            double[] out = new double[1024];
            new Evaluator(circuit).logDensity(data, 1024, out);
            long peak = peaks();
            put("peak heap: read + compile + 1024 rows (MiB)", String.format(Locale.ROOT, "%.0f", (peak - baseline) / 1048576.0));
            put("nodes", String.format(Locale.ROOT, "%,d", circuit.nodeCount()));
            put("edges", String.format(Locale.ROOT, "%,d", circuit.edgeCount()));
            put("JSON tokens", String.format(Locale.ROOT, "%,d", tokens));
            put("dense blocks (edges inside)", String.format(Locale.ROOT, "%,d (%.1f%%)", dense.blocks(),
                    100.0 * dense.edges() / circuit.edgeCount()));
            long edgeCount = circuit.edgeCount();
            doc = null;
            circuit = null;
            gc();
            throughput(col, edges, edgeCount);
            queries(edges);
            sampling(edges);
            latency(edges);
        } finally {
            Files.deleteIfExists(file);
            Files.deleteIfExists(dir);
        }
    }

    private void throughput(String col, long edges, long edgeCount) throws Exception {
        for (String path : new String[] {"GENERIC", "AUTOMATIC"}) {
            for (int batch : BATCHES) {
                for (int threads = 1; threads <= 2; threads++) {
                    // batch 1 cannot be split: two threads are two callers, one evaluator each
                    int split = batch == 1 ? 1 : threads;
                    int callers = batch == 1 ? threads : 1;
                    if (edges >= LARGE && batch == 1024 && path.equals("GENERIC")) {
                        put(label(path, batch, threads), "not run (~1 min/call)");
                        continue;
                    }
                    double ops = jmh("evaluate", edges, batch, path, "density", split, callers, Mode.Throughput).getScore();
                    put(label(path, batch, threads), sci(ops * batch * edgeCount));
                    rate.put(path + batch + "/" + threads, ops);
                    last.put(path + batch + "/" + threads, ops);
                }
            }
        }
        for (int batch : BATCHES) {
            for (int threads = 1; threads <= 2; threads++) {
                Double g = rate.get("GENERIC" + batch + "/" + threads);
                Double a = rate.get("AUTOMATIC" + batch + "/" + threads);
                put(String.format(Locale.ROOT, "fast / generic, batch %d, %d thread%s", batch, threads, threads == 1 ? "" : "s"),
                        g == null || a == null ? "" : String.format(Locale.ROOT, "%.1fx", a / g));
            }
        }
        rate.clear();
        if (edges == 1_000_000) {
            double ratio = last.get("AUTOMATIC1024/1") / last.get("GENERIC1024/1");
            notes.put("fast / generic, batch 1024, 1 thread", String.format(Locale.ROOT, "target >= 5x at 10^6: %.1fx %s",
                    ratio, ratio >= 5 ? "MET" : "NOT MET"));
        }
    }

    private final Map<String, Double> rate = new LinkedHashMap<>();
    private final Map<String, Double> last = new LinkedHashMap<>();

    private void queries(long edges) throws Exception {
        int batch = edges >= LARGE ? 64 : 1024;
        double density = last.get("AUTOMATIC" + batch + "/1");
        double marginal = jmh("evaluate", edges, batch, "AUTOMATIC", "marginal", 1, 1, Mode.Throughput).getScore();
        double conditional = jmh("evaluate", edges, batch, "AUTOMATIC", "conditional", 1, 1, Mode.Throughput).getScore();
        String at = batch == 1024 ? "" : " (batch " + batch + ")";
        put("marginal (half the cells missing) / density, time, batch 1024", String.format(Locale.ROOT, "%.2f", density / marginal) + at);
        put("conditional (given half the variables) / density, time, batch 1024",
                String.format(Locale.ROOT, "%.2f", density / conditional) + at);
        if (edges == 1_000_000) {
            double r = density / marginal;
            notes.put("marginal (half the cells missing) / density, time, batch 1024",
                    String.format(Locale.ROOT, "target <= 1.2 at 10^6: %.2f %s", r, r <= 1.2 ? "MET" : "NOT MET"));
            notes.put("conditional (given half the variables) / density, time, batch 1024", "rule of thumb: about 2 (two passes)");
        }
    }

    private void sampling(long edges) throws Exception {
        int batch = edges >= LARGE ? 64 : 1024;
        double ops = jmh("sample", edges, batch, "AUTOMATIC", "density", 1, 1, Mode.Throughput).getScore();
        put("sampling (rows/s, 1 thread)", sci(ops * batch));
    }

    private void latency(long edges) throws Exception {
        for (String path : new String[] {"GENERIC", "AUTOMATIC"}) {
            Result<?> r = jmh("evaluate", edges, 1, path, "density", 1, 1, Mode.SampleTime);
            double p50 = r.getStatistics().getPercentile(50);
            double p99 = r.getStatistics().getPercentile(99);
            put("latency per record, batch 1, " + (path.equals("GENERIC") ? "generic" : "fast") + " (p50 / p99 us)",
                    String.format(Locale.ROOT, "%s / %s", fixed(p50), fixed(p99)));
        }
    }

    private Result<?> jmh(String method, long edges, int batch, String path, String query, int split, int callers, Mode mode)
            throws Exception {
        trials++;
        progress("  JMH %d: %s edges=%d batch=%d path=%s query=%s split=%d callers=%d %s", trials, method, edges, batch, path,
                query, split, callers, mode);
        ChainedOptionsBuilder o = new OptionsBuilder()
                .include(EvaluationBenchmark.class.getName() + "." + method + "$")
                .param("edges", Long.toString(edges))
                .param("batch", Integer.toString(batch))
                .param("path", path)
                .param("query", query)
                .param("split", Integer.toString(split))
                .threads(callers)
                .forks(1)
                .warmupIterations(2).warmupTime(TimeValue.seconds(1))
                .measurementIterations(edges >= LARGE ? 2 : 3).measurementTime(TimeValue.seconds(1))
                .mode(mode)
                .timeUnit(mode == Mode.SampleTime ? java.util.concurrent.TimeUnit.MICROSECONDS : java.util.concurrent.TimeUnit.SECONDS)
                .verbosity(VerboseMode.SILENT)
                .shouldFailOnError(true);
        Collection<RunResult> results = new Runner(o.build()).run();
        if (results.isEmpty()) {
            throw new IllegalStateException("JMH returned no result for " + method);
        }
        return results.iterator().next().getPrimaryResult();
    }

    private static long bareParse(Path file) throws Exception {
        long tokens = 0;
        double sink = 0;
        try (JsonInput in = JsonInput.openJson(file, ReadLimits.DEFAULT)) {
            JsonToken tok;
            while ((tok = in.next()) != null) {
                tokens++;
                if (tok == JsonToken.VALUE_NUMBER_FLOAT || tok == JsonToken.VALUE_NUMBER_INT) {
                    sink += in.parser().getDoubleValue();
                }
            }
        }
        return sink == Double.MIN_VALUE ? -tokens : tokens;
    }

    private static String label(String path, int batch, int threads) {
        return String.format(Locale.ROOT, "log-density, %s, batch %d, %d thread%s (edge evals/s)",
                path.equals("GENERIC") ? "generic" : "fast", batch, threads, threads == 1 ? "" : "s");
    }

    private void put(String row, String value) {
        progress("%s %s: %s", columns.get(columns.size() - 1), row, value);
        rows.computeIfAbsent(row, k -> new ArrayList<>());
        List<String> r = rows.get(row);
        while (r.size() < columns.size() - 1) {
            r.add("");
        }
        r.add(value);
    }

    private void print(long[] sizes, double total) {
        int w0 = 10;
        for (String k : rows.keySet()) {
            w0 = Math.max(w0, k.length());
        }
        int w = 22;
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "%-" + w0 + "s", "circa scale table: region-graph circuits (depth "
                + RegionGraphWorkload.DEPTH + " trees, K " + RegionGraphWorkload.K + ", I " + RegionGraphWorkload.I + ")"));
        sb.append('\n');
        sb.append(String.format(Locale.ROOT, "%-" + w0 + "s", "edges (target)"));
        for (String c : columns) {
            sb.append(" | ").append(String.format(Locale.ROOT, "%-" + w + "s", c));
        }
        sb.append(" | target / note\n");
        sb.append("-".repeat(w0 + columns.size() * (w + 3) + 16)).append('\n');
        for (Map.Entry<String, List<String>> e : rows.entrySet()) {
            sb.append(String.format(Locale.ROOT, "%-" + w0 + "s", e.getKey()));
            for (int i = 0; i < columns.size(); i++) {
                String v = i < e.getValue().size() ? e.getValue().get(i) : "";
                sb.append(" | ").append(String.format(Locale.ROOT, "%-" + w + "s", v));
            }
            sb.append(" | ").append(notes.getOrDefault(e.getKey(), "")).append('\n');
        }
        sb.append(String.format(Locale.ROOT, "%d JMH measurements, total %.0f s; %d processors; %s%n", trials, total,
                Runtime.getRuntime().availableProcessors(), System.getProperty("java.vm.name") + " "
                        + System.getProperty("java.version")));
        System.out.print(sb);
    }

    private static String seconds(long t0) {
        return String.format(Locale.ROOT, "%.2f", (System.nanoTime() - t0) / 1e9);
    }

    private static String sci(double v) {
        return String.format(Locale.ROOT, "%.2e", v);
    }

    private static String fixed(double v) {
        return String.format(Locale.ROOT, v < 10 ? "%.2f" : v < 1000 ? "%.1f" : "%.0f", v);
    }

    private static void progress(String format, Object... args) {
        System.err.printf(Locale.ROOT, format + "%n", args);
    }

    private static long gc() throws InterruptedException {
        for (int i = 0; i < 3; i++) {
            System.gc();
            Thread.sleep(50);
        }
        return ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed();
    }

    private static void resetPeaks() {
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                pool.resetPeakUsage();
            }
        }
    }

    /** The sum of the heap pools' peak usage since their last reset (garbage included). */
    static long peaks() {
        long sum = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                sum += pool.getPeakUsage().getUsed();
            }
        }
        return sum;
    }
}
