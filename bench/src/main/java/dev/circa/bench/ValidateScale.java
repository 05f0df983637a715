package dev.circa.bench;

import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
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
 * Validation time against a bare streaming parse of the same file, on generated circuits of about
 * 10^5, 10^6 and 10^7 edges (a benchmark, not a test: it prints a table and asserts nothing).
 *
 * <p>Each circuit is a balanced binary region tree over {@code n} real variables: K = 10 normal
 * inputs per variable, and per inner region the K x K products of its two parts' nodes and K sums
 * over all of them (the root has one sum, the output). That is about 1,200 edges per inner region.
 * The bare parse walks every token with Jackson's streaming parser and builds nothing (a second
 * column also decodes every number); validation
 * reads the document and runs every rule; the last column adds the bundled schema's streaming check. Seeded (SplittableRandom 42), so the files are the same
 * on every run.
 *
 * <p>Run from the repository root (Java 17), one command; {@code -Dkeep=true} keeps the files in DIR:
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx2g -cp bench/target/benchmarks.jar dev.circa.bench.ValidateScale [DIR]
 * </pre>
 */
public final class ValidateScale {
    private static final int K = 10;

    private ValidateScale() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = args.length > 0 ? Path.of(args[0]) : Files.createTempDirectory("circa-validate-scale");
        long[] targets = {100_000L, 1_000_000L, 10_000_000L};
        Validator validator = new Validator(ValidationOptions.defaults());
        Validator withSchema = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
        System.out.println("warming up ...");
        Path warm = dir.resolve("warm.json");
        generate(warm, 200);
        for (int i = 0; i < 3; i++) {
            parse(warm);
            validator.validate(warm);
            withSchema.validate(warm);
        }
        System.out.printf(Locale.ROOT, "%12s %10s %9s %9s %11s %9s %11s %7s %10s%n", "edges", "nodes", "file MB", "parse s",
                "parse+num s", "read s", "validate s", "ratio", "+schema s");
        for (long target : targets) {
            int n = (int) Math.max(2, target / (K * K * K + 2 * K * K) + 1);
            Path file = dir.resolve("circuit-" + target + ".json");
            long[] size = generate(file, n);
            int reps = target >= 10_000_000L ? 2 : 3;
            double parse = Double.MAX_VALUE;
            double parseNum = Double.MAX_VALUE;
            double read = Double.MAX_VALUE;
            double validate = Double.MAX_VALUE;
            ValidationReport r = null;
            for (int i = 0; i < reps; i++) {
                // each timed step starts on a collected heap, so no step pays for the garbage of the one before
                System.gc();
                long tn = System.nanoTime();
                parseNumbers(file);
                parseNum = Math.min(parseNum, (System.nanoTime() - tn) / 1e9);
                System.gc();
                long t0 = System.nanoTime();
                parse(file);
                long t1 = System.nanoTime();
                System.gc();
                long t1b = System.nanoTime();
                new CircuitReader().read(file);
                long t2 = System.nanoTime();
                System.gc();
                long t2b = System.nanoTime();
                r = validator.validate(file);
                long t3 = System.nanoTime();
                parse = Math.min(parse, (t1 - t0) / 1e9);
                read = Math.min(read, (t2 - t1b) / 1e9);
                validate = Math.min(validate, (t3 - t2b) / 1e9);
            }
            boolean valid = r.valid();
            String diagnostics = valid ? "" : r.diagnostics().toString();
            r = null;
            System.gc();
            long t4 = System.nanoTime();
            withSchema.validate(file);
            double schema = (System.nanoTime() - t4) / 1e9;
            System.out.printf(Locale.ROOT, "%12d %10d %9.1f %9.3f %11.3f %9.3f %11.3f %7.2f %10.3f%n", size[1], size[0],
                    Files.size(file) / 1e6, parse, parseNum, read, validate, validate / parse, schema);
            if (!valid) {
                System.out.println("  unexpected: the generated circuit is invalid: " + diagnostics);
            }
            if (!Boolean.getBoolean("keep")) {
                Files.delete(file);
            }
        }
        Files.delete(warm);
        System.out.println("(parse: bare token walk; parse+num: the same, decoding every number; read: CircuitReader alone; validate: read + every rule; "
                + "ratio: validate / parse; +schema: validate with the bundled schema's streaming check, one run; "
                + "max heap " + Runtime.getRuntime().maxMemory() / (1 << 20) + " MiB)");
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
