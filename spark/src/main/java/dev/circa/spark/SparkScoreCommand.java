package dev.circa.spark;

import dev.circa.cli.ExitStatus;
import dev.circa.cli.UsageException;
import dev.circa.format.io.FormatException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa-spark score}: {@code circa eval} over a dataset on Spark, into a folder of part files. */
@Command(name = "score", mixinStandardHelpOptions = true,
        description = {"Log-density of each row of DATA (CSV, or Parquet when the name ends in .parquet; columns",
            "named by variables, empty or null = missing, categorical cells by label or index), or with",
            "--given the conditional given those columns; into the folder OUT as CSV part files with the",
            "header and numbers of circa eval, or Parquet. Other columns are carried along."})
final class SparkScoreCommand implements Callable<Integer> {
    /** Output forms. */
    enum Form { csv, parquet }

    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file (.json or .json.gz).")
    Path circuitFile;

    @Option(names = "--data", required = true, paramLabel = "DATA", description = "The data rows (file or folder).")
    String data;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "OUT", description = "Output folder (must not exist).")
    String output;

    @Option(names = "--given", split = ",", paramLabel = "COLS", description = "Columns to condition on (comma-separated).")
    List<String> given = new ArrayList<>();

    @Option(names = "--output-name", paramLabel = "NAME", description = "Score only this output (column log_density).")
    String outputName;

    @Option(names = "--output-format", paramLabel = "FORMAT", description = "csv (default) or parquet.")
    Form form = Form.csv;

    @Mixin
    SparkOptions sparkOptions;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws FormatException {
        sparkOptions.run(circuitFile, spec, (spark, model) -> {
            org.apache.hadoop.fs.Path out = new org.apache.hadoop.fs.Path(output);
            if (out.getFileSystem(spark.sparkContext().hadoopConfiguration()).exists(out)) {
                throw new UsageException(output + " exists; give a new folder for the output (nothing was written)");
            }
            CircuitScorer scorer = CircuitScorer.of(model).given(given).requireAllVariables(false);
            if (outputName != null) {
                scorer = scorer.output(outputName);
            }
            Dataset<Row> scored;
            try {
                scored = scorer.score(DataFiles.read(spark, data));
            } catch (IllegalArgumentException e) {
                throw new FormatException(data, 0, 0, null, e.getMessage());
            }
            int added = scorer.scoreColumns().size();
            return Jobs.run(() -> {
                ScoredOutput.write(scored, added, output, form == Form.parquet);
                return output;
            });
        });
        return ExitStatus.OK;
    }
}
