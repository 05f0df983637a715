package dev.circa.cli;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.DrawOverflowException;
import dev.circa.format.Variable;
import dev.circa.format.csv.CellValues;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa sample}: ancestral samples as CSV, the same bytes for the same seed everywhere. */
@Command(name = "sample", mixinStandardHelpOptions = true,
        description = {"Draws samples by ancestral sampling, as CSV with one column per variable.",
            "Sum children are picked in proportion to w_ij Z_j, so an unnormalised circuit samples its",
            "normalised distribution. The generator is xoshiro256** seeded through SplitMix64 with one",
            "stream per row: the same seed gives the same bytes on any machine and thread count."})
final class SampleCommand implements Callable<Integer> {
    private static final int CHUNK = 4096;
    /** Most cells held at once (8 MiB of doubles), unless one row alone has more. */
    private static final int CELL_BUDGET = 1 << 20;

    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file.")
    Path circuitFile;

    @Option(names = "-n", required = true, paramLabel = "N", description = "Number of samples.")
    long count;

    @Option(names = "--seed", paramLabel = "S", description = "Seed (default: ${DEFAULT-VALUE}).")
    long seed = 0;

    @Option(names = "--output-name", paramLabel = "NAME", description = "The circuit output to sample (default: the first).")
    String outputName;

    @Mixin
    CsvOutput output;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        if (count < 0) {
            throw new UsageException("-n must be >= 0, got " + count);
        }
        Model model = read.use(circuitFile);
        CompiledCircuit c = model.circuit();
        int outIndex = OutputChoice.index(c, outputName);
        List<Variable> vars = c.variables();
        int nv = vars.size();
        output.write(out -> {
            out.record(vars.stream().map(Variable::name).toArray(String[]::new));
            int chunk = chunkRows(count, nv);
            double[] buf = new double[Math.multiplyExact(chunk, Math.max(1, nv))];
            String[] line = new String[nv];
            for (long first = 0; first < count; first += chunk) {
                int n = (int) Math.min(chunk, count - first);
                try {
                    model.sample(outIndex, seed, first, n, buf);
                } catch (DrawOverflowException e) {
                    throw new UsageException(circuitFile + ": " + e.getMessage().replace("its variable",
                            "variable " + vars.get(e.variable()).name()) + "; nothing written");
                }
                for (int r = 0; r < n; r++) {
                    for (int v = 0; v < nv; v++) {
                        line[v] = CellValues.format(vars.get(v), buf[r * nv + v]);
                    }
                    out.record(line);
                }
            }
        }, count, circuitFile);
        return ExitStatus.OK;
    }

    /** Rows drawn per call: at most {@code count}, {@value #CHUNK}, and {@value #CELL_BUDGET} cells (at least 1). */
    static int chunkRows(long count, int variables) {
        long byBudget = CELL_BUDGET / Math.max(1, variables);
        return (int) Math.max(1, Math.min(Math.min(count, CHUNK), byBudget));
    }
}
