package dev.circa.bench;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.format.schema.SchemaViolation;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryMXBean;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Measures reading a 1,000,000-node circuit file: generates it (seeded) into a temporary folder, reads
 * it with {@link CircuitReader} three times, and prints for each read the wall time, then the file
 * size and the heap: used after a forced GC before the read (baseline), the highest used heap seen
 * during the read (sampled every 2 ms, garbage included), the sum of the heap pools' peaks (an upper
 * bound), and the heap retained by the document after a forced GC. Last, the time of a streaming
 * schema validation of the same file ({@link SchemaCatalog#validateCircuit}).
 *
 * <p>Run from the repository root (Java 17), one command:
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx1g -cp bench/target/benchmarks.jar dev.circa.bench.ReadScale [NODES] [SEED]
 * </pre>
 */
public final class ReadScale {
    private ReadScale() {
    }

    public static void main(String[] args) throws Exception {
        int nodes = args.length > 0 ? Integer.parseInt(args[0]) : 1_000_000;
        long seed = args.length > 1 ? Long.parseLong(args[1]) : 20261201L;
        Path dir = Files.createTempDirectory("circa-read-scale");
        Path file = dir.resolve("synthetic-" + nodes + ".json");
        try {
            long t0 = System.nanoTime();
            long edges = CircuitFileGenerator.write(file, nodes, seed);
            System.out.printf(Locale.ROOT, "generated %,d nodes, %,d edges, %s in %.2f s (seed %d)%n", nodes, edges,
                    CircuitFileGenerator.mib(Files.size(file)), (System.nanoTime() - t0) / 1e9, seed);
            System.out.printf(Locale.ROOT, "max heap %s%n", CircuitFileGenerator.mib(Runtime.getRuntime().maxMemory()));
            CircuitReader reader = new CircuitReader();
            for (int run = 1; run <= 3; run++) {
                measure(reader, file, run, nodes);
            }
            long t1 = System.nanoTime();
            List<SchemaViolation> violations = SchemaCatalog.get().validateCircuit(file, ReadLimits.DEFAULT);
            System.out.printf(Locale.ROOT, "schema validation, streaming one node at a time: %.2f s, %d violations%n",
                    (System.nanoTime() - t1) / 1e9, violations.size());
        } finally {
            Files.deleteIfExists(file);
            Files.deleteIfExists(dir);
        }
    }

    private static void measure(CircuitReader reader, Path file, int run, int nodes) throws Exception {
        MemoryMXBean memory = ManagementFactory.getMemoryMXBean();
        long baseline = usedAfterGc(memory);
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                pool.resetPeakUsage();
            }
        }
        AtomicLong sampledPeak = new AtomicLong();
        AtomicBoolean done = new AtomicBoolean();
        Thread sampler = new Thread(() -> {
            while (!done.get()) {
                sampledPeak.accumulateAndGet(memory.getHeapMemoryUsage().getUsed(), Math::max);
                try {
                    Thread.sleep(2);
                } catch (InterruptedException e) {
                    return;
                }
            }
        }, "heap-sampler");
        sampler.setDaemon(true);
        sampler.start();
        long t0 = System.nanoTime();
        CircuitDocument doc = reader.read(file);
        double seconds = (System.nanoTime() - t0) / 1e9;
        done.set(true);
        sampler.join();
        long poolPeaks = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                poolPeaks += pool.getPeakUsage().getUsed();
            }
        }
        long retained = usedAfterGc(memory) - baseline;
        if (doc.nodes().size() != nodes) {
            throw new IllegalStateException("read " + doc.nodes().size() + " nodes, expected " + nodes);
        }
        System.out.printf(Locale.ROOT,
                "read %d: %.2f s, %,d nodes, %,d edges, file %s; heap: baseline %s, sampled peak %s, pool peaks %s,"
                        + " retained by the document %s%n",
                run, seconds, doc.nodes().size(), doc.edgeCount(), CircuitFileGenerator.mib(Files.size(file)),
                CircuitFileGenerator.mib(baseline), CircuitFileGenerator.mib(sampledPeak.get()),
                CircuitFileGenerator.mib(poolPeaks), CircuitFileGenerator.mib(retained));
    }

    private static long usedAfterGc(MemoryMXBean memory) throws InterruptedException {
        for (int i = 0; i < 3; i++) {
            System.gc();
            Thread.sleep(50);
        }
        return memory.getHeapMemoryUsage().getUsed();
    }
}
