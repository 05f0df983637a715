package dev.circa.format.csv;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;

/** For the fuzz tests of the CSV readers: what a row of cell values read for some variables may hold. */
public final class CellRanges {
    /** The variables of the pump-station CSV fixtures, one of each type. */
    public static final List<Variable> PUMP_STATION = List.of(
            new Variable("inlet_pressure", VariableType.REAL, List.of(), "bar", null),
            new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null),
            new Variable("alarm", VariableType.BINARY, List.of(), null, null),
            new Variable("restarts", VariableType.COUNT, List.of(), null, null));

    private CellRanges() {
    }

    /**
     * Asserts that each of {@code rows} rows of {@code data} (one value per variable, NaN for missing)
     * holds values its variable can take (FORMAT.md section 1).
     *
     * @param firstRow the number of the first row, for messages
     */
    public static void assertInRange(List<Variable> variables, double[] data, int rows, long firstRow) {
        int nv = variables.size();
        for (int r = 0; r < rows; r++) {
            for (int v = 0; v < nv; v++) {
                double x = data[r * nv + v];
                Variable var = variables.get(v);
                boolean ok = Double.isNaN(x) || switch (var.type()) {
                    case REAL -> Double.isFinite(x);
                    case COUNT -> x >= 0 && x == Math.rint(x);
                    default -> x >= 0 && x < var.stateCount() && x == Math.rint(x);
                };
                if (!ok) {
                    throw new AssertionError(var.name() + " = " + x + " in row " + (firstRow + r));
                }
            }
        }
    }
}
