package dev.circa.cli;

import dev.circa.format.io.AtomicOutput;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import picocli.CommandLine.Option;

/** The {@code -o/--output} option of the commands that write CSV rows, and the writing itself. */
final class CsvOutput {
    @Option(names = {"-o", "--output"}, paramLabel = "OUT.csv", description = "Output file (default: standard output).")
    Path output = Path.of("-");

    /** What a command writes into the CSV. */
    interface Rows {
        void write(CsvOut out) throws IOException;
    }

    /** Writes the rows whole or not at all, refusing to write over one of {@code inputs}. */
    void write(Rows rows, Path... inputs) throws IOException {
        AtomicOutput.write(output, stream -> {
            CsvOut out = new CsvOut(new BufferedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8)));
            rows.write(out);
            out.flush();
        }, inputs);
    }
}
