package dev.circa.spark;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.Variable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Encoders;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;

/**
 * Scores a {@code Dataset<Row>} with a circuit: the dataset comes back with one log-density column per
 * output ({@code log_density} for one, {@code log_density:<output>} for several), or the conditional
 * log p(rest of the row | given columns). Columns are bound to variables by name; null is a missing
 * value (marginalised); a categorical column holds labels or state indices. The model is shipped to
 * executors once (a broadcast) and compiled once per executor; each partition is evaluated in batches
 * with reused arrays, and each row's result is the engine's, bit for bit, whatever the partitioning.
 *
 * <pre>{@code
 * Dataset<Row> scored = CircuitScorer.of(SparkModel.load(path, ReadLimits.DEFAULT, err)).score(readings);
 * }</pre>
 */
public final class CircuitScorer {
    /** The name of the log-density column of a one-output circuit, as {@code circa eval} writes it. */
    public static final String LOG_DENSITY = "log_density";

    private final SparkModel model;
    private final List<String> given;
    private final String output;
    private final boolean allVariables;

    private CircuitScorer(SparkModel model, List<String> given, String output, boolean allVariables) {
        this.model = model;
        this.given = List.copyOf(given);
        this.output = output;
        this.allVariables = allVariables;
    }

    /** A scorer of every output's log-density; every variable must have a column. */
    public static CircuitScorer of(SparkModel model) {
        return new CircuitScorer(model, List.of(), null, true);
    }

    /**
     * The conditional given {@code columns} (each must be a column naming a variable): a name is a
     * variable's exactly as written, else without surrounding white space (as a comma-separated option
     * gives it: {@code --given "a, b"}).
     */
    public CircuitScorer given(List<String> columns) {
        List<Variable> vars = model.compiled().variables();
        return new CircuitScorer(model, columns.stream()
                .map(g -> vars.stream().anyMatch(v -> v.name().equals(g)) ? g : g.strip()).toList(), output, allVariables);
    }

    /** Only the output named {@code name}, in a column named {@code log_density}. */
    public CircuitScorer output(String name) {
        return new CircuitScorer(model, given, name, allVariables);
    }

    /**
     * Whether every variable must have a column (the default); when not, a variable without a column
     * is missing in every row, as in {@code circa eval}.
     */
    public CircuitScorer requireAllVariables(boolean required) {
        return new CircuitScorer(model, given, output, required);
    }

    /** The names of the columns {@link #score} adds, in order. */
    public List<String> scoreColumns() {
        CompiledCircuit c = model.compiled();
        List<String> names = new ArrayList<>();
        if (output != null || c.outputCount() == 1) {
            names.add(LOG_DENSITY);
        } else {
            for (int o = 0; o < c.outputCount(); o++) {
                names.add(LOG_DENSITY + ":" + c.outputName(o));
            }
        }
        return names;
    }

    /**
     * The scored dataset (lazy, like every transformation).
     *
     * @throws IllegalArgumentException before any work, naming the column: a variable without a column
     *     (or a given column missing), a column whose type cannot hold its variable's values, an
     *     unknown output, or a score column that the data already has
     */
    public Dataset<Row> score(Dataset<Row> data) {
        CompiledCircuit c = model.compiled();
        List<Variable> vars = c.variables();
        ColumnBinding binding = ColumnBinding.bind(data.schema(), vars, given, allVariables);
        boolean[] givenMask = new boolean[vars.size()];
        for (String g : given) {
            for (int v = 0; v < vars.size(); v++) {
                givenMask[v] |= vars.get(v).name().equals(g);
            }
        }
        int[] outputs;
        if (output != null) {
            int o = c.outputIndex(output);
            if (o < 0) {
                List<String> all = new ArrayList<>();
                for (int k = 0; k < c.outputCount(); k++) {
                    all.add(c.outputName(k));
                }
                throw new IllegalArgumentException("the circuit has no output \"" + output + "\"; its outputs are "
                        + String.join(", ", all));
            }
            outputs = new int[] {o};
        } else {
            outputs = new int[c.outputCount()];
            Arrays.setAll(outputs, o -> o);
        }
        StructType schema = data.schema();
        for (String name : scoreColumns()) {
            if (Arrays.asList(schema.fieldNames()).contains(name)) {
                throw new IllegalArgumentException("the data already has a column \"" + name + "\"; rename it");
            }
            schema = schema.add(name, DataTypes.DoubleType, false);
        }
        Broadcast<SparkModel> shipped = JavaSparkContext.fromSparkContext(data.sparkSession().sparkContext()).broadcast(model);
        ScorePartition f = new ScorePartition(shipped, binding, given.isEmpty() ? null : givenMask, outputs);
        return data.mapPartitions(f, Encoders.row(schema));
    }
}
