package dev.circa.spark;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.Variable;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;

/**
 * Checks one partition of a Parquet reference set: the variables' columns as in scoring, the
 * reference log-densities, the outputs (a name or an index), and each row's number (its position in
 * file order, from the file's offset and the row's index in it); gives the partition's partial report.
 */
final class ParquetCheck implements FlatMapFunction<Iterator<Row>, PartialReport> {
    private static final long serialVersionUID = 1L;
    private final Broadcast<SparkModel> model;
    private final ColumnBinding binding;
    private final String file;
    private final int densityColumn;
    private final int outputColumn;
    private final int pathColumn;
    private final String[] paths;
    private final long[] rowsBefore;
    private final double atol;
    private final double rtol;

    ParquetCheck(Broadcast<SparkModel> model, ColumnBinding binding, String file, int[] columns, String[] paths,
                 long[] rowsBefore, Tolerance tolerance) {
        this.model = model;
        this.binding = binding;
        this.file = file;
        this.densityColumn = columns[0];
        this.outputColumn = columns[1];
        this.pathColumn = columns[2];
        this.paths = paths;
        this.rowsBefore = rowsBefore;
        this.atol = tolerance.atol();
        this.rtol = tolerance.rtol();
    }

    @Override
    public Iterator<PartialReport> call(Iterator<Row> rows) {
        CompiledCircuit c = model.value().compiled();
        Variable[] vars = c.variables().toArray(new Variable[0]);
        int nv = Math.max(1, vars.length);
        RegressionCheck check = new RegressionCheck(c, new Tolerance(atol, rtol));
        int chunk = check.chunkRows();
        double[] data = new double[chunk * nv];
        int[] output = new int[chunk];
        double[] expected = new double[chunk];
        long[] lines = new long[chunk];
        long[] numbers = new long[chunk];
        int n = 0;
        boolean any = false;
        while (rows.hasNext()) {
            Row r = rows.next();
            int k = Arrays.binarySearch(paths, r.getString(pathColumn));
            numbers[n] = rowsBefore[k] + r.getLong(pathColumn + 1) + 1;
            try {
                binding.fill(r, vars, data, n * vars.length);
                expected[n] = density(r);
                output[n] = output(r, c);
            } catch (DataValueException e) {
                throw new DataValueException(file + ", row " + numbers[n] + ": " + e.getMessage());
            }
            if (++n == chunk) {
                check.checkRows(file, numbers, data, output, expected, lines, n);
                n = 0;
            }
            any = true;
        }
        if (n > 0) {
            check.checkRows(file, numbers, data, output, expected, lines, n);
        }
        return any ? List.of(new PartialReport(check.report())).iterator() : List.<PartialReport>of().iterator();
    }

    private double density(Row r) {
        if (r.isNullAt(densityColumn)) {
            throw new DataValueException("column log_density is empty; expected a log-density (-inf for zero density)");
        }
        double d = r.getDouble(densityColumn);
        if (Double.isNaN(d) || d == Double.POSITIVE_INFINITY) {
            throw new DataValueException("column log_density: " + d + " is not a log-density; expected a number or -inf");
        }
        return d;
    }

    private int output(Row r, CompiledCircuit c) {
        if (outputColumn < 0 || r.isNullAt(outputColumn)) {
            return 0;
        }
        Object v = r.get(outputColumn);
        if (v instanceof String && c.outputIndex((String) v) >= 0) {
            return c.outputIndex((String) v);
        }
        String s = String.valueOf(v).strip();
        if (s.isEmpty()) {
            return 0;
        }
        if (v instanceof String) {
            int o = c.outputIndex(s);
            if (o >= 0) {
                return o;
            }
        }
        if (s.matches("[0-9]{1,9}") && Integer.parseInt(s) < c.outputCount()) {
            return Integer.parseInt(s);
        }
        StringBuilder names = new StringBuilder();
        for (int o = 0; o < c.outputCount(); o++) {
            names.append(o == 0 ? "" : ", ").append(c.outputName(o));
        }
        throw new DataValueException("column output: \"" + s + "\" is not an output; expected one of " + names
                + " or an index from 0 to " + (c.outputCount() - 1));
    }
}
