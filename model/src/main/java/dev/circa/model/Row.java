package dev.circa.model;

import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * One row of values by variable name, reusable from call to call so that scoring allocates nothing:
 * set the observed values, score the row with its {@link Model}, {@link #clear()} it, and so on.
 * Every variable starts missing. A value is checked when set: a real must be finite, a count a
 * non-negative integer, a categorical or binary value a state label or a state index (binary also a
 * boolean); {@code null} or NaN makes the variable missing. Not thread-safe: one row per thread (the
 * model itself is shared).
 *
 * <p>Setting by name looks the name up each time (a hash and a comparison of characters, or of references
 * for a string literal); where every nanosecond counts, look the names up once with
 * {@link Model#variableIndex(String)} and set by index ({@link #set(int, double)}).
 */
public final class Row {
    private final Model model;
    private final VariableCodec codec;
    final double[] cells;

    Row(Model model, VariableCodec codec) {
        this.model = model;
        this.codec = codec;
        this.cells = new double[codec.count()];
        Arrays.fill(cells, Double.NaN);
    }

    /**
     * The model this row belongs to.
     *
     * @return the model
     */
    public Model model() {
        return model;
    }

    /**
     * Sets a real or count value, or a state index.
     *
     * @param name the variable
     * @param value the value; NaN makes it missing
     * @return this row
     * @throws IllegalArgumentException when there is no such variable or the value is not one of its values
     */
    public Row set(String name, double value) {
        int v = codec.indexOf(name);
        cells[v] = codec.number(v, value);
        return this;
    }

    /**
     * Sets a categorical or binary value by its state label.
     *
     * @param name the variable
     * @param label the state label; {@code null} makes it missing
     * @return this row
     * @throws IllegalArgumentException when there is no such variable or label
     */
    public Row set(String name, String label) {
        int v = codec.indexOf(name);
        cells[v] = label == null ? Double.NaN : codec.label(v, label);
        return this;
    }

    /**
     * Sets a value given as an object: a {@link Number}, a state label, a {@link Boolean} (binary), or
     * {@code null} for missing.
     *
     * @param name the variable
     * @param value the value
     * @return this row
     * @throws IllegalArgumentException when there is no such variable or the value is not one of its values
     */
    public Row set(String name, Object value) {
        int v = codec.indexOf(name);
        cells[v] = codec.encode(v, value);
        return this;
    }

    /**
     * Sets variable {@code variable} (its index in {@link Model#variables()}) to a value or state index.
     *
     * @param variable the variable's index
     * @param value the value; NaN makes it missing
     * @return this row
     * @throws IllegalArgumentException when the value is not one of the variable's values
     * @throws IndexOutOfBoundsException when there is no such variable
     */
    public Row set(int variable, double value) {
        cells[variable] = codec.number(variable, value);
        return this;
    }

    /**
     * Makes a variable missing (marginalised when scoring).
     *
     * @param name the variable
     * @return this row
     * @throws IllegalArgumentException when there is no such variable
     */
    public Row missing(String name) {
        cells[codec.indexOf(name)] = Double.NaN;
        return this;
    }

    /**
     * Makes every variable missing.
     *
     * @return this row
     */
    public Row clear() {
        Arrays.fill(cells, Double.NaN);
        return this;
    }

    /**
     * Replaces the whole row by {@code values}: each entry sets one variable, every other is missing.
     *
     * @param values values by variable name, as {@link #set(String, Object)} takes them
     * @return this row
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public Row setAll(Map<String, ?> values) {
        clear();
        int observed = 0;
        for (int v = 0; v < cells.length; v++) {
            Object x = values.get(codec.name(v));
            if (x != null) {
                cells[v] = codec.encode(v, x);
                observed++;
            }
        }
        if (observed < values.size()) {
            refuseUnknownNames(values, observed);
        }
        return this;
    }

    /**
     * Throws for the first name of {@code values} that is not a variable, if any; reached only when the map
     * holds more entries than observed variables (null values, or names that are not variables), so that
     * the usual call looks each variable up once and no key twice.
     */
    private void refuseUnknownNames(Map<String, ?> values, int observed) {
        int found = observed;
        for (int v = 0; v < cells.length; v++) {
            String name = codec.name(v);
            if (values.get(name) == null && values.containsKey(name)) {
                found++;
            }
        }
        if (found < values.size()) {
            for (Object key : values.keySet()) {
                codec.indexOf(String.valueOf(key));
            }
        }
    }

    /**
     * The cell of a variable: the value, the state index, or NaN when missing.
     *
     * @param name the variable
     * @return the cell
     * @throws IllegalArgumentException when there is no such variable
     */
    public double get(String name) {
        return cells[codec.indexOf(name)];
    }

    /**
     * The value of a variable as an object: Double (real), Long (count), the state label (or Integer
     * state index when the variable has no labels), or {@code null} when missing.
     *
     * @param name the variable
     * @return the value
     * @throws IllegalArgumentException when there is no such variable
     */
    public Object value(String name) {
        int v = codec.indexOf(name);
        return codec.decode(v, cells[v]);
    }

    /**
     * Whether a variable is missing.
     *
     * @param name the variable
     * @return true when missing
     * @throws IllegalArgumentException when there is no such variable
     */
    public boolean isMissing(String name) {
        return Double.isNaN(cells[codec.indexOf(name)]);
    }

    /**
     * Every variable's value by name, in the model's order, as {@link #value(String)} gives them.
     *
     * @return a new map
     */
    public Map<String, Object> toMap() {
        Map<String, Object> m = new LinkedHashMap<>();
        for (int v = 0; v < cells.length; v++) {
            m.put(codec.name(v), codec.decode(v, cells[v]));
        }
        return m;
    }

    /**
     * Copies this row into row {@code row} of a batch laid out as {@link Model#logDensity(double[], int, double[])} takes it.
     *
     * @param data output: the batch
     * @param row the row's index in the batch
     */
    public void copyTo(double[] data, int row) {
        System.arraycopy(cells, 0, data, row * cells.length, cells.length);
    }

    /**
     * Sets this row from row {@code row} of a batch (e.g. a sampled or imputed one); cells are checked.
     *
     * @param data input: the batch
     * @param row the row's index in the batch
     * @return this row
     * @throws IllegalArgumentException when a cell is not a value of its variable
     */
    public Row copyFrom(double[] data, int row) {
        for (int v = 0; v < cells.length; v++) {
            cells[v] = codec.number(v, data[row * cells.length + v]);
        }
        return this;
    }

    @Override
    public String toString() {
        return toMap().toString();
    }
}
