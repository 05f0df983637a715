package dev.circa.bench;

import dev.circa.format.certificate.CertificateWriter;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.ReadLimits;
import dev.circa.model.Certification;
import dev.circa.model.Certifier;
import dev.circa.model.Model;
import dev.circa.model.Requirement;
import dev.circa.engine.CompiledCircuit;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/**
 * Load time of a certified circuit against circa's own read of it without validation, and against
 * today's load (read + validate + compile), on the generated circuits of {@link ValidateScale} (about
 * 10^6 and 10^7 edges). A benchmark, not a test: it prints a table and asserts nothing. The target of
 * the certificates work: certified load / read at most 1.2 at 10^7 edges.
 *
 * <p>Columns (seconds, best of the runs, each step on a collected heap): read: {@code CircuitReader}
 * alone; read+compile: the same plus the engine's compile; load: {@code Model.load}, read + validate
 * + compile; certified: {@code ModelLoader.load(file, certificate)}, read hashing the bytes, then
 * compile, no validation.
 *
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx4g -cp bench/target/benchmarks.jar dev.circa.bench.CertifiedLoad [DIR] [EDGES...]
 * </pre>
 */
public final class CertifiedLoad {
    private static final int K = 10;

    private CertifiedLoad() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = args.length > 0 ? Path.of(args[0]) : Files.createTempDirectory("circa-certified-load");
        long[] targets = args.length > 1 ? new long[args.length - 1] : new long[] {1_000_000L, 10_000_000L};
        for (int i = 1; i < args.length; i++) {
            targets[i - 1] = Long.parseLong(args[i]);
        }
        Path warm = dir.resolve("warm.json");
        ValidateScale.generate(warm, 200);
        Path warmCert = certify(warm);
        for (int i = 0; i < 3; i++) {
            Model.load(warm);
            Model.loader().load(warm, warmCert);
        }
        System.out.printf(Locale.ROOT, "%12s %9s %8s %13s %8s %11s %11s %11s %11s%n", "edges", "file MB", "read s",
                "read+compile s", "load s", "certified s", "load/read", "cert/read", "cert/r+c");
        for (long target : targets) {
            int n = (int) Math.max(2, target / (K * K * K + 2 * K * K) + 1);
            Path file = dir.resolve("circuit-" + target + ".json");
            long[] size = ValidateScale.generate(file, n);
            Path cert = certify(file);
            int reps = 3;
            double read = Double.MAX_VALUE;
            double readCompile = Double.MAX_VALUE;
            double load = Double.MAX_VALUE;
            double certified = Double.MAX_VALUE;
            for (int i = 0; i < reps; i++) {
                System.gc();
                long t0 = System.nanoTime();
                Object doc = new CircuitReader().read(file);
                read = Math.min(read, (System.nanoTime() - t0) / 1e9);
                doc = null;
                System.gc();
                long t1 = System.nanoTime();
                CompiledCircuit c = CompiledCircuit.compile(new CircuitReader().read(file));
                readCompile = Math.min(readCompile, (System.nanoTime() - t1) / 1e9);
                c = null;
                System.gc();
                long t2 = System.nanoTime();
                Model m = Model.load(file);
                load = Math.min(load, (System.nanoTime() - t2) / 1e9);
                m = null;
                System.gc();
                long t3 = System.nanoTime();
                Model mc = Model.loader().load(file, cert);
                certified = Math.min(certified, (System.nanoTime() - t3) / 1e9);
                mc = null;
            }
            System.out.printf(Locale.ROOT, "%12d %9.1f %8.3f %13.3f %8.3f %11.3f %11.2f %11.2f %11.2f%n", size[1],
                    Files.size(file) / 1e6, read, readCompile, load, certified, load / read, certified / read,
                    certified / readCompile);
            if (!Boolean.getBoolean("keep")) {
                Files.delete(file);
                Files.delete(cert);
            }
        }
        Files.delete(warm);
        Files.delete(warmCert);
        System.out.println("(load: today's Model.load, read + validate + compile; certified: load with the certificate, "
                + "bytes hashed while read, no validation; ratios measured in this run; max heap "
                + Runtime.getRuntime().maxMemory() / (1 << 20) + " MiB)");
    }

    private static Path certify(Path file) throws Exception {
        Certification c = new Certifier(ReadLimits.DEFAULT, Requirement.DEFAULT, null, null).certify(file, List.of());
        if (!c.passed()) {
            throw new IllegalStateException("the generated circuit was not certified: " + c.failures());
        }
        Path cert = file.resolveSibling(file.getFileName() + ".cert.json");
        new CertificateWriter().write(c.certificate(), cert);
        return cert;
    }
}
