package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.csv.CellRanges;
import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.InputMutator;
import dev.circa.format.io.OwnErrors;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Fuzzing the data CSV of {@code eval} and {@code impute} (issue 8): any bytes give rows whose every
 * cell is a value of its column's variable (NaN for missing), or our own located error naming the
 * file, row and column. {@link #rows} is a Jazzer fuzz test (seed corpus in
 * {@code src/test/resources/dev/circa/cli/DataColumnsFuzzTestInputs/rows/}); the mutation loop runs
 * the same property over 10,000 mutations.
 */
class DataColumnsFuzzTest {
    private static final String FILE = "data.csv";
    private static final List<Variable> VARIABLES = List.of(
            new Variable("inlet_pressure", VariableType.REAL, List.of(), "bar", null),
            new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null),
            new Variable("alarm", VariableType.BINARY, List.of("off", "on"), null, null),
            new Variable("restarts", VariableType.COUNT, List.of(), null, null));
    private static final int CHUNK = 3;

    @FuzzTest(maxDuration = "10m")
    void rows(byte[] input) {
        OwnErrors.modelOrLocatedError(FILE, true, input, DataColumnsFuzzTest::readAll);
    }

    @Test
    void rows_tenThousandMutations_valuesOrLocatedError() throws IOException {
        List<byte[]> corpus = new ArrayList<>();
        corpus.add(Files.readAllBytes(Cli.READINGS));
        corpus.add(utf8("restarts,alarm,valve,inlet_pressure\n0,on,open,3.0\n2,0,1,2.5\n,,,\n12,off,closed,-1e3\n"));
        corpus.add(utf8("valve,alarm\r\n\"half\",\"1\"\r\n# comment\r\nopen,\r\n"));
        InputMutator mutator = new InputMutator(20261203L, corpus);
        int[] outcome = mutator.run(10_000, input -> OwnErrors.modelOrLocatedError(FILE, true, input, DataColumnsFuzzTest::readAll) != null);
        assertTrue(outcome[0] > 500 && outcome[1] > 500, outcome[0] + " files read, " + outcome[1] + " errors");
    }

    /** Reads every row; returns the number of rows. */
    private static Integer readAll(byte[] input) throws Exception {
        InputStreamReader text = new InputStreamReader(new ByteArrayInputStream(input), StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT));
        int nv = VARIABLES.size();
        int total = 0;
        try (CsvReader csv = new CsvReader(text, FILE, ReadLimits.DEFAULT)) {
            DataColumns cols = DataColumns.readHeader(csv, VARIABLES);
            double[] data = new double[CHUNK * nv];
            String[][] cells = new String[CHUNK][cols.header().length];
            int rows;
            while ((rows = cols.readRows(data, cells, CHUNK)) > 0) {
                CellRanges.assertInRange(VARIABLES, data, rows, total);
                total += rows;
            }
        }
        return total;
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
