package dev.circa.spark;

import java.util.LinkedHashMap;
import java.util.Map;
import picocli.CommandLine.Option;

/** The options of every {@code circa-spark} subcommand that say where and how Spark runs. */
public final class SparkOptions {
    @Option(names = "--master", paramLabel = "URL",
            description = "Spark master (default: ${DEFAULT-VALUE}: this machine, every core).")
    String master = "local[*]";

    @Option(names = "--conf", paramLabel = "KEY=VALUE", description = "A Spark setting (repeatable), as spark-submit takes it.")
    Map<String, String> conf = new LinkedHashMap<>();

    Sessions.Opened open() {
        return Sessions.open(master, conf);
    }
}
