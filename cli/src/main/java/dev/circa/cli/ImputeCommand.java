package dev.circa.cli;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.csv.CellValues;
import dev.circa.format.csv.CsvReader;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa impute}: missing cells filled with their most probable values (MPE). */
@Command(name = "impute", mixinStandardHelpOptions = true,
        description = {"Fills each row's missing cells with their most probable values (MPE by max-product",
            "with backtracking over every unobserved variable). The result is exact when the circuit is",
            "deterministic; circa says on standard error whether it is."})
final class ImputeCommand implements Callable<Integer> {
    private static final int CHUNK = 1024;

    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file.")
    Path circuitFile;

    @Mixin
    DataOption data;

    @Option(names = "--output-name", paramLabel = "NAME", description = "The circuit output to use (default: the first).")
    String outputName;

    @Mixin
    CsvOutput output;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        Model model = read.use(circuitFile);
        CompiledCircuit c = model.circuit();
        int outIndex = OutputChoice.index(c, outputName);
        int nv = c.variableCount();
        // every processor explains its share of each chunk (a row's explanation is the same on any thread)
        try (CsvReader csv = CsvReader.open(data.file, read.limits()); BatchRunner runner = BatchRunner.onAllProcessors(c)) {
            DataColumns cols = DataColumns.readHeader(csv, c.variables());
            String[] header = cols.header();
            output.write(out -> {
                out.record(header);
                double[] data = new double[CHUNK * nv];
                double[] filled = new double[CHUNK * nv];
                double[] logValue = new double[CHUNK];
                String[][] cells = new String[CHUNK][header.length];
                String[] line = new String[header.length];
                int rows;
                while ((rows = cols.readRows(data, cells, CHUNK)) > 0) {
                    runner.mpe(data, rows, outIndex, filled, logValue);
                    for (int r = 0; r < rows; r++) {
                        for (int col = 0; col < header.length; col++) {
                            int v = cols.variableOf(col);
                            line[col] = cells[r][col].isBlank()
                                    ? CellValues.format(c.variables().get(v), filled[r * nv + v]) : cells[r][col];
                        }
                        out.record(line);
                    }
                }
            }, circuitFile, data.file);
        }
        read.err().println(model.mpeExact()
                ? "circa impute: exact (the circuit is deterministic, so max-product gives the most probable explanation)"
                : "circa impute: approximate (the circuit is not proven deterministic; max-product gives a lower bound "
                        + "of the most probable explanation, not necessarily the exact one)");
        return ExitStatus.OK;
    }
}
