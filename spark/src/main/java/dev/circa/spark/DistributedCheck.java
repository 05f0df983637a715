package dev.circa.spark;

import dev.circa.model.Model;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.FormatException;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.ReferenceSetReader;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.io.StringReader;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.functions;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;

/**
 * A regression check whose reference sets (FORMAT.md section 5; CSV, or Parquet when the name ends in
 * {@code .parquet}) are checked in parallel; the report equals {@code circa check}'s on the same
 * files: the embedded checks first, then each reference set, row numbers and lines as in the file.
 * In Parquet the columns are the same: a categorical or binary column holds labels (text) or state
 * indices (integers), {@code log_density} is a double, {@code output} a name or an index; a row's
 * number is its position in file order (files of a folder in name order) and its line is 0.
 */
public final class DistributedCheck {
    private final SparkSession spark;
    private final SparkModel model;
    private final Tolerance tolerance;
    private final RegressionCheck check;
    private final Broadcast<SparkModel> shipped;

    /** A check of {@code model} (as loaded on the driver) with {@code tolerance}; runs the embedded checks now. */
    public DistributedCheck(SparkSession spark, SparkModel model, Tolerance tolerance) throws FormatException {
        this.spark = spark;
        this.model = model;
        this.tolerance = tolerance;
        Model loaded = model.driverModel();
        this.check = new RegressionCheck(loaded.circuit(), tolerance);
        check.checkEmbedded(loaded.document());
        this.shipped = JavaSparkContext.fromSparkContext(spark.sparkContext()).broadcast(model);
    }

    /** Checks every row of the reference set {@code file}. */
    public void checkReference(String file) throws FormatException {
        List<PartialReport> parts = file.endsWith(".parquet") ? parquet(file) : csv(file);
        List<CheckReport> reports = new ArrayList<>();
        for (PartialReport p : parts) {
            reports.add(p.toReport(tolerance));
        }
        check.include(reports);
    }

    /** The report of the embedded checks and every reference set checked so far. */
    public CheckReport report() {
        return check.report();
    }

    private List<PartialReport> csv(String file) throws FormatException {
        Dataset<Row> lines = spark.read().text(file)
                .select(functions.col("value"), functions.col("_metadata.file_block_start").as("start"));
        List<CsvStretchCount.Count> counts = new ArrayList<>(
                Jobs.run(() -> lines.javaRDD().mapPartitions(new CsvStretchCount(model)).collect()));
        counts.sort(Comparator.comparingLong(CsvStretchCount.Count::start));
        if (counts.stream().anyMatch(CsvStretchCount.Count::readWhole)) {
            // a quoted cell holds a line break (a record may span two splits), or the text is not UTF-8:
            // one task reads the file whole from its bytes, as circa check does
            WholeFileCheck whole = new WholeFileCheck(shipped, file, tolerance);
            return Jobs.run(() -> JavaSparkContext.fromSparkContext(spark.sparkContext()).binaryFiles(file, 1)
                    .mapPartitions(whole).collect());
        }
        if (counts.isEmpty() || counts.get(0).header() == null) {
            throw new FormatException(file, 1, 1, null,
                    "the file is empty; expected a header of variable names, log_density and optionally output");
        }
        CsvStretchCount.Count head = counts.get(0);
        CompiledCircuit c = model.compiled();
        List<String> outputs = model.outputNames();
        // the header is checked here, before any work, with the reader that checks it in circa check
        new ReferenceSetReader(new CsvReader(new StringReader(head.header()), file, model.limits(), head.headerLine()),
                c.variables(), outputs);
        int n = counts.size();
        long[] starts = new long[n];
        long[] linesBefore = new long[n];
        long[] rowsBefore = new long[n];
        for (int k = 0; k < n; k++) {
            starts[k] = counts.get(k).start();
            if (k > 0) {
                linesBefore[k] = linesBefore[k - 1] + counts.get(k - 1).lines();
                rowsBefore[k] = rowsBefore[k - 1] + counts.get(k - 1).records();
            }
        }
        CsvStretchCheck f = new CsvStretchCheck(shipped, file, head.header(), starts, linesBefore, rowsBefore, tolerance);
        return Jobs.run(() -> lines.javaRDD().mapPartitions(f).collect());
    }

    private List<PartialReport> parquet(String file) throws FormatException {
        Dataset<Row> raw = spark.read().parquet(file);
        CompiledCircuit c = model.compiled();
        int density = -1;
        int output = -1;
        StructField[] fields = raw.schema().fields();
        for (int k = 0; k < fields.length; k++) {
            String name = fields[k].name();
            if (name.equals(ReferenceSetReader.LOG_DENSITY)) {
                density = k;
                if (!fields[k].dataType().equals(DataTypes.DoubleType)) {
                    throw new FormatException(file, 0, 0, null, "column log_density has type "
                            + fields[k].dataType().simpleString() + "; expected double");
                }
            } else if (name.equals(ReferenceSetReader.OUTPUT)) {
                output = k;
                if (!fields[k].dataType().equals(DataTypes.StringType) && !fields[k].dataType().equals(DataTypes.IntegerType)
                        && !fields[k].dataType().equals(DataTypes.LongType)) {
                    throw new FormatException(file, 0, 0, null, "column output has type "
                            + fields[k].dataType().simpleString() + "; expected string (a name) or an integer (an index)");
                }
            } else if (c.variables().stream().noneMatch(v -> v.name().equals(name))) {
                throw new FormatException(file, 0, 0, null, "unknown column \"" + fields[k].name()
                        + "\"; expected log_density, output or a variable of the circuit");
            }
        }
        if (density < 0) {
            throw new FormatException(file, 0, 0, null, "there is no log_density column; expected variable names, "
                    + "log_density and optionally output");
        }
        ColumnBinding binding;
        try {
            binding = ColumnBinding.bind(raw.schema(), c.variables(), List.of(), false);
        } catch (IllegalArgumentException e) {
            throw new FormatException(file, 0, 0, null, e.getMessage());
        }
        Dataset<Row> rows = raw.select(functions.col("*"), functions.col("_metadata.file_path").as("__circa_file"),
                functions.col("_metadata.row_index").as("__circa_row"));
        List<Row> perFile = rows.groupBy("__circa_file").count().collectAsList();
        String[] paths = new String[perFile.size()];
        for (int k = 0; k < paths.length; k++) {
            paths[k] = perFile.get(k).getString(0);
        }
        Arrays.sort(paths);
        long[] rowsBefore = new long[paths.length];
        for (int k = 1; k < paths.length; k++) {
            String previous = paths[k - 1];
            long count = perFile.stream().filter(r -> r.getString(0).equals(previous)).findFirst().orElseThrow().getLong(1);
            rowsBefore[k] = rowsBefore[k - 1] + count;
        }
        ParquetCheck f = new ParquetCheck(shipped, binding, file, new int[] {density, output, fields.length}, paths,
                rowsBefore, tolerance);
        return Jobs.run(() -> rows.javaRDD().mapPartitions(f).collect());
    }
}
