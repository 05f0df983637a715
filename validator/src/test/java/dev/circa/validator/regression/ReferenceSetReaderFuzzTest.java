package dev.circa.validator.regression;

import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.csv.CellRanges;
import dev.circa.format.Variable;
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
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Fuzzing the reference CSV reader (FORMAT.md section 5; issue 8): any bytes give rows whose cells
 * are values of their variables, an output index in range and a log-density that is finite or
 * -inf, or our own located {@code FormatException}. {@link #rows} is a Jazzer fuzz test (seed corpus
 * in {@code src/test/resources/dev/circa/validator/regression/ReferenceSetReaderFuzzTestInputs/rows/});
 * the mutation loop runs the property over 10,000 mutations of reference files.
 */
class ReferenceSetReaderFuzzTest {
    private static final String FILE = "reference.csv";
    private static final List<Variable> VARIABLES = CellRanges.PUMP_STATION;
    private static final List<String> OUTPUTS = List.of("joint", "regime");
    private static final int CHUNK = 3;

    @FuzzTest(maxDuration = "10m")
    void rows(byte[] input) {
        OwnErrors.modelOrLocatedError(FILE, true, input, ReferenceSetReaderFuzzTest::readAll);
    }

    @Test
    void rows_tenThousandMutations_valuesOrLocatedError() throws IOException {
        InputMutator mutator = new InputMutator(20261208L, corpus());
        int[] outcome = mutator.run(10_000, input -> OwnErrors.modelOrLocatedError(FILE, true, input, ReferenceSetReaderFuzzTest::readAll) != null);
        assertTrue(outcome[0] > 100 && outcome[1] > 500, outcome[0] + " files read, " + outcome[1] + " errors");
    }

    private static Long readAll(byte[] input) throws Exception {
        InputStreamReader text = new InputStreamReader(new ByteArrayInputStream(input), StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT));
        int nv = VARIABLES.size();
        long total = 0;
        try (ReferenceSetReader ref = new ReferenceSetReader(new CsvReader(text, FILE, ReadLimits.DEFAULT), VARIABLES, OUTPUTS)) {
            double[] data = new double[CHUNK * nv];
            int[] output = new int[CHUNK];
            double[] expected = new double[CHUNK];
            long[] lines = new long[CHUNK];
            int rows;
            while ((rows = ref.read(data, output, expected, lines, CHUNK)) > 0) {
                for (int r = 0; r < rows; r++) {
                    if (output[r] < 0 || output[r] >= OUTPUTS.size() || Double.isNaN(expected[r])
                            || expected[r] == Double.POSITIVE_INFINITY || lines[r] <= 0) {
                        throw new AssertionError("row " + (total + r) + ": output " + output[r] + ", log-density " + expected[r]
                                + ", line " + lines[r]);
                    }
                }
                CellRanges.assertInRange(VARIABLES, data, rows, total);
                total += rows;
            }
        }
        return total;
    }

    /** Reference files: the examples of FORMAT.md section 5 and those of {@code fixtures/} with a log_density column. */
    static List<byte[]> corpus() throws IOException {
        List<byte[]> l = new ArrayList<>();
        l.add("inlet_pressure,valve,log_density\n3.0,open,0.18261296103078395\n2.1,,-2.1428574782131147\n"
                .getBytes(StandardCharsets.UTF_8));
        l.add("# every column\noutput,restarts,alarm,valve,inlet_pressure,log_density\nregime,0,1,half,3.5,-inf\n1,2,,0,,-1e3\n"
                .getBytes(StandardCharsets.UTF_8));
        try (Stream<Path> s = Files.walk(Path.of("..", "fixtures"))) {
            for (Path p : s.filter(f -> f.toString().endsWith(".csv")).sorted().toList()) {
                byte[] b = Files.readAllBytes(p);
                if (new String(b, StandardCharsets.UTF_8).contains("log_density")) {
                    l.add(b);
                }
            }
        }
        return l;
    }
}
