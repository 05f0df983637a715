package dev.circa.bench;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
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
 * Time to read a circuit file with {@link CircuitReader}, over circuit sizes; the file is generated
 * once per trial with a fixed seed ({@link CircuitFileGenerator}).
 *
 * <p>Run from the repository root:
 * <pre>
 * mvn -B -q package -pl bench -am -DskipTests &amp;&amp; java -Xmx1g -jar bench/target/benchmarks.jar ReadBenchmark
 * </pre>
 * ({@code -p nodes=1000000} for one size only; {@code -h} lists JMH's options).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(value = 1, jvmArgsAppend = "-Xmx1g")
public class ReadBenchmark {
    @Param({"10000", "100000", "1000000"})
    public int nodes;

    private Path dir;
    private Path file;
    private final CircuitReader reader = new CircuitReader();

    @Setup(Level.Trial)
    public void generate() throws IOException {
        dir = Files.createTempDirectory("circa-read-bench");
        file = dir.resolve("synthetic.json");
        CircuitFileGenerator.write(file, nodes, 20261201L);
    }

    @TearDown(Level.Trial)
    public void delete() throws IOException {
        Files.deleteIfExists(file);
        Files.deleteIfExists(dir);
    }

    @Benchmark
    public CircuitDocument read() throws IOException {
        return reader.read(file);
    }
}
