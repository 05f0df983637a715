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
 * parse|numbers|validate|schema|phases|warm FILE} ({@code phases}: validate with the read and the rules timed apart;
 * {@code warm}: parse, parse+num and validate repeated in this JVM, best of {@code -Dwarm=5} each, and their ratios).
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
            case "warm" -> outcome = warm(file, Integer.getInteger("warm", 5));
            default -> throw new IllegalArgumentException("unknown step " + step);
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        double cpu = ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime() / 1e9;
        System.out.printf(Locale.ROOT, "%s %.3f %.3f %.0f %.0f %.0f %s%n", step, seconds, cpu, ScaleTable.peaks() / 1048576.0,
                LIVE_PEAK.get() / 1048576.0, peakRss() / 1024.0, outcome);
    }

    /**
     * The same steps repeated in this JVM, the best of {@code reps} each once the code is compiled: a
     * view of the work itself, steadier than one fresh JVM on a busy machine (JIT warm-up and scheduling
     * weigh less). Returns {@code parse=..,num=..,read=..,rules=..,val/parse=..,val/num=..}.
     */
    private static String warm(Path file, int reps) throws Exception {
        double parse = Double.MAX_VALUE;
        double num = Double.MAX_VALUE;
        double read = Double.MAX_VALUE;
        double rules = Double.MAX_VALUE;
        double both = Double.MAX_VALUE;
        Validator v = new Validator(ValidationOptions.defaults());
        for (int i = 0; i < reps; i++) {
            long t0 = System.nanoTime();
            ValidateScale.parse(file);
            long t1 = System.nanoTime();
            ValidateScale.parseNumbers(file);
            long t2 = System.nanoTime();
            dev.circa.format.CircuitDocument doc = new dev.circa.format.io.CircuitReader().read(file);
            long t3 = System.nanoTime();
            if (!v.validate(doc).valid()) {
                return "NOT-valid";
            }
            long t4 = System.nanoTime();
            // not held through the next read (two 10^7-edge documents do not fit in 512m together)
            doc = null;
            parse = Math.min(parse, (t1 - t0) / 1e9);
            num = Math.min(num, (t2 - t1) / 1e9);
            read = Math.min(read, (t3 - t2) / 1e9);
            rules = Math.min(rules, (t4 - t3) / 1e9);
            both = Math.min(both, (t4 - t2) / 1e9);
        }
        return String.format(Locale.ROOT, "parse=%.3f,num=%.3f,read=%.3f,rules=%.3f,val/parse=%.2f,val/num=%.2f",
                parse, num, read, rules, both / parse, both / num);
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
