package dev.circa.bench;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.GridRegions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.engine.Evaluator;
import dev.circa.format.Variable;
import dev.circa.model.Model;
import dev.circa.model.Row;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Per-row latency of scoring one named row through the model API against the raw engine call at batch 1
 * ({@code new Evaluator(circuit).logDensity(cells, 1, out)} on cells encoded beforehand), on one thread.
 * Three ways through the API: a reused {@link Row} set by name for every row, a prebuilt {@link Map}
 * per row, and the API's batch call at batch 1 on the same cells as the raw call. Each figure is the
 * median of 15 timed runs of about 0.1 s each (after 5 warm-up runs), rows drawn from 256 seeded rows
 * with a quarter of the values missing. Target: the named row within 1.2x of the raw call.
 *
 * <p>Two models: the FORMAT.md example (fixtures/circuits/pump-station.json, 7 nodes, where the
 * per-call overhead is most visible) and a 4x4 grid region graph compiled with 8 sums and 8 input
 * bundles (seed 1). Run from the repository root (Java 17):
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -cp bench/target/benchmarks.jar dev.circa.bench.ModelLatency
 * </pre>
 */
public final class ModelLatency {
    private static final int DISTINCT = 256;
    /** Target length of one timed run. */
    private static final long RUN_NANOS = 100_000_000L;
    private static final int WARMUP = 5;
    private static final int RUNS = 15;

    private ModelLatency() {
    }

    /** The benchmark: prints one block per model. */
    public static void main(String[] args) throws Exception {
        measure("FORMAT.md example (pump station)", Model.load(Path.of("fixtures", "circuits", "pump-station.json")));
        CompileOptions grid = new CompileOptions(8, 8, 1, CompileOptions.defaults().families());
        measure("4x4 grid region graph, 8 sums, 8 bundles",
                Model.loader().load(RegionCompiler.compile(GridRegions.generate(4, 4), grid, 1L)));
    }

    private interface Scorer {
        double score(int k);
    }

    private static void measure(String title, Model model) {
        List<Variable> vars = model.variables();
        int nv = vars.size();
        SplittableRandom rnd = new SplittableRandom(20261202L);
        double[][] cells = new double[DISTINCT][nv];
        String[] names = new String[nv];
        List<Map<String, Object>> maps = new java.util.ArrayList<>();
        for (int v = 0; v < nv; v++) {
            names[v] = vars.get(v).name();
        }
        for (int k = 0; k < DISTINCT; k++) {
            Map<String, Object> m = new HashMap<>();
            for (int v = 0; v < nv; v++) {
                Variable var = vars.get(v);
                double x = Double.NaN;
                if (rnd.nextInt(4) != 0) {
                    x = var.type().isDiscrete() ? rnd.nextInt(Math.max(2, var.stateCount())) : 2.0 + rnd.nextDouble() * 2;
                    m.put(names[v], var.states().isEmpty() ? (Object) x : var.states().get((int) x));
                }
                cells[k][v] = x;
            }
            maps.add(m);
        }
        Evaluator raw = new Evaluator(model.circuit());
        double[] out = new double[model.outputCount()];
        Row row = model.newRow();
        double[] apiOut = new double[model.outputCount()];
        Scorer engine = k -> {
            raw.logDensity(cells[k], 1, out);
            return out[0];
        };
        Scorer named = k -> {
            double[] c = cells[k];
            for (int v = 0; v < nv; v++) {
                row.set(names[v], c[v]);
            }
            return model.logDensity(row);
        };
        Scorer map = k -> model.logDensity(maps.get(k));
        Scorer batch1 = k -> {
            model.logDensity(cells[k], 1, apiOut);
            return apiOut[0];
        };
        for (int k = 0; k < DISTINCT; k++) {
            double a = engine.score(k);
            for (Scorer s : new Scorer[] {named, map, batch1}) {
                if (Double.doubleToLongBits(a) != Double.doubleToLongBits(s.score(k))) {
                    throw new IllegalStateException("the API and the engine disagree at row " + k);
                }
            }
        }
        long t = System.nanoTime();
        for (int i = 0; i < 2000; i++) {
            engine.score(i & (DISTINCT - 1));
        }
        int rows = (int) Math.max(1000, Math.min(1_000_000, RUN_NANOS * 2000 / Math.max(1, System.nanoTime() - t)));
        Scorer[] scorers = {engine, named, map, batch1};
        double[][] ns = new double[scorers.length][RUNS];
        double sink = 0;
        for (int run = 0; run < WARMUP + RUNS; run++) {
            // interleaved, so that every way sees the same machine load
            for (int s = 0; s < scorers.length; s++) {
                long t0 = System.nanoTime();
                for (int i = 0; i < rows; i++) {
                    sink += scorers[s].score(i & (DISTINCT - 1));
                }
                if (run >= WARMUP) {
                    ns[s][run - WARMUP] = (System.nanoTime() - t0) / (double) rows;
                }
            }
        }
        double[] median = new double[scorers.length];
        for (int s = 0; s < scorers.length; s++) {
            Arrays.sort(ns[s]);
            median[s] = ns[s][RUNS / 2];
        }
        System.out.printf(Locale.ROOT, "%s: %d variables, %d nodes, %d edges; %d rows per run (checksum %.3f)%n",
                title, nv, model.circuit().nodeCount(), model.circuit().edgeCount(), rows, sink);
        System.out.printf(Locale.ROOT, "  raw engine, Evaluator.logDensity at batch 1   %9.1f ns/row%n", median[0]);
        System.out.printf(Locale.ROOT, "  API, reused Row set by name                   %9.1f ns/row  ratio %.2f%n", median[1], median[1] / median[0]);
        System.out.printf(Locale.ROOT, "  API, Map by name                              %9.1f ns/row  ratio %.2f%n", median[2], median[2] / median[0]);
        System.out.printf(Locale.ROOT, "  API, batch call at batch 1 (cells)            %9.1f ns/row  ratio %.2f%n", median[3], median[3] / median[0]);
    }
}
