package dev.circa.cli;

import dev.circa.engine.BatchRunner;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.csv.CellValues;
import dev.circa.format.csv.CsvReader;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa eval}: the log-density of each data row, or a conditional given some columns. */
@Command(name = "eval", mixinStandardHelpOptions = true,
        description = {"Log-density of each row of a data CSV (header = variable names, empty cell = missing,",
            "categorical cells by label or index); missing cells are marginalised. With --given, the",
            "conditional log p(rest of the row | the given columns). Writes the data columns, then",
            "log_density (one output) or log_density:<output> (several); -inf where the density is zero."})
final class EvalCommand implements Callable<Integer> {
    private static final int CHUNK = 1024;

    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file (.json or .json.gz).")
    Path circuitFile;

    @Mixin
    DataOption data;

    @Option(names = "--given", split = ",", paramLabel = "COLS", description = "Columns to condition on (comma-separated).")
    List<String> given = new ArrayList<>();

    @Mixin
    CsvOutput output;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        Model model = read.use(circuitFile);
        CompiledCircuit c = model.circuit();
        int nv = c.variableCount();
        int no = c.outputCount();
        // every processor evaluates its share of each chunk (a row's value is the same on any thread)
        try (CsvReader csv = CsvReader.open(data.file, read.limits()); BatchRunner runner = BatchRunner.onAllProcessors(c)) {
            DataColumns cols = DataColumns.readHeader(csv, c.variables());
            boolean[] givenMask = new boolean[nv];
            for (String g : given) {
                int col = cols.columnOf(g);
                if (col < 0) {
                    throw new UsageException("--given names \"" + g + "\", which is not a column of " + data.file);
                }
                givenMask[cols.variableOf(col)] = true;
            }
            String[] header = cols.header();
            output.write(out -> {
                String[] names = Arrays.copyOf(header, header.length + no);
                for (int o = 0; o < no; o++) {
                    names[header.length + o] = no == 1 ? "log_density" : "log_density:" + c.outputName(o);
                }
                out.record(names);
                double[] data = new double[CHUNK * nv];
                double[] result = new double[CHUNK * no];
                String[][] cells = new String[CHUNK][header.length];
                String[] line = new String[header.length + no];
                int rows;
                while ((rows = cols.readRows(data, cells, CHUNK)) > 0) {
                    if (given.isEmpty()) {
                        runner.logDensity(data, rows, result);
                    } else {
                        runner.conditional(data, rows, givenMask, result);
                    }
                    for (int r = 0; r < rows; r++) {
                        System.arraycopy(cells[r], 0, line, 0, header.length);
                        for (int o = 0; o < no; o++) {
                            line[header.length + o] = CellValues.formatLogDensity(result[r * no + o]);
                        }
                        out.record(line);
                    }
                }
            }, circuitFile, data.file);
        }
        return ExitStatus.OK;
    }
}
