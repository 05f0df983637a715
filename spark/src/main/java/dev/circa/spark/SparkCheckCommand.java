package dev.circa.spark;

import dev.circa.cli.CheckOptions;
import dev.circa.format.io.FormatException;
import dev.circa.validator.regression.CheckReport;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code circa-spark check}: {@code circa check} with its reference sets checked in parallel on Spark. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Checks a circuit against its embedded checks and every --reference set (CSV, or",
            "Parquet when the name ends in .parquet), the rows checked in parallel. Prints the report",
            "of circa check; exit status 1 when any case fails."})
final class SparkCheckCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file (.json or .json.gz).")
    Path circuitFile;

    @Mixin
    CheckOptions check;

    @Mixin
    SparkOptions sparkOptions;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws FormatException {
        CheckReport report = sparkOptions.run(circuitFile, spec, (spark, model) -> {
            DistributedCheck distributed = new DistributedCheck(spark, model,
                    check.tolerance(model.driverModel().document().checks()));
            for (Path ref : check.references()) {
                distributed.checkReference(ref.toString());
            }
            return distributed.report();
        });
        return check.finish(report, circuitFile, spec.commandLine().getOut());
    }
}
