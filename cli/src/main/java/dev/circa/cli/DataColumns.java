package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.csv.CellValues;
import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The header of a data CSV mapped onto a circuit's variables (header = variable names, any subset,
 * any order), and the parsing of its rows into the engine's row-major layout (NaN = missing).
 */
final class DataColumns {
    private final List<Variable> variables;
    private final int[] variableOfColumn;
    private final String[] header;
    private final CsvReader csv;

    private DataColumns(CsvReader csv, List<Variable> variables, String[] header, int[] variableOfColumn) {
        this.csv = csv;
        this.variables = variables;
        this.header = header;
        this.variableOfColumn = variableOfColumn;
    }

    /** Reads the header of {@code csv}; every column must name a variable, once. */
    static DataColumns readHeader(CsvReader csv, List<Variable> variables) throws FormatException {
        List<String> h = csv.next();
        if (h == null) {
            throw new FormatException(csv.file(), 1, 1, null, "the file is empty; expected a header of variable names");
        }
        Map<String, Integer> byName = new HashMap<>();
        for (int i = 0; i < variables.size(); i++) {
            byName.put(variables.get(i).name(), i);
        }
        String[] header = h.toArray(new String[0]);
        int[] map = new int[header.length];
        boolean[] seen = new boolean[variables.size()];
        for (int c = 0; c < header.length; c++) {
            // names exactly as written (quoted or not): " a" and "a" may be two variables
            Integer v = byName.get(header[c]);
            if (v == null) {
                throw csv.error(c, "unknown column \"" + header[c] + "\"; expected variable names of the circuit ("
                        + String.join(", ", variables.stream().map(Variable::name).toList()) + ")");
            }
            if (seen[v]) {
                throw csv.error(c, "column \"" + header[c] + "\" appears twice");
            }
            seen[v] = true;
            map[c] = v;
        }
        return new DataColumns(csv, variables, header, map);
    }

    String[] header() {
        return header;
    }

    /** The variable index of column {@code c}. */
    int variableOf(int c) {
        return variableOfColumn[c];
    }

    /**
     * The column headed exactly {@code name}, else the one headed {@code name} without surrounding white
     * space (as a comma-separated option gives it: {@code --given "a, b"}), or -1.
     */
    int columnOf(String name) {
        for (String n : new String[] {name, name.strip()}) {
            for (int c = 0; c < header.length; c++) {
                if (header[c].equals(n)) {
                    return c;
                }
            }
        }
        return -1;
    }

    /**
     * Reads up to {@code max} rows into {@code data} (row-major, one slot per variable, NaN for missing)
     * and their raw cells into {@code cells}.
     *
     * @return the number of rows read; 0 at the end of the file
     */
    int readRows(double[] data, String[][] cells, int max) throws FormatException {
        int nv = variables.size();
        int r = 0;
        while (r < max) {
            List<String> rec = csv.next();
            if (rec == null) {
                break;
            }
            if (rec.size() != header.length) {
                throw csv.error(Math.min(rec.size(), header.length) - 1 < 0 ? 0 : Math.min(rec.size(), header.length) - 1,
                        "row has " + Counts.of(rec.size(), "field") + "; expected " + header.length + " as in the header");
            }
            Arrays.fill(data, r * nv, r * nv + nv, Double.NaN);
            String[] row = cells[r];
            for (int c = 0; c < header.length; c++) {
                String cell = rec.get(c);
                row[c] = cell;
                int v = variableOfColumn[c];
                Variable var = variables.get(v);
                if (var.type() == VariableType.REAL || var.type() == VariableType.COUNT) {
                    int length = cell.strip().length();
                    if (length > csv.limits().maxNumber()) {
                        throw LimitExceededException.of(csv.file(), csv.line(), csv.column(c), null,
                                "column " + header[c] + ": a number of " + length + " characters", ReadLimits.MAX_NUMBER,
                                csv.limits().maxNumber());
                    }
                }
                try {
                    data[r * nv + v] = CellValues.parse(variables.get(v), cell);
                } catch (IllegalArgumentException e) {
                    throw csv.error(c, "column " + header[c] + ": " + e.getMessage());
                }
            }
            r++;
        }
        return r;
    }
}
