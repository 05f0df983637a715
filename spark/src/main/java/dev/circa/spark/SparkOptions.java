package dev.circa.spark;

import dev.circa.cli.ReadOptions;
import dev.circa.format.io.FormatException;
import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import org.apache.spark.sql.SparkSession;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** The options of every {@code circa-spark} subcommand that say where and how Spark runs. */
public final class SparkOptions {
    @Option(names = "--master", paramLabel = "URL",
            description = "Spark master (default: ${DEFAULT-VALUE}: this machine, every core).")
    String master = "local[*]";

    @Option(names = "--conf", paramLabel = "KEY=VALUE", description = "A Spark setting (repeatable), as spark-submit takes it.")
    Map<String, String> conf = new LinkedHashMap<>();

    @Option(names = "--certificate", paramLabel = "CERT",
            description = "A certificate written by circa certify: the model's bytes are checked against it instead of validating again.")
    Path certificate;

    /** The read limits of circa's own commands ({@code --max-bytes} and the rest). */
    @Mixin
    ReadOptions read;

    /** The work of a command, given the session and the model as loaded on the driver. */
    interface Work<T> {
        T run(SparkSession spark, SparkModel model) throws FormatException, IOException;
    }

    /**
     * Loads and checks {@code circuit} (before Spark starts, so a bad model costs no start-up), opens
     * the session, runs {@code work}, and stops the session when it opened it.
     */
    <T> T run(Path circuit, CommandSpec spec, Work<T> work) throws FormatException {
        SparkModel model = SparkModel.load(circuit, certificate, read.limits(), spec.commandLine().getErr());
        Sessions.Opened opened = Sessions.open(master, conf);
        try {
            return work.run(opened.spark(), model);
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            throw new FormatException(circuit.toString(), 0, 0, null, "cannot be processed: " + e.getMessage());
        } finally {
            if (opened.created()) {
                opened.spark().stop();
            }
        }
    }
}
