package dev.circa.validator.regression;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CheckCase;
import dev.circa.format.CircuitDocument;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.csv.CellValues;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * A regression check of one compiled circuit against reference log-densities from any number of
 * sources: the embedded {@code checks} of its document and reference CSV files. Reference sets are
 * evaluated in chunks of at most {@link #CHUNK} rows (fewer for very wide circuits, so a chunk holds
 * about {@link #CHUNK_CELLS} numbers), so memory stays bounded whatever their length; call
 * {@link #report()} at the end. Not thread-safe.
 */
public final class RegressionCheck {
    /** Rows evaluated at once. */
    public static final int CHUNK = 4096;
    /** Numbers (data cells plus outputs) a chunk holds at most, unless a single row needs more. */
    public static final int CHUNK_CELLS = 1 << 20;

    private final CompiledCircuit circuit;
    private final Evaluator evaluator;
    private final ReportBuilder report;
    private final List<String> outputNames;
    private final double[] data;
    private final double[] out;
    private final int chunk;
    private final int[] output;
    private final double[] expected;
    private final long[] lines;
    private final long[] rowNumbers;

    /** A check of {@code circuit} with {@code tolerance} (see {@link Tolerance#resolve}). */
    public RegressionCheck(CompiledCircuit circuit, Tolerance tolerance) {
        this(circuit, tolerance, null);
    }

    /** A check of {@code circuit} with {@code tolerance} that also hands every case to {@code sink} (may be {@code null}). */
    public RegressionCheck(CompiledCircuit circuit, Tolerance tolerance, CaseSink sink) {
        this.circuit = circuit;
        this.evaluator = new Evaluator(circuit);
        List<String> names = new ArrayList<>();
        for (int o = 0; o < circuit.outputCount(); o++) {
            names.add(circuit.outputName(o));
        }
        this.outputNames = List.copyOf(names);
        this.report = new ReportBuilder(tolerance, outputNames, sink);
        int width = Math.max(1, circuit.variableCount() + circuit.outputCount());
        this.chunk = Math.max(1, Math.min(CHUNK, CHUNK_CELLS / width));
        this.data = new double[chunk * Math.max(1, circuit.variableCount())];
        this.out = new double[chunk * circuit.outputCount()];
        this.output = new int[chunk];
        this.expected = new double[chunk];
        this.lines = new long[chunk];
        this.rowNumbers = new long[chunk];
    }

    /**
     * Checks the embedded cases of {@code doc} (the document {@code circuit} was compiled from); does
     * nothing when it has none.
     *
     * @throws FormatException when a case names an unknown output or variable, or gives a value
     *     that is not one of its variable (located at the case)
     */
    public void checkEmbedded(CircuitDocument doc) throws FormatException {
        if (doc.checks() == null) {
            return;
        }
        String file = doc.source() != null ? doc.source() : "<circuit>";
        List<Variable> vars = circuit.variables();
        Map<String, Integer> byName = new HashMap<>();
        for (int i = 0; i < vars.size(); i++) {
            byName.put(vars.get(i).name(), i);
        }
        int nv = vars.size();
        double[] row = new double[Math.max(1, nv)];
        double[] result = new double[circuit.outputCount()];
        List<CheckCase> cases = doc.checks().cases();
        for (int k = 0; k < cases.size(); k++) {
            CheckCase cc = cases.get(k);
            String ptr = "/checks/cases/" + k;
            SourceLocation at = doc.location(ptr);
            int o = 0;
            if (cc.output() != null) {
                o = circuit.outputIndex(cc.output());
                if (o < 0) {
                    throw new FormatException(file, at.line(), at.column(), ptr + "/output", "check case " + k
                            + " names output \"" + cc.output() + "\", which the circuit does not have; expected one of "
                            + String.join(", ", outputNames));
                }
            }
            Arrays.fill(row, Double.NaN);
            for (Map.Entry<String, Object> e : cc.values().entrySet()) {
                Integer v = byName.get(e.getKey());
                String vp = ptr + "/values/" + e.getKey();
                if (v == null) {
                    throw new FormatException(file, at.line(), at.column(), vp, "check case " + k + " gives a value for \""
                            + e.getKey() + "\", which is not a variable of the circuit");
                }
                try {
                    row[v] = value(vars.get(v), e.getValue());
                } catch (IllegalArgumentException ex) {
                    throw new FormatException(file, at.line(), at.column(), vp, "check case " + k + ": " + ex.getMessage());
                }
            }
            evaluator.logDensity(row, 1, result);
            report.add(file, k + 1, at.line(), ptr, o, cc.logDensity(), result[o]);
        }
    }

    private static double value(Variable v, Object value) {
        if (value instanceof String s) {
            if (s.isBlank()) {
                throw new IllegalArgumentException("an empty value for " + v.name() + "; leave the variable out to marginalise it");
            }
            return CellValues.parse(v, s);
        }
        double d = ((Number) value).doubleValue();
        if (!Double.isFinite(d)) {
            throw new IllegalArgumentException("the value of " + v.name() + " is not finite");
        }
        if (v.type() == VariableType.REAL) {
            return d;
        }
        boolean integral = d == Math.rint(d);
        if (!integral || d < 0 || (v.type() != VariableType.COUNT && d >= v.stateCount())) {
            throw new IllegalArgumentException(String.format(Locale.ROOT, "%s is not a value of %s; expected %s",
                    Double.toString(d), v.name(), v.type() == VariableType.COUNT ? "a count (0, 1, 2, ...)"
                            : "a state index from 0 to " + (v.stateCount() - 1)));
        }
        return d;
    }

    /** Checks every row of the reference set {@code file}. */
    public void checkReference(Path file, ReadLimits limits) throws FormatException {
        try (ReferenceSetReader r = ReferenceSetReader.open(file, circuit.variables(), outputNames, limits)) {
            checkReference(r);
        }
    }

    /** Checks every remaining row of {@code reader} (opened over this circuit's variables and outputs). */
    public void checkReference(ReferenceSetReader reader) throws FormatException {
        long first = reader.rowsRead() + 1;
        int rows;
        while ((rows = reader.read(data, output, expected, lines, chunk)) > 0) {
            for (int r = 0; r < rows; r++) {
                rowNumbers[r] = first + r;
            }
            checkRows(reader.file(), rowNumbers, data, output, expected, lines, rows);
            first += rows;
        }
    }

    /** The most rows {@link #checkRows} takes at once. */
    public int chunkRows() {
        return chunk;
    }

    /**
     * Checks rows already in the engine's layout (for readers of other file forms).
     *
     * @param source the file the rows come from, as reports name it
     * @param rowNumbers input: the 1-based row number of each row in {@code source}
     * @param rowData input: row-major, {@code rows} x variable count, NaN for missing
     * @param rowOutput input: the output index of each row
     * @param rowExpected input: the reference log-density of each row
     * @param rowLines input: the line of each row in {@code source}, or 0 when the form has no lines
     * @param rows the number of rows, at most {@link #chunkRows()}
     */
    public void checkRows(String source, long[] rowNumbers, double[] rowData, int[] rowOutput, double[] rowExpected,
                          long[] rowLines, int rows) {
        if (rows > chunk) {
            throw new IllegalArgumentException(rows + " rows at once; at most " + chunk);
        }
        int no = circuit.outputCount();
        evaluator.logDensity(rowData, rows, out);
        for (int r = 0; r < rows; r++) {
            report.add(source, rowNumbers[r], rowLines[r], null, rowOutput[r], rowExpected[r], out[r * no + rowOutput[r]]);
        }
    }

    /**
     * Adds the reports of checks of disjoint stretches of one source, run elsewhere with this check's
     * circuit and tolerance (a distributed check): counts and largest errors add up, and the worst
     * cases are taken in row order, so the result equals one check of the whole source.
     */
    public void include(List<CheckReport> parts) {
        List<CaseResult> candidates = new ArrayList<>();
        for (CheckReport part : parts) {
            report.merge(part);
            candidates.addAll(part.worst());
        }
        candidates.sort(java.util.Comparator.comparingLong(CaseResult::row));
        for (CaseResult c : candidates) {
            report.offer(c);
        }
    }

    /** The report of every case checked so far. */
    public CheckReport report() {
        return report.build();
    }
}
