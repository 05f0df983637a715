package dev.circa.validator.regression;

import dev.circa.format.Counts;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.csv.CellValues;
import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Streams the rows of a reference set (FORMAT.md section 5) into the engine's row-major layout: a
 * header of variable names (any subset, any order), {@code log_density} and optionally {@code output}
 * (an output's name, else its 0-based index; the first output when absent or empty). Every problem is
 * a {@link FormatException} naming the file, line and column. Not thread-safe.
 */
public final class ReferenceSetReader implements AutoCloseable {
    /** The reserved column of reference log-densities. */
    public static final String LOG_DENSITY = "log_density";
    /** The reserved column naming the output of a row. */
    public static final String OUTPUT = "output";

    private final CsvReader csv;
    private final List<Variable> variables;
    private final List<String> outputNames;
    private final Map<String, Integer> outputByName = new HashMap<>();
    private final int[] variableOfColumn;
    private final int width;
    private final int densityColumn;
    private final int outputColumn;
    private long rows;
    private boolean ended;

    /**
     * Reads the header of {@code csv}.
     *
     * @param variables the circuit's variables
     * @param outputNames the circuit's output names in order
     * @throws FormatException for a missing header, an unknown or repeated column, a missing
     *     {@code log_density}, or a variable whose name is reserved
     */
    public ReferenceSetReader(CsvReader csv, List<Variable> variables, List<String> outputNames) throws FormatException {
        this(csv, variables, outputNames, 0);
    }

    /**
     * Reads the header of {@code csv}, whose data rows follow {@code rowsBefore} rows of the same
     * reference set read elsewhere (a distributed reader's stretch of the file): rows are numbered from
     * {@code rowsBefore + 1}.
     */
    public ReferenceSetReader(CsvReader csv, List<Variable> variables, List<String> outputNames, long rowsBefore)
            throws FormatException {
        this.rows = rowsBefore;
        this.csv = csv;
        this.variables = List.copyOf(variables);
        this.outputNames = List.copyOf(outputNames);
        for (int o = 0; o < outputNames.size(); o++) {
            outputByName.putIfAbsent(outputNames.get(o), o);
        }
        List<String> header = csv.next();
        if (header == null) {
            throw new FormatException(csv.file(), 1, 1, null,
                    "the file is empty; expected a header of variable names, log_density and optionally output");
        }
        Map<String, Integer> byName = new HashMap<>();
        for (int i = 0; i < variables.size(); i++) {
            String n = variables.get(i).name();
            if (n.equals(LOG_DENSITY) || n.equals(OUTPUT)) {
                throw csv.error(0, "the circuit has a variable named \"" + n
                        + "\", a reserved column name of reference sets; rename the variable");
            }
            byName.put(n, i);
        }
        width = header.size();
        variableOfColumn = new int[width];
        boolean[] seen = new boolean[variables.size()];
        int density = -1;
        int output = -1;
        for (int c = 0; c < width; c++) {
            // names exactly as written (quoted or not): " a" and "a" may be two variables
            String name = header.get(c);
            if (c == 0 && name.startsWith("\uFEFF")) {
                // a byte-order mark, as spreadsheet programs write at the start of UTF-8 CSV files
                name = name.substring(1);
            }
            if (name.equals(LOG_DENSITY) || name.equals(OUTPUT)) {
                if ((name.equals(LOG_DENSITY) ? density : output) >= 0) {
                    throw csv.error(c, "column \"" + name + "\" appears twice");
                }
                variableOfColumn[c] = -1;
                if (name.equals(LOG_DENSITY)) {
                    density = c;
                } else {
                    output = c;
                }
                continue;
            }
            Integer v = byName.get(name);
            if (v == null) {
                throw csv.error(c, "unknown column \"" + header.get(c) + "\"; expected log_density, output or a variable of the circuit ("
                        + String.join(", ", variables.stream().map(Variable::name).toList()) + ")");
            }
            if (seen[v]) {
                throw csv.error(c, "column \"" + name + "\" appears twice");
            }
            seen[v] = true;
            variableOfColumn[c] = v;
        }
        if (density < 0) {
            throw csv.error(0, "the header has no log_density column; expected variable names, log_density and optionally output");
        }
        densityColumn = density;
        outputColumn = output;
    }

    /** Opens {@code file} ({@code .gz} decompressed, {@code -} for standard input) and reads its header. */
    public static ReferenceSetReader open(Path file, List<Variable> variables, List<String> outputNames, ReadLimits limits)
            throws FormatException {
        CsvReader csv = CsvReader.open(file, limits);
        try {
            return new ReferenceSetReader(csv, variables, outputNames);
        } catch (FormatException e) {
            csv.close();
            throw e;
        }
    }

    /** The file name used in messages and reports. */
    public String file() {
        return csv.file();
    }

    /** Data rows read so far. */
    public long rowsRead() {
        return rows;
    }

    /**
     * Reads up to {@code max} rows.
     *
     * @param data output: row-major, {@code max} x variable count; NaN for a missing or absent variable
     * @param output output: the output index of each row
     * @param expected output: the reference log-density of each row
     * @param lines output: the line on which each row starts
     * @return the number of rows read, 0 at the end of the file
     * @throws FormatException for a row of the wrong width or a cell that is not a value of its column
     */
    public int read(double[] data, int[] output, double[] expected, long[] lines, int max) throws FormatException {
        int nv = variables.size();
        int r = 0;
        while (r < max && !ended) {
            List<String> rec = csv.next();
            if (rec == null) {
                ended = true;
                break;
            }
            if (rec.size() != width) {
                throw csv.error(Math.max(0, Math.min(rec.size(), width) - 1),
                        "row " + (rows + 1) + " has " + Counts.of(rec.size(), "field") + "; expected " + width + " as in the header");
            }
            Arrays.fill(data, r * nv, r * nv + nv, Double.NaN);
            output[r] = 0;
            for (int c = 0; c < width; c++) {
                String cell = rec.get(c);
                if (c == densityColumn) {
                    checkNumberLength(cell, c, LOG_DENSITY);
                    try {
                        expected[r] = CellValues.parseLogDensity(cell);
                    } catch (IllegalArgumentException e) {
                        throw csv.error(c, "row " + (rows + 1) + ", column log_density: " + e.getMessage());
                    }
                } else if (c == outputColumn) {
                    output[r] = outputOf(cell, c);
                } else {
                    int v = variableOfColumn[c];
                    VariableType type = variables.get(v).type();
                    if (type == VariableType.REAL || type == VariableType.COUNT) {
                        checkNumberLength(cell, c, variables.get(v).name());
                    }
                    try {
                        data[r * nv + v] = CellValues.parse(variables.get(v), cell);
                    } catch (IllegalArgumentException e) {
                        throw csv.error(c, "row " + (rows + 1) + ", column " + variables.get(v).name() + ": " + e.getMessage());
                    }
                }
            }
            lines[r] = csv.line();
            rows++;
            r++;
        }
        return r;
    }

    /** A numeric cell longer than {@code --max-number} is a named limit, as in every other reader. */
    private void checkNumberLength(String cell, int c, String column) throws FormatException {
        int length = cell.strip().length();
        if (length > csv.limits().maxNumber()) {
            throw LimitExceededException.of(csv.file(), csv.line(), csv.column(c), null, "column " + column + ": a number of "
                    + length + " characters", ReadLimits.MAX_NUMBER, csv.limits().maxNumber());
        }
    }

    private int outputOf(String cell, int c) throws FormatException {
        // an output's name exactly as written first, as a label: " a" and "a" may be two outputs
        Integer exact = outputByName.get(cell);
        if (exact != null) {
            return exact;
        }
        String s = cell.strip();
        if (s.isEmpty()) {
            return 0;
        }
        Integer o = outputByName.get(s);
        if (o != null) {
            return o;
        }
        if (s.matches("[0-9]{1,9}")) {
            int k = Integer.parseInt(s);
            if (k < outputNames.size()) {
                return k;
            }
        }
        throw csv.error(c, "row " + (rows + 1) + ", column output: \"" + cell + "\" is not an output; expected one of "
                + String.join(", ", outputNames) + " or an index from 0 to " + (outputNames.size() - 1));
    }

    @Override
    public void close() throws FormatException {
        csv.close();
    }
}
