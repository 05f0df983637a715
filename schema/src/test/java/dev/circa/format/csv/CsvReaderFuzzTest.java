package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertTrue;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.circa.format.Variable;
import dev.circa.format.io.FormatException;
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
 * Fuzzing the CSV reader and the cell values of data and reference files (issue 8): any bytes give
 * records with positions, or our own located {@link FormatException}; every cell is a value of its
 * variable (and formats back to itself) or an {@link IllegalArgumentException} saying what was
 * expected, which the callers locate. Column {@code i} is read as variable {@code i mod 4} of
 * {@link #VARIABLES}, and every cell also as a log-density.
 *
 * <p>{@link #records} is a Jazzer fuzz test (seed corpus in
 * {@code src/test/resources/dev/circa/format/csv/CsvReaderFuzzTestInputs/records/}); the mutation
 * loop runs the same property over 10,000 mutations of the CSV files of {@code fixtures/}.
 */
class CsvReaderFuzzTest {
    private static final String FILE = "fuzz.csv";
    static final List<Variable> VARIABLES = CellRanges.PUMP_STATION;
    private static final ReadLimits TIGHT = ReadLimits.DEFAULT.withMaxString(16);

    @FuzzTest(maxDuration = "10m")
    void records(byte[] input) {
        check(input);
    }

    @Test
    void records_tenThousandMutationsOfFixtures_recordsOrLocatedError() {
        InputMutator mutator = new InputMutator(20261202L, fixtures());
        int[] outcome = mutator.run(10_000, input -> check(input));
        assertTrue(outcome[0] > 1000 && outcome[1] > 100, outcome[0] + " files read, " + outcome[1] + " errors");
    }

    /** The property; returns whether the whole input was read. */
    static boolean check(byte[] input) {
        OwnErrors.modelOrLocatedError(FILE, true, input, b -> readAll(b, TIGHT));
        return OwnErrors.modelOrLocatedError(FILE, true, input, b -> readAll(b, ReadLimits.DEFAULT)) != null;
    }

    private static Integer readAll(byte[] input, ReadLimits limits) throws FormatException {
        InputStreamReader text = new InputStreamReader(new ByteArrayInputStream(input), StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT));
        int records = 0;
        try (CsvReader csv = new CsvReader(text, FILE, limits)) {
            List<String> rec;
            int lastLine = 0;
            while ((rec = csv.next()) != null) {
                if (csv.line() <= lastLine) {
                    throw new AssertionError("record line " + csv.line() + " after line " + lastLine);
                }
                lastLine = csv.line();
                for (int i = 0; i < rec.size(); i++) {
                    if (csv.column(i) <= 0) {
                        throw new AssertionError("field " + i + " has column " + csv.column(i));
                    }
                    checkCell(VARIABLES.get(i % VARIABLES.size()), rec.get(i));
                }
                records++;
            }
        }
        return records;
    }

    /** A cell is a value of {@code v} that formats back to itself, or an IllegalArgumentException with a message. */
    static void checkCell(Variable v, String cell) {
        double value;
        try {
            value = CellValues.parse(v, cell);
        } catch (IllegalArgumentException e) {
            if (e.getMessage() == null || e.getMessage().isBlank()) {
                throw new AssertionError("a rejected cell needs a message", e);
            }
            value = Double.NaN;
            cell = "";
        }
        if (Double.isNaN(value) != cell.isBlank()) {
            throw new AssertionError("cell \"" + cell + "\" of " + v.name() + " gave " + value);
        }
        if (!Double.isNaN(value)) {
            boolean ok = switch (v.type()) {
                case REAL -> Double.isFinite(value);
                case COUNT -> value >= 0 && value == Math.rint(value);
                default -> value >= 0 && value < v.stateCount() && value == Math.rint(value);
            };
            if (!ok) {
                throw new AssertionError("cell \"" + cell + "\" of " + v.name() + " (" + v.type() + ") gave " + value);
            }
            double back = CellValues.parse(v, CellValues.format(v, value));
            if (Double.doubleToLongBits(back) != Double.doubleToLongBits(value)) {
                throw new AssertionError("cell \"" + cell + "\" of " + v.name() + " gave " + value + ", formatted back as " + back);
            }
        }
        try {
            double d = CellValues.parseLogDensity(cell);
            if (Double.isNaN(d) || d == Double.POSITIVE_INFINITY) {
                throw new AssertionError("log-density cell \"" + cell + "\" gave " + d);
            }
        } catch (IllegalArgumentException e) {
            if (e.getMessage() == null || e.getMessage().isBlank()) {
                throw new AssertionError("a rejected log-density needs a message", e);
            }
        }
    }

    /** The CSV files of {@code fixtures/} with a few lines of every variable type. */
    static List<byte[]> fixtures() {
        List<byte[]> l = new ArrayList<>();
        try (Stream<Path> s = Files.walk(Path.of("..", "fixtures"))) {
            for (Path p : s.filter(f -> f.toString().endsWith(".csv")).sorted().toList()) {
                // the first KiB of a dataset is as good a seed as all of it, and keeps the loop fast
                byte[] b = Files.readAllBytes(p);
                l.add(java.util.Arrays.copyOf(b, Math.min(b.length, 1024)));
            }
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
        l.add(("inlet_pressure,valve,alarm,restarts\n3.0,open,1,0\n2.1,,0,3\n\"1e-3\",2,,12\n"
                + "# comment\r\n-0.5,\"half\",1,\r\n").getBytes(StandardCharsets.UTF_8));
        return l;
    }
}
