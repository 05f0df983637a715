package dev.circa.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/** The {@code --data} option of the commands that read data rows. */
final class DataOption {
    @Option(names = "--data", required = true, paramLabel = "DATA.csv", description = "The data rows.")
    Path file;
}
