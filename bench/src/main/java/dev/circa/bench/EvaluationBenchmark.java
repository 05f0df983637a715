package dev.circa.bench;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.engine.Sampler;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Evaluation of region-graph circuits ({@link RegionGraphWorkload}, seeded) over circuit sizes, batch sizes,
 * the two evaluation paths and thread counts: {@link #evaluate} is one call of log-density (or a marginal
 * with half the cells missing, or a conditional given half the variables) on {@code batch} rows, spread
 * over {@code split} threads by a {@link BatchRunner}; run with JMH's {@code -t 2} and {@code split = 1}
 * for two independent callers. {@link #sample} draws {@code batch} rows. Edge evaluations per second are
 * ops/s x batch x edges.
 *
 * <p>Run from the repository root (bench/run runs it with the parameters of its table):
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -jar bench/target/benchmarks.jar EvaluationBenchmark -p edges=1000000 -p batch=1024
 * </pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 1, time = 1)
@Measurement(iterations = 2, time = 1)
@Fork(value = 1, jvmArgsAppend = "-Xmx3g")
public class EvaluationBenchmark {
    /** Data seed of every benchmark row set. */
    static final long DATA_SEED = 20261202L;
    /** Circuit seed. */
    static final long CIRCUIT_SEED = 20261201L;

    @Param({"1000000"})
    public long edges;

    @Param({"1", "64", "1024"})
    public int batch;

    @Param({"AUTOMATIC", "GENERIC"})
    public String path;

    @Param({"density"})
    public String query;

    @Param({"1"})
    public int split;

    CompiledCircuit circuit;
    double[] data;
    boolean[] given;

    @Setup(Level.Trial)
    public void build() throws CompileException {
        circuit = CompiledCircuit.compile(RegionGraphWorkload.build(RegionGraphWorkload.repetitionsFor(edges), CIRCUIT_SEED));
        data = RegionGraphWorkload.rows(batch, query.equals("marginal") ? 0.5 : 0, DATA_SEED);
        given = new boolean[circuit.variableCount()];
        for (int v = 0; v < given.length; v += 2) {
            given[v] = true;
        }
    }

    /** One evaluator (or runner) per benchmark thread. */
    @State(Scope.Thread)
    public static class Worker {
        BatchRunner runner;
        Sampler sampler;
        double[] out;

        @Setup(Level.Trial)
        public void create(EvaluationBenchmark b) {
            runner = new BatchRunner(b.circuit, b.split, Evaluator.Mode.valueOf(b.path));
            sampler = new Sampler(b.circuit, 7);
            out = new double[b.batch * Math.max(b.circuit.outputCount(), b.circuit.variableCount())];
        }

        @TearDown(Level.Trial)
        public void close() {
            runner.close();
        }
    }

    @Benchmark
    public double[] evaluate(Worker w) {
        if (query.equals("conditional")) {
            w.runner.conditional(data, batch, given, w.out);
        } else {
            w.runner.logDensity(data, batch, w.out);
        }
        return w.out;
    }

    @Benchmark
    public double[] sample(Worker w) {
        w.sampler.sample(0, batch, w.out);
        return w.out;
    }
}
