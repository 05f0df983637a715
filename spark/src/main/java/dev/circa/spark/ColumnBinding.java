package dev.circa.spark;

import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.csv.CellValues;
import java.io.Serializable;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.types.DataType;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.DecimalType;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;

/**
 * The columns of a dataset bound to a circuit's variables by name, checked on the driver before any
 * work: a variable's column must be able to hold its values (real: any number or text; count: an
 * integer type or text; categorical and binary: text of labels or indices, or an integer type of
 * indices). Null is a missing value. Columns that name no variable are carried along untouched.
 */
final class ColumnBinding implements Serializable {
    private static final long serialVersionUID = 1L;
    private static final int SHOWN_ROW_CHARS = 300;

    private final String[] names;
    private final int[] variableOfColumn;
    private final boolean[] text;
    private final boolean[] integral;

    private ColumnBinding(String[] names, int[] variableOfColumn, boolean[] text, boolean[] integral) {
        this.names = names;
        this.variableOfColumn = variableOfColumn;
        this.text = text;
        this.integral = integral;
    }

    /**
     * Binds {@code schema} to {@code vars}.
     *
     * @param required variables that must have a column (all of them when {@code allRequired})
     * @throws IllegalArgumentException naming the column, for a missing column or a column of the wrong type
     */
    static ColumnBinding bind(StructType schema, List<Variable> vars, List<String> required, boolean allRequired) {
        StructField[] fields = schema.fields();
        String[] names = new String[fields.length];
        int[] map = new int[fields.length];
        boolean[] text = new boolean[fields.length];
        boolean[] integral = new boolean[fields.length];
        boolean[] bound = new boolean[vars.size()];
        for (int c = 0; c < fields.length; c++) {
            names[c] = fields[c].name();
            map[c] = indexOf(vars, fields[c].name());
            if (map[c] < 0) {
                continue;
            }
            if (bound[map[c]]) {
                throw new IllegalArgumentException("column \"" + names[c] + "\" appears twice");
            }
            bound[map[c]] = true;
            Variable v = vars.get(map[c]);
            DataType t = fields[c].dataType();
            text[c] = t.equals(DataTypes.StringType);
            integral[c] = t.equals(DataTypes.LongType) || t.equals(DataTypes.IntegerType) || t.equals(DataTypes.ShortType)
                    || t.equals(DataTypes.ByteType);
            boolean decimal = t.equals(DataTypes.DoubleType) || t.equals(DataTypes.FloatType) || t instanceof DecimalType;
            boolean fits = text[c] || integral[c] || (v.type() == VariableType.REAL && decimal);
            if (!fits) {
                throw new IllegalArgumentException("column \"" + names[c] + "\" has type " + t.simpleString()
                        + ", which cannot hold values of " + describe(v));
            }
        }
        List<String> missing = new ArrayList<>();
        for (int v = 0; v < vars.size(); v++) {
            if (!bound[v] && (allRequired || required.contains(vars.get(v).name()))) {
                missing.add(vars.get(v).name());
            }
        }
        for (String r : required) {
            if (indexOf(vars, r) < 0) {
                throw new IllegalArgumentException("\"" + r + "\" is not a variable of the circuit");
            }
        }
        if (!missing.isEmpty()) {
            throw new IllegalArgumentException("the data has no column \"" + String.join("\", \"", missing) + "\" (columns: "
                    + String.join(", ", names) + ")");
        }
        return new ColumnBinding(names, map, text, integral);
    }

    /** The column names in order. */
    String[] names() {
        return names.clone();
    }

    /** The variable of column {@code c}, or -1 when the column names none. */
    int variableOf(int c) {
        return variableOfColumn[c];
    }

    /**
     * Writes the variables of {@code row} into {@code data[base .. base + variable count)} (NaN where
     * missing or without a column).
     *
     * @param variables the circuit's variables (as bound)
     * @throws DataValueException naming the column, the value and the row, for a value its variable cannot take
     */
    void fill(Row row, Variable[] variables, double[] data, int base) {
        java.util.Arrays.fill(data, base, base + variables.length, Double.NaN);
        for (int c = 0; c < variableOfColumn.length; c++) {
            int v = variableOfColumn[c];
            if (v < 0 || row.isNullAt(c)) {
                continue;
            }
            Variable var = variables[v];
            if (text[c]) {
                data[base + v] = parse(var, c, row.getString(c), row);
            } else if (integral[c]) {
                long k = ((Number) row.get(c)).longValue();
                boolean ok = var.type() == VariableType.REAL || (k >= 0 && (var.type() == VariableType.COUNT || k < var.stateCount()));
                data[base + v] = ok ? k : parse(var, c, Long.toString(k), row);
            } else {
                double d = ((Number) row.get(c)).doubleValue();
                data[base + v] = Double.isFinite(d) ? d : parse(var, c, Double.toString(d), row);
            }
        }
    }

    private double parse(Variable v, int c, String cell, Row row) {
        try {
            return CellValues.parse(v, cell);
        } catch (IllegalArgumentException e) {
            throw new DataValueException("column " + names[c] + ": " + e.getMessage() + ", in the row " + shown(row));
        }
    }

    private String shown(Row row) {
        StringBuilder sb = new StringBuilder("(");
        for (int c = 0; c < names.length && sb.length() < SHOWN_ROW_CHARS; c++) {
            sb.append(c == 0 ? "" : ", ").append(names[c]).append('=').append(row.isNullAt(c) ? "" : String.valueOf(row.get(c)));
        }
        return sb.length() >= SHOWN_ROW_CHARS ? sb.substring(0, SHOWN_ROW_CHARS) + "...)" : sb.append(')').toString();
    }

    private static int indexOf(List<Variable> vars, String name) {
        for (int i = 0; i < vars.size(); i++) {
            if (vars.get(i).name().equals(name)) {
                return i;
            }
        }
        return -1;
    }

    private static String describe(Variable v) {
        return switch (v.type()) {
            case REAL -> "real variable " + v.name() + " (expected a number or text)";
            case COUNT -> "count variable " + v.name() + " (expected an integer type or text)";
            default -> v.type().name().toLowerCase(java.util.Locale.ROOT) + " variable " + v.name()
                    + " (expected text of labels or indices, or an integer type of state indices)";
        };
    }
}
