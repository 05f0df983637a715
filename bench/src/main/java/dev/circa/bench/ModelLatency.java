package dev.circa.bench;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.GridRegions;
import dev.circa.converter.regions.RandomRegions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.engine.Evaluator;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.model.Model;
import dev.circa.model.Row;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Per-row latency of scoring one named row through the model API against the raw engine call at batch 1
 * ({@code new Evaluator(circuit).logDensity(cells, 1, out)} on cells encoded beforehand), on one thread.
 * Four ways through the API: a {@link Map} per row (the keys equal to the variables' names but other
 * String objects, as a service that parsed them would hold), a reused {@link Row} set by name for every
 * row, the API's batch call at batch 1 on the same cells as the raw call, and the same maps with interned
 * keys and labels (as string literals in a caller's code are: found by reference). Rows cycle over a few seeded
 * rows (256, fewer for a model of many variables: at most about 4096 cells, so that the rows stay in cache
 * as a service's freshly parsed request does) with a quarter of the values missing; every way is first
 * checked bit-identical to the raw call on all of them.
 *
 * <p>Timing is CPU time of the measuring thread (the machine may be shared). A round times every way once,
 * interleaved, for the same number of rows (about {@code --run-ms} of CPU for the raw call, default 100); a
 * round's ratio is a way's time over the raw call's time in that round. Each model is measured in
 * {@code --forks} new JVMs (default 3; 0 measures in this JVM), {@code --runs} rounds each (default 21),
 * because the compiled code, and with it the ratio, differs from JVM to JVM more than from round to round.
 * Printed per fork and way: the median ns per row and the median ratio with its spread over the rounds
 * (quartiles and extremes); then per model and way the ratio over all rounds of all forks (median,
 * quartiles, extremes) and each fork's median, so that one reading is not mistaken for the result.
 * Target: the Map and Row ways within 1.2x of the raw call (pooled median).
 *
 * <p>Models ({@code MODEL} arguments, default {@code pump small peer}): {@code pump}, the FORMAT.md example
 * (fixtures/circuits/pump-station.json, 7 nodes, where the per-call overhead is most visible); {@code small},
 * a random region graph over two pump stations' 10 variables of every type (depth 2, 2 repetitions) compiled
 * with 3 sums and 3 input bundles: 282 edges; {@code grid}, a 4x4 grid region graph with 8 sums and 8
 * bundles; {@code peer}, a model of the peer's size in {@code bench/run peer} (256 real variables, depth 5,
 * 8 repetitions, 10 sums, 10 bundles, seed 1: 275,340 edges; the peer's own region graph has 310,880); or
 * the path of a circuit file. Run from the repository root (Java 17; about 2 minutes by default):
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests
 * java -cp bench/target/benchmarks.jar dev.circa.bench.ModelLatency [--forks F] [--runs N] [--run-ms MS] [MODEL...]
 * </pre>
 */
public final class ModelLatency {
    /** Most cells of the distinct rows: a model of many variables cycles over few rows (in cache, as a request is). */
    private static final int CELLS = 4096;
    private static final long SEED = 20261202L;
    private static final String[] WAYS = {"raw engine, Evaluator.logDensity at batch 1", "API, Map by name",
        "API, reused Row set by name", "API, batch call at batch 1 (cells)", "API, Map by name, literal keys"};
    /** The way that takes cells, not names: no target. */
    private static final int BATCH = 3;
    private static final ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();
    /** A fork's line of ratios: way, then one ratio per round. */
    private static final String RATIOS = "@ratios ";

    private ModelLatency() {
    }

    /** The benchmark: prints one block per model and fork, then per model the rounds of all forks pooled. */
    public static void main(String[] args) throws Exception {
        int runs = 21;
        int forks = 3;
        long runMs = 100;
        List<String> models = new ArrayList<>();
        for (int i = 0; i < args.length; i++) {
            if (args[i].equals("--runs")) {
                runs = Integer.parseInt(args[++i]);
            } else if (args[i].equals("--forks")) {
                forks = Integer.parseInt(args[++i]);
            } else if (args[i].equals("--run-ms")) {
                runMs = Long.parseLong(args[++i]);
            } else {
                models.add(args[i]);
            }
        }
        if (models.isEmpty()) {
            models = List.of("pump", "small", "peer");
        }
        if (forks == 0) {
            // one JVM, this one (what each fork runs)
            for (String m : models) {
                double[][] ratio = measure(m, model(m), runs, runMs * 1_000_000L);
                for (int s = 1; s < WAYS.length; s++) {
                    StringBuilder line = new StringBuilder(RATIOS).append(s);
                    for (double r : ratio[s]) {
                        line.append(' ').append(r);
                    }
                    System.out.println(line);
                }
            }
            return;
        }
        System.out.printf(Locale.ROOT, "model API latency against the raw engine call, batch 1, one thread; CPU time; "
                + "per model %d forks (a JVM each: compilation differs from JVM to JVM) x %d rounds; load average %.1f "
                + "on %d cores%n", forks, runs, load(), Runtime.getRuntime().availableProcessors());
        Map<String, List<String>> summaries = new java.util.LinkedHashMap<>();
        for (String m : models) {
            double[][] pooled = new double[WAYS.length][0];
            double[][] forkMedians = new double[WAYS.length][forks];
            for (int f = 0; f < forks; f++) {
                System.out.printf(Locale.ROOT, "fork %d of %d, ", f + 1, forks);
                double[][] ratio = fork(m, runs, runMs);
                for (int s = 1; s < WAYS.length; s++) {
                    pooled[s] = concat(pooled[s], ratio[s]);
                    double[] r = ratio[s].clone();
                    Arrays.sort(r);
                    forkMedians[s][f] = quantile(r, 0.5);
                }
            }
            List<String> lines = new ArrayList<>();
            for (int s = 1; s < WAYS.length; s++) {
                double[] r = pooled[s];
                Arrays.sort(r);
                StringBuilder medians = new StringBuilder();
                for (double x : forkMedians[s]) {
                    medians.append(String.format(Locale.ROOT, " %.3f", x));
                }
                lines.add(String.format(Locale.ROOT, "  %-38s %.3f  %.2f-%.2f [%.2f, %.2f]  forks:%s%s", WAYS[s],
                        quantile(r, 0.5), quantile(r, 0.25), quantile(r, 0.75), r[0], r[r.length - 1], medians,
                        s == BATCH ? "" : quantile(r, 0.5) <= 1.2 ? "  target 1.2: met" : "  target 1.2: NOT met"));
            }
            summaries.put(m, lines);
        }
        System.out.printf(Locale.ROOT, "%nratio to the raw engine call, all rounds of all forks: median, quartiles "
                + "[min, max], and each fork's median; load average at the end %.1f%n", load());
        for (Map.Entry<String, List<String>> e : summaries.entrySet()) {
            System.out.println(e.getKey());
            e.getValue().forEach(System.out::println);
        }
    }

    /** Runs {@code model} in a new JVM (this one's class path and options), echoes its table, returns its ratios. */
    private static double[][] fork(String model, int runs, long runMs) throws Exception {
        List<String> command = new ArrayList<>();
        command.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        command.addAll(ManagementFactory.getRuntimeMXBean().getInputArguments());
        command.addAll(List.of("-cp", System.getProperty("java.class.path"), ModelLatency.class.getName(),
                "--forks", "0", "--runs", Integer.toString(runs), "--run-ms", Long.toString(runMs), model));
        Process p = new ProcessBuilder(command).redirectError(ProcessBuilder.Redirect.INHERIT).start();
        double[][] ratio = new double[WAYS.length][];
        try (java.io.BufferedReader in = new java.io.BufferedReader(
                new java.io.InputStreamReader(p.getInputStream(), java.nio.charset.StandardCharsets.UTF_8))) {
            for (String line; (line = in.readLine()) != null; ) {
                if (line.startsWith(RATIOS)) {
                    String[] f = line.substring(RATIOS.length()).split(" ");
                    ratio[Integer.parseInt(f[0])] = Arrays.stream(f, 1, f.length).mapToDouble(Double::parseDouble).toArray();
                } else {
                    System.out.println(line);
                }
            }
        }
        if (p.waitFor() != 0 || ratio[1] == null) {
            throw new IllegalStateException("the fork measuring " + model + " failed (exit " + p.exitValue() + ")");
        }
        return ratio;
    }

    private static double load() {
        return ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
    }

    private static double[] concat(double[] a, double[] b) {
        double[] c = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, c, a.length, b.length);
        return c;
    }

    private static Model model(String name) throws Exception {
        switch (name) {
            case "pump":
                return Model.load(Path.of("fixtures", "circuits", "pump-station.json"));
            case "small":
                return Model.loader().load(RegionCompiler.compile(
                        RandomRegions.generate(stations(2), 2, 2, 1L), new CompileOptions(3, 3, 1, Map.of()), 1L));
            case "grid":
                return Model.loader().load(RegionCompiler.compile(GridRegions.generate(4, 4),
                        new CompileOptions(8, 8, 1, Map.of()), 1L));
            case "peer":
                return Model.loader().load(RegionCompiler.compile(
                        RandomRegions.generate(RandomRegions.realVariables(256), 5, 8, 1L),
                        new CompileOptions(10, 10, 1, Map.of()), 1L));
            default:
                if (!Files.isRegularFile(Path.of(name))) {
                    throw new IllegalArgumentException("unknown model " + name
                            + "; expected pump, small, grid, peer or a circuit file");
                }
                return Model.load(Path.of(name));
        }
    }

    /** The pump-station variables of {@code n} stations: pressure, current (real), valve, alarm, restarts. */
    private static List<Variable> stations(int n) {
        List<Variable> vars = new ArrayList<>();
        for (int s = 0; s < n; s++) {
            vars.add(Variable.of("s" + s + "_inlet_pressure", VariableType.REAL));
            vars.add(Variable.of("s" + s + "_motor_current", VariableType.REAL));
            vars.add(new Variable("s" + s + "_valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"),
                    null, null));
            vars.add(Variable.of("s" + s + "_alarm", VariableType.BINARY));
            vars.add(Variable.of("s" + s + "_restarts", VariableType.COUNT));
        }
        return vars;
    }

    private interface Scorer {
        double score(int k);
    }

    /** Measures every way on {@code model}, prints its table and returns the ratios per way and round. */
    private static double[][] measure(String title, Model model, int runs, long runNanos) {
        List<Variable> vars = model.variables();
        int nv = vars.size();
        SplittableRandom rnd = new SplittableRandom(SEED);
        int distinct = Integer.highestOneBit(Math.max(4, Math.min(256, CELLS / nv)));
        int mask = distinct - 1;
        double[][] cells = new double[distinct][nv];
        String[] names = new String[nv];
        List<Map<String, Object>> maps = new ArrayList<>();
        List<Map<String, Object>> literalMaps = new ArrayList<>();
        for (int v = 0; v < nv; v++) {
            // an equal name, another object: what a service holds after parsing a request
            names[v] = new String(vars.get(v).name().toCharArray());
        }
        for (int k = 0; k < distinct; k++) {
            Map<String, Object> m = new HashMap<>();
            for (int v = 0; v < nv; v++) {
                Variable var = vars.get(v);
                double x = Double.NaN;
                if (rnd.nextInt(4) != 0) {
                    x = var.type().isDiscrete() ? rnd.nextInt(var.type() == VariableType.COUNT ? 6
                            : Math.max(2, var.stateCount())) : 2.0 + rnd.nextDouble() * 2;
                    m.put(names[v], var.states().isEmpty() ? (Object) x : var.states().get((int) x));
                }
                cells[k][v] = x;
            }
            maps.add(m);
            Map<String, Object> literal = new HashMap<>();
            // interned keys: what string literals in the caller's code are
            m.forEach((name, value) -> literal.put(name.intern(), value instanceof String l ? l.intern() : value));
            literalMaps.add(literal);
        }
        Evaluator raw = new Evaluator(model.circuit());
        double[] out = new double[model.outputCount()];
        Row row = model.newRow();
        double[] apiOut = new double[model.outputCount()];
        Scorer engine = k -> {
            raw.logDensity(cells[k], 1, out);
            return out[0];
        };
        Scorer map = k -> model.logDensity(maps.get(k));
        Scorer literal = k -> model.logDensity(literalMaps.get(k));
        Scorer named = k -> {
            double[] c = cells[k];
            for (int v = 0; v < nv; v++) {
                row.set(names[v], c[v]);
            }
            return model.logDensity(row);
        };
        Scorer batch1 = k -> {
            model.logDensity(cells[k], 1, apiOut);
            return apiOut[0];
        };
        Scorer[] scorers = {engine, map, named, batch1, literal};
        for (int k = 0; k < distinct; k++) {
            double a = engine.score(k);
            for (int s = 1; s < scorers.length; s++) {
                if (Double.doubleToLongBits(a) != Double.doubleToLongBits(scorers[s].score(k))) {
                    throw new IllegalStateException(WAYS[s] + " and the engine disagree at row " + k);
                }
            }
        }
        // compiled before the rows per round are chosen, so that the choice is not made on interpreted code
        for (Scorer warm : scorers) {
            long end = cpu() + runNanos * 3;
            for (int i = 0; cpu() < end; i++) {
                for (int j = 0; j < 64; j++) {
                    warm.score((i + j) & mask);
                }
            }
        }
        long t = cpu();
        int probe = 0;
        while (cpu() - t < runNanos / 10) {
            engine.score(probe++ & mask);
        }
        int rows = (int) Math.max(100, Math.min(2_000_000, probe * 10L));
        int warmup = 3;
        double[][] ns = new double[scorers.length][runs];
        double[][] ratio = new double[scorers.length][runs];
        double sink = 0;
        for (int run = 0; run < warmup + runs; run++) {
            // interleaved, so that every way sees the same machine load; the order turns from round to round
            for (int i = 0; i < scorers.length; i++) {
                int s = (i + run) % scorers.length;
                long t0 = cpu();
                for (int r = 0; r < rows; r++) {
                    sink += scorers[s].score(r & mask);
                }
                if (run >= warmup) {
                    ns[s][run - warmup] = (cpu() - t0) / (double) rows;
                }
            }
            if (run >= warmup) {
                for (int s = 0; s < scorers.length; s++) {
                    ratio[s][run - warmup] = ns[s][run - warmup] / ns[0][run - warmup];
                }
            }
        }
        System.out.printf(Locale.ROOT, "%s: %d variables, %d nodes, %d edges; %d rounds of %d rows, cycling over %d "
                + "distinct rows; load average %.1f (checksum %.3f)%n", title, nv, model.circuit().nodeCount(), model.circuit().edgeCount(), runs, rows, distinct, load(), sink);
        System.out.printf(Locale.ROOT, "  %-46s %11s  %-6s %-28s%n", "way", "median ns", "ratio",
                "spread: quartiles [min, max]");
        for (int s = 0; s < scorers.length; s++) {
            double[] r = ratio[s].clone();
            Arrays.sort(r);
            double[] n = ns[s].clone();
            Arrays.sort(n);
            String verdict = s != 0 && s != BATCH ? (quantile(r, 0.5) <= 1.2 ? "  target 1.2: met" : "  target 1.2: NOT met")
                    : "";
            System.out.printf(Locale.ROOT, "  %-46s %11.1f  %-6s %.2f-%.2f [%.2f, %.2f]%s%n", WAYS[s], quantile(n, 0.5),
                    s == 0 ? "1" : String.format(Locale.ROOT, "%.3f", quantile(r, 0.5)), quantile(r, 0.25),
                    quantile(r, 0.75), r[0], r[r.length - 1], verdict);
        }
        return ratio;
    }

    private static double quantile(double[] sorted, double q) {
        double at = q * (sorted.length - 1);
        int lo = (int) Math.floor(at);
        int hi = Math.min(sorted.length - 1, lo + 1);
        return sorted[lo] + (sorted[hi] - sorted[lo]) * (at - lo);
    }

    private static long cpu() {
        return THREADS.getCurrentThreadCpuTime();
    }
}
