package dev.circa.bench;

import dev.circa.format.io.ReadLimits;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * One step of {@link ValidateScale} in a JVM of its own, so that the parent can time the whole
 * process (start-up included) and the heap limit it runs under is the one being judged. Prints one
 * line: {@code STEP SECONDS CPU_SECONDS PEAK_HEAP_MIB LIVE_PEAK_MIB PEAK_RSS_MIB OUTCOME}, where seconds
 * is the step alone inside this JVM, CPU seconds the whole process's (every thread, start-up included),
 * peak heap the sum of the heap pools' peaks (garbage included: an upper bound), live peak the
 * largest heap occupancy right after a collection, and peak RSS the process's high-water mark
 * ({@code VmHWM}, Linux).
 *
 * <p>Run: {@code java -Xmx512m -cp bench/target/benchmarks.jar dev.circa.bench.ValidateRun
 * parse|numbers|validate|schema|phases FILE} ({@code phases}: validate with the read and the rules timed apart).
 */
public final class ValidateRun {
    private ValidateRun() {
    }

    public static void main(String[] args) throws Exception {
        watchCollections();
        String step = args[0];
        Path file = Path.of(args[1]);
        long t0 = System.nanoTime();
        String outcome;
        switch (step) {
            case "parse" -> outcome = ValidateScale.parse(file) + " tokens";
            case "numbers" -> outcome = "checksum " + ValidateScale.parseNumbers(file);
            case "validate", "schema" -> {
                Validator v = new Validator(ValidationOptions.defaults(),
                        step.equals("schema") ? SchemaCheck.BUNDLED : SchemaCheck.NONE);
                ValidationReport r = v.validate(file, ReadLimits.DEFAULT);
                outcome = r.valid() ? "valid" : "NOT-valid:" + r.diagnostics().size();
            }
            case "phases" -> {
                // the same validation with its two phases timed apart: read, then every rule on the document
                dev.circa.format.CircuitDocument doc = new dev.circa.format.io.CircuitReader().read(file);
                double read = (System.nanoTime() - t0) / 1e9;
                long t1 = System.nanoTime();
                ValidationReport r = new Validator(ValidationOptions.defaults()).validate(doc);
                outcome = String.format(Locale.ROOT, "read=%.3f,rules=%.3f,%s", read, (System.nanoTime() - t1) / 1e9,
                        r.valid() ? "valid" : "NOT-valid");
            }
            default -> throw new IllegalArgumentException("unknown step " + step);
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        double cpu = ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime() / 1e9;
        System.out.printf(Locale.ROOT, "%s %.3f %.3f %.0f %.0f %.0f %s%n", step, seconds, cpu, ScaleTable.peaks() / 1048576.0,
                LIVE_PEAK.get() / 1048576.0, peakRss() / 1024.0, outcome);
    }

    /** The largest heap occupancy seen right after a collection: the live data at its peak, garbage excluded. */
    private static final java.util.concurrent.atomic.AtomicLong LIVE_PEAK = new java.util.concurrent.atomic.AtomicLong();

    private static void watchCollections() {
        java.util.Set<String> heap = new java.util.HashSet<>();
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                heap.add(pool.getName());
            }
        }
        for (java.lang.management.GarbageCollectorMXBean gc : ManagementFactory.getGarbageCollectorMXBeans()) {
            ((javax.management.NotificationEmitter) gc).addNotificationListener((n, hb) -> {
                if (!n.getType().equals(com.sun.management.GarbageCollectionNotificationInfo.GARBAGE_COLLECTION_NOTIFICATION)) {
                    return;
                }
                com.sun.management.GarbageCollectionNotificationInfo info = com.sun.management.GarbageCollectionNotificationInfo
                        .from((javax.management.openmbean.CompositeData) n.getUserData());
                long used = 0;
                for (java.util.Map.Entry<String, java.lang.management.MemoryUsage> e
                        : info.getGcInfo().getMemoryUsageAfterGc().entrySet()) {
                    used += heap.contains(e.getKey()) ? e.getValue().getUsed() : 0;
                }
                LIVE_PEAK.accumulateAndGet(used, Math::max);
            }, null, null);
        }
    }

    /** The resident-set high-water mark in KiB, or 0 where /proc is absent. */
    private static long peakRss() throws IOException {
        Path status = Path.of("/proc/self/status");
        if (!Files.isReadable(status)) {
            return 0;
        }
        for (String line : Files.readAllLines(status)) {
            if (line.startsWith("VmHWM:")) {
                return Long.parseLong(line.replaceAll("[^0-9]", ""));
            }
        }
        return 0;
    }
}
