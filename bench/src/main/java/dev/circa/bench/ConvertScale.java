package dev.circa.bench;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.ParameterSource;
import dev.circa.converter.regions.RandomRegions;
import dev.circa.converter.regions.RegionConverter;
import dev.circa.converter.regions.RegionParameters;
import dev.circa.converter.regions.RegionStructure;
import dev.circa.converter.regions.RegionTensorEvaluator;
import dev.circa.converter.regions.RegionVerifier;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.regions.RegionGraph;
import java.lang.management.ManagementFactory;
import java.util.Locale;
import java.util.Map;

/**
 * The cost of a region-graph conversion's numerical proof at about 10^6 and 10^7 edges: one
 * {@link RegionConverter#convert} as {@code circa convert} runs it (compile, engine compile, verification
 * on 3N + 1 rows, N = 1000 as without {@code --verify}, or N set by {@code -Dcirca.points=N}; validation),
 * wall and CPU time per phase, then the two sides of the verification timed alone on the same rows: the region-by-region
 * evaluation ({@link RegionTensorEvaluator}) and the engine ({@link Evaluator}, one thread), each in edge
 * evaluations per CPU second. CPU time is the process's (every thread, garbage collection and the JIT
 * included), so on a loaded machine wall time overstates and CPU time is the figure to compare. Not a test.
 *
 * <p>Run from the repository root (Java 17), one command:
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx6g -cp bench/target/benchmarks.jar dev.circa.bench.ConvertScale [EDGES...]
 * </pre>
 * Default sizes 1000000 10000000: a random region graph of 256 real variables, depth 6 (seed 1), as many
 * repetitions as come closest to the size, K = I = 24, C = 1, parameters from seed 7. The shape can be
 * changed with {@code -Dcirca.vars=V -Dcirca.depth=D -Dcirca.sums=K} (K = I): for example
 * {@code -Dcirca.vars=1024 -Dcirca.depth=7 -Dcirca.sums=4}, the command line's default K and I, gives
 * many small regions, where the leaves' densities weigh most.
 */
public final class ConvertScale {
    private static final int VARS = Integer.getInteger("circa.vars", 256);
    private static final int DEPTH = Integer.getInteger("circa.depth", 6);
    private static final int SUMS = Integer.getInteger("circa.sums", 24);
    /** N: 1000, the command line's default for {@code --verify}. */
    private static final int POINTS = Integer.getInteger("circa.points", 1000);

    private ConvertScale() {
    }

    public static void main(String[] args) throws Exception {
        long[] sizes = args.length == 0 ? new long[] {1_000_000, 10_000_000} : new long[args.length];
        for (int i = 0; i < args.length; i++) {
            sizes[i] = Long.parseLong(args[i]);
        }
        System.out.printf(Locale.ROOT, "%d processors; %d verification points (%d rows); %d variables, depth %d, K = I = %d%n",
                Runtime.getRuntime().availableProcessors(), POINTS, 3 * POINTS + 1, VARS, DEPTH, SUMS);
        for (long size : sizes) {
            run(size);
        }
    }

    private static void run(long target) throws Exception {
        long perTree = edges(2) - edges(1);
        int repeats = (int) Math.max(1, Math.round((target - (edges(1) - perTree)) / (double) perTree));
        RegionGraph g = RandomRegions.generate(RandomRegions.realVariables(VARS), DEPTH, repeats, 1);
        CompileOptions options = new CompileOptions(SUMS, SUMS, 1, Map.of());
        System.gc();
        long w0 = System.nanoTime();
        long c0 = cpu();
        RegionConverter.Result r = RegionConverter.convert(g, options, ParameterSource.seed(7),
                new RegionConverter.Verification(POINTS, 3, 1e-9, 1e-9), ReadLimits.DEFAULT);
        long w1 = System.nanoTime();
        long c1 = cpu();
        long edges = r.circuit().edgeCount();
        System.out.printf(Locale.ROOT, "%n%,d edges (%d repetitions, %,d nodes): %s%n", edges, repeats,
                r.circuit().nodes().size(), r.verification().summary());
        System.out.printf(Locale.ROOT, "  convert: %.2f s wall, %.2f s CPU (compile %.2f s, engine compile + verify %.2f s,"
                + " validate %.2f s, wall)%n", (w1 - w0) / 1e9, (c1 - c0) / 1e9, r.nanos()[0] / 1e9, r.nanos()[1] / 1e9,
                r.nanos()[2] / 1e9);
        RegionParameters p = r.parameters();
        CompiledCircuit compiled = r.compiled();
        r = null;
        System.gc();
        // the verifier's own rows, handed to a timed engine call; the direct side is the rest of the call
        Evaluator engine = new Evaluator(compiled);
        long[] engineTime = new long[2];
        double[][] rows = new double[1][];
        long vw0 = System.nanoTime();
        long vc0 = cpu();
        RegionVerifier.Result v = RegionVerifier.verify(p, (data, n, out) -> {
            rows[0] = data.clone();
            long ew = System.nanoTime();
            long ec = cpu();
            engine.logDensity(data, n, out);
            engineTime[0] = System.nanoTime() - ew;
            engineTime[1] = cpu() - ec;
        }, POINTS, 3, 1e-9, 1e-9);
        long vw1 = System.nanoTime();
        long vc1 = cpu();
        int n = v.points();
        double evals = (double) edges * n;
        System.out.printf(Locale.ROOT, "  verification alone: %.2f s wall, %.2f s CPU; of which the engine on one thread"
                + " %.2f s wall, %.2f s CPU (%.2f G edge evals per CPU s)%n", (vw1 - vw0) / 1e9, (vc1 - vc0) / 1e9,
                engineTime[0] / 1e9, engineTime[1] / 1e9, evals / engineTime[1]);
        RegionTensorEvaluator direct = new RegionTensorEvaluator(p);
        double[] out = new double[n * direct.outputCount()];
        long dw0 = System.nanoTime();
        long dc0 = cpu();
        direct.logDensity(rows[0], n, out);
        long dw1 = System.nanoTime();
        long dc1 = cpu();
        System.out.printf(Locale.ROOT, "  region-by-region evaluation alone, one evaluator: %.2f s wall, %.2f s CPU"
                + " (%.2f G edge evals per CPU s)%n", (dw1 - dw0) / 1e9, (dc1 - dc0) / 1e9, evals / (dc1 - dc0));
        int threads = Runtime.getRuntime().availableProcessors();
        long tw0 = System.nanoTime();
        long tc0 = cpu();
        direct.logDensity(rows[0], n, out, threads);
        long tw1 = System.nanoTime();
        long tc1 = cpu();
        System.out.printf(Locale.ROOT, "  region-by-region evaluation on %d threads (as the verification runs it): %.2f s wall,"
                + " %.2f s CPU%n", threads, (tw1 - tw0) / 1e9, (tc1 - tc0) / 1e9);
    }

    private static long edges(int repeats) throws Exception {
        RegionStructure s = RegionStructure.of(RandomRegions.generate(RandomRegions.realVariables(VARS), DEPTH, repeats, 1));
        return dev.circa.converter.regions.RegionCompiler.compile(RegionParameters.seeded(s,
                new CompileOptions(SUMS, SUMS, 1, Map.of()), 7)).edgeCount();
    }

    private static long cpu() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean()).getProcessCpuTime();
    }
}
