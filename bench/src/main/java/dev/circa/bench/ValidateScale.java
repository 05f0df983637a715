package dev.circa.bench;

import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;
import tools.jackson.core.JsonGenerator;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;

/**
 * Validation time and memory against a bare streaming parse of the same file, on generated circuits
 * (default about 5 * 10^6 and 10^7 edges; a benchmark, not a test: it prints a table and asserts nothing).
 *
 * <p>Each step runs in a JVM of its own ({@link ValidateRun}) under {@code -Xmx512m} (change with
 * {@code -Dxmx=1g}), timed by the wall clock from here, and JVM start-up is taken out as the issue asks:
 * the time of the same step on a tiny circuit (about 300 edges) is subtracted. The steps: {@code parse}
 * walks every token with Jackson's streaming parser and builds nothing; {@code parse+num} also decodes
 * every number (a parse that looks at the values); {@code validate} is {@code circa validate
 * --schema-check never} (read + every rule), {@code +schema} the same with the bundled schema's check
 * ({@code --schema-check always}). The ratios are validate / parse and validate / parse+num, and
 * (validate+schema - validate) / validate, the schema check's cost relative to the rest of validation.
 * Peak heap is the sum of the heap pools' peaks in the validating JVM, peak RSS its resident high-water
 * mark; "512m enough" says whether validation finished with a verdict under that heap limit.
 *
 * <p>Each circuit is a balanced binary region tree over {@code n} real variables: K = 10 normal
 * inputs per variable, and per inner region the K x K products of its two parts' nodes and K sums
 * over all of them (the root has one sum, the output). That is about 1,200 edges per inner region.
 * Seeded (SplittableRandom 42), so the files are the same on every run.
 *
 * <p>Run from the repository root (Java 17); {@code -Dkeep=true} keeps the files in DIR, {@code -Dreps=N}
 * takes the best of N runs per step (default 2):
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -cp bench/target/benchmarks.jar dev.circa.bench.ValidateScale [--dir DIR] [EDGES...]
 * </pre>
 * ({@code bench/run validate [EDGES...]} does the same.)
 */
public final class ValidateScale {
    private static final int K = 10;
    private static final String[] STEPS = {"parse", "numbers", "validate", "schema"};

    private ValidateScale() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = null;
        java.util.List<Long> targets = new java.util.ArrayList<>();
        for (int i = 0; i < args.length; i++) {
            if (args[i].equals("--dir")) {
                dir = Path.of(args[++i]);
            } else {
                targets.add(Long.parseLong(args[i].replace("_", "")));
            }
        }
        if (targets.isEmpty()) {
            targets.add(5_000_000L);
            targets.add(10_000_000L);
        }
        if (dir == null) {
            dir = Files.createTempDirectory("circa-validate-scale");
        }
        Files.createDirectories(dir);
        String xmx = System.getProperty("xmx", "512m");
        int reps = Integer.getInteger("reps", 2);
        Path tiny = dir.resolve("tiny.json");
        generate(tiny, 2);
        double[][] base = new double[STEPS.length][];
        for (int s = 0; s < STEPS.length; s++) {
            base[s] = best(STEPS[s], tiny, xmx, reps + 1);
        }
        System.out.printf(Locale.ROOT, "validation beside a bare streaming parse, one JVM per step under -Xmx%s,"
                + " JVM start-up taken out (the same step on a 300-edge circuit subtracted); wall clock and CPU time%n", xmx);
        System.out.printf(Locale.ROOT, "%10s %6s | %7s %7s %8s %8s | %9s %8s %8s | %9s %8s %8s | %5s %5s %5s %4s %s%n",
                "edges", "MB", "parse s", "+num s", "valid s", "+schem s", "val/parse", "val/+num", "schema/v",
                "cpu v/par", "v/+num", "schema/v", "live", "heap", "RSS", "512m", "outcome");
        for (long target : targets) {
            int n = (int) Math.max(2, target / (K * K * K + 2 * K * K) + 1);
            Path file = dir.resolve("circuit-" + target + ".json");
            long[] size = generate(file, n);
            double[][] r = new double[STEPS.length][];
            String[] outcome = new String[STEPS.length];
            for (int s = 0; s < STEPS.length; s++) {
                r[s] = best(STEPS[s], file, xmx, reps);
                outcome[s] = lastOutcome;
            }
            double[] wall = new double[STEPS.length];
            double[] cpu = new double[STEPS.length];
            for (int s = 0; s < STEPS.length; s++) {
                wall[s] = r[s][0] - base[s][0];
                cpu[s] = r[s][1] - base[s][1];
            }
            boolean ok = outcome[2].equals("valid");
            System.out.printf(Locale.ROOT,
                    "%10d %6.1f | %7.3f %7.3f %8.3f %8.3f | %9.2f %8.2f %8.2f | %9.2f %8.2f %8.2f | %5.0f %5.0f %5.0f %4s %s%n",
                    size[1], Files.size(file) / 1e6, wall[0], wall[1], wall[2], wall[3], wall[2] / wall[0],
                    wall[2] / wall[1], (wall[3] - wall[2]) / wall[2], cpu[2] / cpu[0], cpu[2] / cpu[1],
                    (cpu[3] - cpu[2]) / cpu[2], r[2][3], r[2][2], r[2][4], ok ? "yes" : "NO",
                    outcome[2] + (outcome[3].equals(outcome[2]) ? "" : " (+schema: " + outcome[3] + ")"));
            best("phases", file, xmx, 1);
            System.out.println("           phases of validate in one JVM (s): " + lastOutcome);
            best("warm", file, xmx, 1);
            System.out.println("           warm in one JVM, best of 5 (s): " + lastOutcome);
            if (!Boolean.getBoolean("keep")) {
                Files.delete(file);
            }
        }
        Files.delete(tiny);
        System.out.println("(parse: bare token walk; +num: the same decoding every number; valid: read + every rule"
                + " (--schema-check never); +schem: with the bundled schema check (always), which reads the file on the"
                + " second core; schema/v: the schema check's extra time over validation; cpu: the same ratios in CPU"
                + " seconds of the whole process (every thread); live: the validating JVM's largest heap occupancy"
                + " right after a collection (MiB), heap: its heap pools' peaks (garbage included), RSS: its resident"
                + " high-water mark; 512m: a verdict under -Xmx" + xmx + ")");
    }

    private static String lastOutcome;

    /** The best of {@code reps} runs of {@code step} on {@code file}: {wall s, CPU s, peak heap, live peak, RSS (MiB)}. */
    private static double[] best(String step, Path file, String xmx, int reps) throws IOException, InterruptedException {
        double[] best = null;
        String jar = Path.of(ValidateScale.class.getProtectionDomain().getCodeSource().getLocation().getPath()).toString();
        for (int i = 0; i < reps; i++) {
            ProcessBuilder pb = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xmx" + xmx, "-cp", jar, ValidateRun.class.getName(), step, file.toString());
            pb.redirectErrorStream(true);
            long t0 = System.nanoTime();
            Process p = pb.start();
            String out = new String(p.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8).trim();
            int rc = p.waitFor();
            double wall = (System.nanoTime() - t0) / 1e9;
            String[] f = out.isEmpty() ? new String[0] : out.substring(out.lastIndexOf('\n') + 1).split(" ");
            if (rc != 0 || f.length < 7 || !f[0].equals(step)) {
                lastOutcome = out.contains("OutOfMemoryError") ? "OutOfMemoryError" : "failed (exit " + rc + ")";
                return new double[] {Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN};
            }
            lastOutcome = f[6];
            double[] r = {wall, Double.parseDouble(f[2]), Double.parseDouble(f[3]), Double.parseDouble(f[4]),
                Double.parseDouble(f[5])};
            if (best == null || r[0] < best[0]) {
                best = r;
            }
        }
        return best;
    }

    /** Walks every token of {@code file}; returns the token count. */
    static long parse(Path file) throws IOException {
        long tokens = 0;
        try (InputStream in = Files.newInputStream(file);
                JsonParser p = JsonInput.mapperFor(ReadLimits.DEFAULT).createParser(in)) {
            while (p.nextToken() != null) {
                tokens++;
            }
        }
        return tokens;
    }

    /** Walks every token of {@code file} and decodes every number; returns a checksum. */
    static double parseNumbers(Path file) throws IOException {
        double sum = 0;
        try (InputStream in = Files.newInputStream(file);
                JsonParser p = JsonInput.mapperFor(ReadLimits.DEFAULT).createParser(in)) {
            JsonToken t;
            while ((t = p.nextToken()) != null) {
                if (t == JsonToken.VALUE_NUMBER_FLOAT) {
                    sum += p.getDoubleValue();
                } else if (t == JsonToken.VALUE_NUMBER_INT) {
                    sum += p.getIntValue();
                }
            }
        }
        return sum;
    }

    /** Writes the circuit over {@code n} variables; returns {nodes, edges}. */
    static long[] generate(Path file, int n) throws IOException {
        SplittableRandom rnd = new SplittableRandom(42);
        long nodes = 0;
        long edges = 0;
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(file), 1 << 16);
                JsonGenerator g = JsonInput.mapperFor(ReadLimits.DEFAULT).createGenerator(out)) {
            g.writeStartObject();
            g.writeStringProperty("format", "circa.circuit");
            g.writeStringProperty("version", "1.0");
            g.writeName("variables");
            g.writeStartArray();
            for (int v = 0; v < n; v++) {
                g.writeStartObject();
                g.writeStringProperty("name", "inlet_pressure_" + v);
                g.writeStringProperty("type", "real");
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeName("nodes");
            g.writeStartArray();
            // the region tree over [lo, hi) is laid out children first with an explicit stack
            int[] stackLo = new int[64];
            int[] stackHi = new int[64];
            int[] stackState = new int[64];
            int[][] first = new int[64][];
            int sp = 0;
            stackLo[0] = 0;
            stackHi[0] = n;
            int nextId = 0;
            int[] result = null;
            while (sp >= 0) {
                int lo = stackLo[sp];
                int hi = stackHi[sp];
                if (hi - lo == 1) {
                    int[] ids = new int[K];
                    for (int k = 0; k < K; k++) {
                        ids[k] = nextId++;
                        g.writeRaw('\n');
                        g.writeStartObject();
                        g.writeNumberProperty("id", ids[k]);
                        g.writeStringProperty("input", "normal");
                        g.writeNumberProperty("var", lo);
                        g.writeNumberProperty("mean", rnd.nextDouble() * 4);
                        g.writeNumberProperty("sd", 0.2 + rnd.nextDouble());
                        g.writeEndObject();
                        nodes++;
                    }
                    result = ids;
                    sp--;
                    continue;
                }
                int mid = (lo + hi) >>> 1;
                if (stackState[sp] == 0) {
                    stackState[sp] = 1;
                    sp++;
                    stackLo[sp] = lo;
                    stackHi[sp] = mid;
                    stackState[sp] = 0;
                    continue;
                }
                if (stackState[sp] == 1) {
                    first[sp] = result;
                    stackState[sp] = 2;
                    sp++;
                    stackLo[sp] = mid;
                    stackHi[sp] = hi;
                    stackState[sp] = 0;
                    continue;
                }
                int[] a = first[sp];
                int[] b = result;
                int[] prods = new int[a.length * b.length];
                int m = 0;
                for (int x : a) {
                    for (int y : b) {
                        prods[m] = nextId++;
                        g.writeRaw('\n');
                        g.writeStartObject();
                        g.writeNumberProperty("id", prods[m]);
                        g.writeName("product");
                        g.writeArray(new int[] {x, y}, 0, 2);
                        g.writeEndObject();
                        m++;
                        nodes++;
                        edges += 2;
                    }
                }
                int sums = sp == 0 ? 1 : K;
                int[] ids = new int[sums];
                for (int k = 0; k < sums; k++) {
                    double[] w = new double[prods.length];
                    double s = 0;
                    for (int j = 0; j < w.length; j++) {
                        w[j] = 0.05 + rnd.nextDouble();
                        s += w[j];
                    }
                    for (int j = 0; j < w.length; j++) {
                        w[j] /= s;
                    }
                    ids[k] = nextId++;
                    g.writeRaw('\n');
                    g.writeStartObject();
                    g.writeNumberProperty("id", ids[k]);
                    g.writeName("sum");
                    g.writeArray(prods, 0, prods.length);
                    g.writeName("weights");
                    g.writeArray(w, 0, w.length);
                    g.writeEndObject();
                    nodes++;
                    edges += prods.length;
                }
                result = ids;
                stackState[sp] = 0;
                sp--;
            }
            g.writeRaw('\n');
            g.writeEndArray();
            g.writeName("outputs");
            g.writeStartArray();
            g.writeStartObject();
            g.writeStringProperty("name", "joint");
            g.writeNumberProperty("node", result[0]);
            g.writeEndObject();
            g.writeEndArray();
            g.writeEndObject();
        }
        return new long[] {nodes, edges};
    }
}
