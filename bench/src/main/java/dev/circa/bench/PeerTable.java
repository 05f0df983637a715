package dev.circa.bench;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.io.CircuitReader;
import java.io.ByteArrayOutputStream;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import java.util.function.LongSupplier;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The side-by-side table of bench/run: circa's log-density throughput on the peer model (a region graph
 * written by the PyTorch peer script, converted by {@code circa convert}) at batch 1, 64 and 1024, the
 * peer's throughput measured in the same run (a child process running the peer's evaluator through
 * bench/peer_cpu.py), and the machine's practical ceiling for the same work: a plain dense matrix-vector
 * (batch 1) and matrix-matrix product (batch 64, 1024) over a matrix with as many entries as the circuit
 * has edges, timed in this JVM ({@link Ceiling}). One thread each, in edge evaluations (edges x rows) per
 * CPU second of the thread (or process, for the peer), so that other work on a shared machine does not
 * distort the ratios; the two-thread scaling at batch 1024 is by the wall clock (it cannot be otherwise),
 * with the load average printed beside it.
 *
 * <p>Run: {@code java -cp bench/target/benchmarks.jar dev.circa.bench.PeerTable CIRCUIT.json [PEERDIR PYTHON
 * PEER_SCRIPT PEER_CPU_SCRIPT]} (without the peer arguments, or with "-", a line says the peer was not run).
 */
public final class PeerTable {
    private static final int[] BATCHES = {1, 64, 1024};
    private static final double SECONDS = 1.0;
    private static final Map<Integer, Double> TARGET = Map.of(1, 3.0, 64, 2.0, 1024, 4.0);

    private PeerTable() {
    }

    public static void main(String[] args) throws Exception {
        boolean generate = args[0].equals("--generate");
        String circuitFile = generate ? "generated region graph of about 310,880 edges" : args[0];
        String peerDir = args.length > 1 ? args[1] : "-";
        String python = args.length > 2 ? args[2] : "-";
        String peerScript = args.length > 3 ? args[3] : "-";
        String cpuScript = args.length > 4 ? args[4] : "-";
        CompiledCircuit circuit = generate
                ? CompiledCircuit.compile(RegionGraphWorkload.build(RegionGraphWorkload.repetitionsFor(310_880),
                        EvaluationBenchmark.CIRCUIT_SEED))
                : CompiledCircuit.compile(new CircuitReader().read(Path.of(circuitFile)));
        long edges = circuit.edgeCount();
        int nv = circuit.variableCount();
        double load0 = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
        Map<Integer, Double> circa = new LinkedHashMap<>();
        Map<Integer, Double> ceiling = new LinkedHashMap<>();
        for (int batch : BATCHES) {
            double[] data = rows(batch, nv, 1);
            double[] out = new double[batch * circuit.outputCount()];
            Evaluator e = new Evaluator(circuit);
            circa.put(batch, cpuRate(() -> e.logDensity(data, batch, out)) * edges * batch);
            ceiling.put(batch, Ceiling.measure(edges, batch) * edges * batch);
        }
        double[] wall = new double[3];
        double[] big = rows(1024, nv, 1);
        double[] bigOut = new double[1024 * circuit.outputCount()];
        for (int threads = 1; threads <= 2; threads++) {
            try (BatchRunner runner = new BatchRunner(circuit, threads)) {
                wall[threads] = wallRate(() -> runner.logDensity(big, 1024, bigOut)) * edges * 1024;
            }
        }
        double machineScale = Ceiling.twoThreadScaling(edges, 1024);
        Map<Integer, double[]> peer = new LinkedHashMap<>();
        String peerNote = runPeer(python, cpuScript, peerScript, peerDir, peer);
        double load1 = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "peer model: %s (%,d nodes, %,d edges, %d variables); one thread each,"
                + " edge evaluations per CPU second (G = 1e9)%n", circuitFile, circuit.nodeCount(), edges, nv));
        sb.append(String.format(Locale.ROOT, "%-6s | %-9s | %-9s | %-22s | %-9s | %-15s%n", "batch", "circa", "peer",
                "circa / peer (target)", "ceiling", "circa / ceiling"));
        for (int batch : BATCHES) {
            double c = circa.get(batch);
            double[] p = peer.get(batch);
            double ce = ceiling.get(batch);
            String ratio = "n/a";
            if (p != null) {
                double t = TARGET.get(batch);
                ratio = String.format(Locale.ROOT, "%.2fx (>=%.0fx %s)", c / p[0], t, c / p[0] >= t ? "MET" : "NOT MET");
            }
            sb.append(String.format(Locale.ROOT, "%-6d | %-9s | %-9s | %-22s | %-9s | %.0f%%%n", batch, sci(c),
                    p == null ? "-" : sci(p[0]), ratio, sci(ce), 100 * c / ce));
        }
        double scale = wall[2] / wall[1];
        sb.append(String.format(Locale.ROOT, "batch 1024, wall clock: 1 thread %s, 2 threads %s: %.2fx (>=1.7x %s)%n",
                sci(wall[1]), sci(wall[2]), scale, scale >= 1.7 ? "MET" : "NOT MET"));
        sb.append(String.format(Locale.ROOT, "  the ceiling's own product on 2 threads (rows split in halves), same run: %.2fx;"
                + " circa's scaling is %.0f%% of the machine's%n", machineScale, 100 * scale / machineScale));
        if (!peer.isEmpty()) {
            sb.append("peer by wall clock:");
            for (int batch : BATCHES) {
                sb.append(String.format(Locale.ROOT, " batch %d %s;", batch, sci(peer.get(batch)[1])));
            }
            sb.append('\n');
        }
        sb.append("ceiling: a plain dense matrix-vector (batch 1) and matrix-matrix (batch 64, 1024) product in this JVM,"
                + " a matrix of as many entries as the circuit has edges\n");
        sb.append(String.format(Locale.ROOT, "%d processors, load average %.1f at the start, %.1f at the end%n",
                Runtime.getRuntime().availableProcessors(), load0, load1));
        if (peerNote != null) {
            sb.append("peer: ").append(peerNote).append('\n');
        }
        System.out.print(sb);
    }

    /** Calls per CPU second of the calling thread: a warm-up, then the median of 3 spans. */
    static double cpuRate(Runnable r) {
        ThreadMXBean tb = ManagementFactory.getThreadMXBean();
        timed(r, SECONDS, tb::getCurrentThreadCpuTime);
        double[] s = {timed(r, SECONDS / 2, tb::getCurrentThreadCpuTime), timed(r, SECONDS / 2, tb::getCurrentThreadCpuTime),
            timed(r, SECONDS / 2, tb::getCurrentThreadCpuTime)};
        Arrays.sort(s);
        return s[1];
    }

    /** Calls per wall-clock second: a warm-up, then the median of 3 spans. */
    static double wallRate(Runnable r) {
        timed(r, SECONDS, System::nanoTime);
        double[] s = {timed(r, SECONDS, System::nanoTime), timed(r, SECONDS, System::nanoTime), timed(r, SECONDS, System::nanoTime)};
        Arrays.sort(s);
        return s[1];
    }

    private static double timed(Runnable r, double seconds, LongSupplier clock) {
        long t0 = clock.getAsLong();
        long end = t0 + (long) (seconds * 1e9);
        long n = 0;
        long now;
        do {
            r.run();
            n++;
            now = clock.getAsLong();
        } while (now < end);
        return n / ((now - t0) / 1e9);
    }

    static double[] rows(int batch, int nv, long seed) {
        Random rnd = new Random(seed);
        double[] d = new double[batch * nv];
        for (int i = 0; i < d.length; i++) {
            d[i] = rnd.nextGaussian();
        }
        return d;
    }

    /**
     * Runs the peer's evaluator through {@code cpuScript} (one thread); fills {@code peer} with {CPU rate,
     * wall rate} per batch; returns a note when it could not run, else null.
     */
    private static String runPeer(String python, String cpuScript, String script, String dir, Map<Integer, double[]> peer)
            throws Exception {
        if (python.equals("-") || script.equals("-") || dir.equals("-") || cpuScript.equals("-")) {
            return "not run: no PyTorch peer (needs ../shared/bench/torch_peer.py and a python3 with torch)";
        }
        Process p = new ProcessBuilder(python, cpuScript, script, dir, "--batches", "1,64,1024", "--seconds", "2")
                .redirectErrorStream(true).start();
        ByteArrayOutputStream buf = new ByteArrayOutputStream();
        try (InputStream in = p.getInputStream()) {
            in.transferTo(buf);
        }
        if (!p.waitFor(20, TimeUnit.MINUTES) || p.exitValue() != 0) {
            return "not run: the peer failed: " + buf.toString(StandardCharsets.UTF_8).strip();
        }
        String json = buf.toString(StandardCharsets.UTF_8);
        for (int batch : BATCHES) {
            Matcher m = Pattern.compile("\"batch" + batch + "\":\\s*\\{\"cpu_edge_evals_per_s\":\\s*([0-9.eE+-]+),"
                    + "\\s*\"wall_edge_evals_per_s\":\\s*([0-9.eE+-]+)").matcher(json);
            if (!m.find()) {
                return "not run: unexpected peer output: " + json.strip();
            }
            peer.put(batch, new double[] {Double.parseDouble(m.group(1)), Double.parseDouble(m.group(2))});
        }
        return null;
    }

    private static String sci(double v) {
        return String.format(Locale.ROOT, "%.3f G", v / 1e9);
    }
}
