package dev.circa.bench;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.RandomRegions;
import dev.circa.converter.regions.ParameterSource;
import dev.circa.converter.regions.RegionConverter;
import dev.circa.converter.regions.RegionVerifier;
import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.SumNode;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.regions.RegionGraph;
import java.io.BufferedOutputStream;
import java.io.OutputStream;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import tools.jackson.core.JsonGenerator;

/**
 * Compiles a random region graph into a circuit of about 10^7 edges and writes it, reporting time
 * and peak heap, beside a bare streaming Jackson write of as many numbers in the same run; also
 * times the engine's compile, a short verification against the region-by-region evaluation and the
 * validation, all done by one {@link RegionConverter} call as {@code circa convert} does. Not a
 * test; one run, one line per phase on standard output.
 *
 * <p>Run from the repository root (Java 17), one command:
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx4g -cp bench/target/benchmarks.jar dev.circa.bench.CompileScale [VARS DEPTH REPEATS SUMS INPUTS VERIFY_POINTS]
 * </pre>
 * Defaults 256 6 15 24 24 10 (a random region graph, seed 1; parameters seed 7): about 10^7 edges.
 */
public final class CompileScale {
    private CompileScale() {
    }

    public static void main(String[] args) throws Exception {
        int vars = args.length > 0 ? Integer.parseInt(args[0]) : 256;
        int depth = args.length > 1 ? Integer.parseInt(args[1]) : 6;
        int repeats = args.length > 2 ? Integer.parseInt(args[2]) : 15;
        int sums = args.length > 3 ? Integer.parseInt(args[3]) : 24;
        int inputs = args.length > 4 ? Integer.parseInt(args[4]) : 24;
        // points sampled for the verification phase (3N + 1 rows, each about one pass over the edges per side)
        int verifyPoints = args.length > 5 ? Integer.parseInt(args[5]) : 10;
        Path dir = Files.createTempDirectory("circa-bench");
        Path circuitFile = dir.resolve("compiled.json");
        Path bareFile = dir.resolve("bare.json");

        RegionGraph g = RandomRegions.generate(RandomRegions.realVariables(vars), depth, repeats, 1);
        resetPeaks();
        RegionConverter.Result converted = RegionConverter.convert(g, new CompileOptions(sums, inputs, 1, Map.of()),
                ParameterSource.seed(7), new RegionConverter.Verification(verifyPoints, 3, 1e-9, 1e-9), ReadLimits.DEFAULT);
        long peakConvert = peakHeap();
        CircuitDocument doc = converted.circuit();
        RegionVerifier.Result verified = converted.verification();
        long compileNanos = converted.nanos()[0];
        long verifyNanos = converted.nanos()[1];
        long validateNanos = converted.nanos()[2];
        boolean valid = converted.validation().valid();
        converted = null;
        resetPeaks();
        long t1 = System.nanoTime();
        new CircuitWriter().write(doc, circuitFile);
        long t2 = System.nanoTime();
        long peakWrite = peakHeap();
        long edges = doc.edgeCount();
        long numbers = 0;
        for (Node n : doc.nodes()) {
            numbers += n.children().length;
            if (n instanceof SumNode s) {
                numbers += s.weights().length;
            } else if (n instanceof InputNode in) {
                numbers += in.params().length + 1;
            }
        }
        int nodes = doc.nodes().size();
        long circuitBytes = Files.size(circuitFile);
        doc = null;
        System.gc();

        resetPeaks();
        long t3 = System.nanoTime();
        bareWrite(bareFile, numbers);
        long t4 = System.nanoTime();
        long peakBare = peakHeap();
        long bareBytes = Files.size(bareFile);

        double compileS = compileNanos / 1e9;
        double writeS = (t2 - t1) / 1e9;
        double bareS = (t4 - t3) / 1e9;
        System.out.printf(Locale.ROOT, "graph: %d variables, depth %d, repeats %d, %d regions, %d partitions; K=%d I=%d C=1%n",
                vars, depth, repeats, g.regions().size(), g.partitions().size(), sums, inputs);
        System.out.printf(Locale.ROOT, "circuit: %d nodes, %d edges, %d numbers, %d bytes%n", nodes, edges, numbers,
                circuitBytes);
        System.out.printf(Locale.ROOT, "compile %.2f s + write %.2f s = %.2f s, peak heap %d MiB converting"
                + " (compile, verify, validate), %d MiB writing%n", compileS, writeS, compileS + writeS,
                peakConvert >> 20, peakWrite >> 20);
        System.out.printf(Locale.ROOT, "engine compile + verify on %d rows: %.2f s; %s%n",
                verified.points(), verifyNanos / 1e9, verified.summary());
        System.out.printf(Locale.ROOT, "validate the compiled circuit: %.2f s, %s%n", validateNanos / 1e9,
                valid ? "valid" : "INVALID");
        System.out.printf(Locale.ROOT, "bare Jackson write of %d doubles: %.2f s (%d bytes), peak heap %d MiB%n", numbers,
                bareS, bareBytes, peakBare >> 20);
        System.out.printf(Locale.ROOT, "compile+write time / bare write time = %.2f (target <= 2)%n",
                (compileS + writeS) / bareS);
        Files.deleteIfExists(circuitFile);
        Files.deleteIfExists(bareFile);
        Files.deleteIfExists(dir);
    }

    /** Writes {@code count} doubles of the kind found in weights as one JSON array, streaming. */
    private static void bareWrite(Path file, long count) throws Exception {
        long state = 12345;
        try (OutputStream raw = Files.newOutputStream(file);
             OutputStream out = new BufferedOutputStream(raw, 1 << 16);
             JsonGenerator gen = JsonInput.mapperFor(ReadLimits.DEFAULT).createGenerator(out)) {
            gen.writeStartArray();
            for (long i = 0; i < count; i++) {
                state = state * 6364136223846793005L + 1442695040888963407L;
                gen.writeNumber((state >>> 11) * 0x1.0p-53);
            }
            gen.writeEndArray();
        }
    }

    private static void resetPeaks() {
        System.gc();
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            p.resetPeakUsage();
        }
    }

    private static long peakHeap() {
        long sum = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                sum += p.getPeakUsage().getUsed();
            }
        }
        return sum;
    }
}
