package dev.circa.bench;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.io.CircuitReader;
import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The side-by-side table of bench/run: circa's log-density throughput on the peer model (a region graph
 * written by the PyTorch peer script, converted by {@code circa convert}) at batch 1, 64 and 1024 on 1 and
 * 2 threads, the peer's throughput measured in the same run (a child process), and the machine's practical
 * ceiling for the same work: a plain dense matrix-vector (batch 1) and matrix-matrix product (batch 64,
 * 1024) over a matrix with as many entries as the circuit has edges, timed in this JVM. Throughput is in
 * edge evaluations per second (edges x rows / s).
 *
 * <p>Run: {@code java -cp bench/target/benchmarks.jar dev.circa.bench.PeerTable CIRCUIT.json PEERDIR PYTHON}
 * (PEERDIR and PYTHON may be "-" when the peer is absent: its column then says why).
 */
public final class PeerTable {
    private static final int[] BATCHES = {1, 64, 1024};
    private static final double SECONDS = 2.0;
    private static final Map<Integer, Double> TARGET = Map.of(1, 3.0, 64, 2.0, 1024, 4.0);

    private PeerTable() {
    }

    public static void main(String[] args) throws Exception {
        Path circuitFile = Path.of(args[0]);
        String peerDir = args.length > 1 ? args[1] : "-";
        String python = args.length > 2 ? args[2] : "-";
        String peerScript = args.length > 3 ? args[3] : "-";
        CompiledCircuit circuit = CompiledCircuit.compile(new CircuitReader().read(circuitFile));
        long edges = circuit.edgeCount();
        int nv = circuit.variableCount();
        Map<String, Double> circa = new LinkedHashMap<>();
        for (int threads = 1; threads <= 2; threads++) {
            for (int batch : BATCHES) {
                circa.put(batch + "/" + threads, measureCirca(circuit, batch, threads) * edges * batch);
            }
        }
        Map<String, Double> ceiling = new LinkedHashMap<>();
        for (int batch : BATCHES) {
            ceiling.put(batch + "/1", Ceiling.measure(edges, batch, SECONDS) * edges * batch);
        }
        Map<String, Double> peer = new LinkedHashMap<>();
        String peerNote = runPeer(python, peerScript, peerDir, peer);
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "peer model: %s (%,d nodes, %,d edges, %d variables)%n", circuitFile,
                circuit.nodeCount(), edges, nv));
        sb.append(String.format(Locale.ROOT, "%-6s %-7s | %-12s | %-12s | %-16s | %-12s | %s%n", "batch", "threads",
                "circa (e/s)", "peer (e/s)", "circa / peer", "ceiling (e/s)", "circa / ceiling"));
        for (int threads = 1; threads <= 2; threads++) {
            for (int batch : BATCHES) {
                double c = circa.get(batch + "/" + threads);
                Double p = peer.get(batch + "/" + threads);
                Double ce = threads == 1 ? ceiling.get(batch + "/1") : null;
                String ratio = p == null ? "n/a" : String.format(Locale.ROOT, "%.2fx", c / p);
                if (p != null && threads == 1) {
                    double t = TARGET.get(batch);
                    ratio += String.format(Locale.ROOT, " (>=%.0fx %s)", t, c / p >= t ? "MET" : "NOT MET");
                }
                sb.append(String.format(Locale.ROOT, "%-6d %-7d | %-12s | %-12s | %-16s | %-12s | %s%n", batch, threads,
                        sci(c), p == null ? "-" : sci(p), ratio, ce == null ? "-" : sci(ce),
                        ce == null ? "-" : String.format(Locale.ROOT, "%.0f%%", 100 * c / ce)));
            }
        }
        double scale = circa.get("1024/2") / circa.get("1024/1");
        sb.append(String.format(Locale.ROOT, "2 threads / 1 thread at batch 1024: %.2fx (>=1.7x %s)%n", scale,
                scale >= 1.7 ? "MET" : "NOT MET"));
        sb.append("ceiling: plain dense matrix-vector (batch 1) and matrix-matrix (batch 64, 1024) product, one thread, "
                + "a matrix of as many entries as edges, in this JVM\n");
        if (peerNote != null) {
            sb.append("peer: ").append(peerNote).append('\n');
        }
        System.out.print(sb);
    }

    /** Calls per second of circa's log-density on {@code batch} rows over {@code threads} threads. */
    private static double measureCirca(CompiledCircuit circuit, int batch, int threads) {
        double[] data = rows(batch, circuit.variableCount(), 1);
        double[] out = new double[batch * circuit.outputCount()];
        if (batch == 1 && threads > 1) {
            return callers(circuit, threads, data, out);
        }
        try (BatchRunner runner = new BatchRunner(circuit, threads)) {
            return loop(() -> runner.logDensity(data, batch, out));
        }
    }

    /** Batch 1 on several threads: independent callers, one evaluator each; returns total calls per second. */
    private static double callers(CompiledCircuit circuit, int threads, double[] data, double[] out) {
        double[] rate = new double[threads];
        Thread[] t = new Thread[threads];
        for (int k = 0; k < threads; k++) {
            int kk = k;
            t[k] = new Thread(() -> {
                Evaluator e = new Evaluator(circuit);
                double[] o = new double[out.length];
                rate[kk] = loop(() -> e.logDensity(data, 1, o));
            });
            t[k].start();
        }
        double sum = 0;
        for (int k = 0; k < threads; k++) {
            try {
                t[k].join();
            } catch (InterruptedException ex) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException(ex);
            }
            sum += rate[k];
        }
        return sum;
    }

    /** Calls per second of {@code r}: a warm-up of {@code SECONDS}, then the median of 3 timed spans. */
    static double loop(Runnable r) {
        timed(r, SECONDS);
        double[] s = {timed(r, SECONDS / 2), timed(r, SECONDS / 2), timed(r, SECONDS / 2)};
        java.util.Arrays.sort(s);
        return s[1];
    }

    private static double timed(Runnable r, double seconds) {
        long t0 = System.nanoTime();
        long end = t0 + (long) (seconds * 1e9);
        long n = 0;
        long now;
        do {
            r.run();
            n++;
            now = System.nanoTime();
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

    /** Runs the peer (1 and 2 threads); fills {@code peer}; returns a note when it could not run, else null. */
    private static String runPeer(String python, String script, String dir, Map<String, Double> peer) throws Exception {
        if (python.equals("-") || script.equals("-") || dir.equals("-")) {
            return "not run: no PyTorch peer (needs ../shared/bench/torch_peer.py and a python3 with torch)";
        }
        for (int threads = 1; threads <= 2; threads++) {
            Process p = new ProcessBuilder(python, script, "time", dir, "--threads", Integer.toString(threads),
                    "--batches", "1,64,1024", "--seconds", "3").redirectErrorStream(true).start();
            ByteArrayOutputStream buf = new ByteArrayOutputStream();
            try (InputStream in = p.getInputStream()) {
                in.transferTo(buf);
            }
            if (!p.waitFor(10, TimeUnit.MINUTES) || p.exitValue() != 0) {
                return "not run: the peer failed: " + buf.toString(StandardCharsets.UTF_8).strip();
            }
            String json = buf.toString(StandardCharsets.UTF_8);
            for (int batch : BATCHES) {
                Matcher m = Pattern.compile("\"batch" + batch + "\":\\s*\\{[^}]*\"edge_evals_per_s\":\\s*([0-9.eE+-]+)")
                        .matcher(json);
                if (!m.find()) {
                    return "not run: unexpected peer output: " + json.strip();
                }
                peer.put(batch + "/" + threads, Double.parseDouble(m.group(1)));
            }
        }
        return null;
    }

    private static String sci(double v) {
        return String.format(Locale.ROOT, "%.3g G", v / 1e9);
    }
}
