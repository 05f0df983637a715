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
 * line: {@code STEP SECONDS PEAK_HEAP_MIB PEAK_RSS_MIB OUTCOME}, where seconds is the step alone
 * inside this JVM, peak heap the sum of the heap pools' peaks (an upper bound of the live heap at
 * any moment) and peak RSS the process's high-water mark ({@code VmHWM}, Linux).
 *
 * <p>Run: {@code java -Xmx512m -cp bench/target/benchmarks.jar dev.circa.bench.ValidateRun
 * parse|numbers|validate|schema FILE}.
 */
public final class ValidateRun {
    private ValidateRun() {
    }

    public static void main(String[] args) throws Exception {
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
            default -> throw new IllegalArgumentException("unknown step " + step);
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        System.out.printf(Locale.ROOT, "%s %.3f %.0f %.0f %s%n", step, seconds, peakHeap() / 1048576.0,
                peakRss() / 1024.0, outcome);
    }

    private static long peakHeap() {
        long sum = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                sum += pool.getPeakUsage().getUsed();
            }
        }
        return sum;
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
