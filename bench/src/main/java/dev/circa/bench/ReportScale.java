package dev.circa.bench;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.ExactMarginals;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.ReadLimits;
import dev.circa.report.ModelReport;
import dev.circa.report.ReportOptions;
import dev.circa.report.ReportSource;
import dev.circa.report.VariablePairs;
import java.io.BufferedWriter;
import java.io.Writer;
import java.lang.management.ManagementFactory;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * The model report of a region-graph circuit of about 10^6 edges (the seeded pump-station workload of
 * {@link RegionGraphWorkload}, 60 variables): every variable's exact marginal and 2 pairs, as {@code circa
 * report} writes it (read, compile, hash, validate, marginals, pairs, structure, page). Prints the time of each
 * phase, the whole and the process CPU time (a machine shared with other work slows the wall time, not
 * the CPU time); the target is under 30 s on 2 cores. Not a test.
 *
 * <p>Run from the repository root (Java 17):
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx3g -cp bench/target/benchmarks.jar dev.circa.bench.ReportScale [EDGES]
 * </pre>
 */
public final class ReportScale {
    private ReportScale() {
    }

    public static void main(String[] args) throws Exception {
        long edges = args.length > 0 ? Long.parseLong(args[0]) : 1_000_000;
        Path dir = Files.createTempDirectory("circa-report-bench");
        Path model = dir.resolve("model.json");
        Path page = dir.resolve("model.report.html");
        new CircuitWriter().write(RegionGraphWorkload.build(RegionGraphWorkload.repetitionsFor(edges), 11), model);

        long cpu0 = cpuNanos();
        long t0 = System.nanoTime();
        long c0 = threadCpu();
        CircuitDocument doc = new CircuitReader(ReadLimits.DEFAULT).read(model);
        CompiledCircuit circuit = CompiledCircuit.compile(doc);
        long t1 = System.nanoTime();
        long c1 = threadCpu();
        ReportSource src = ReportSource.of(model, doc, circuit);
        long t2 = System.nanoTime();
        long c2 = threadCpu();
        ExactMarginals.of(circuit);
        long t3 = System.nanoTime();
        long c3 = threadCpu();
        String pairs = circuit.variables().get(0).name() + ":" + circuit.variables().get(1).name() + ","
                + circuit.variables().get(2).name() + ":" + circuit.variables().get(5).name();
        ReportOptions options = ReportOptions.defaults("circa bench").withPairs(VariablePairs.parse(pairs, doc.variables()));
        try (Writer w = new BufferedWriter(Files.newBufferedWriter(page, StandardCharsets.UTF_8), 1 << 16)) {
            ModelReport.write(src, options, w);
        }
        long t4 = System.nanoTime();
        long c4 = threadCpu();
        long cpu = cpuNanos() - cpu0;
        System.out.printf(Locale.ROOT, "report of %,d edges, %d nodes, %d variables, %d pairs; load average %.1f on %d cores%n",
                circuit.edgeCount(), circuit.nodeCount(), circuit.variableCount(), options.pairs().size(),
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage(),
                Runtime.getRuntime().availableProcessors());
        System.out.printf(Locale.ROOT, "  read + compile            %8.2f s  (CPU %.2f s)%n", (t1 - t0) / 1e9, (c1 - c0) / 1e9);
        System.out.printf(Locale.ROOT, "  hash + validate           %8.2f s  (CPU %.2f s)%n", (t2 - t1) / 1e9, (c2 - c1) / 1e9);
        System.out.printf(Locale.ROOT, "  exact marginals (2 passes)%8.3f s  (CPU %.3f s)%n", (t3 - t2) / 1e9, (c3 - c2) / 1e9);
        System.out.printf(Locale.ROOT, "  page (all sections)       %8.2f s  (CPU %.2f s, %,d bytes)%n", (t4 - t3) / 1e9, (c4 - c3) / 1e9,
                Files.size(page));
        System.out.printf(Locale.ROOT, "  total                     %8.2f s  (CPU %.2f s on the main thread; target < 30 s on 2 cores)%n",
                (t4 - t0) / 1e9, (c4 - c0) / 1e9);
        System.out.printf(Locale.ROOT, "  process CPU time          %8.2f s  (all threads, the garbage collector included; "
                + "the report runs on one thread, so an idle machine takes about the main thread's CPU time)%n", cpu / 1e9);
        Files.delete(page);
        Files.delete(model);
        Files.delete(dir);
    }

    private static long threadCpu() {
        return ManagementFactory.getThreadMXBean().getCurrentThreadCpuTime();
    }

    private static long cpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean()).getProcessCpuTime();
    }
}
