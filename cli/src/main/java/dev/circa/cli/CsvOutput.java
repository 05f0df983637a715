package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.FormatException;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** The {@code -o/--output} option of the commands that write CSV rows, and the writing itself. */
final class CsvOutput {
    @Option(names = {"-o", "--output"}, paramLabel = "OUT.csv", description = "Output file (default: standard output).")
    Path output = Path.of("-");

    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    /** What a command writes into the CSV. */
    interface Rows {
        void write(CsvOut out) throws IOException;
    }

    /**
     * Writes the rows whole or not at all, refusing to write over one of {@code inputs}. Standard output
     * cannot be taken back: rows go out as they are made, and an error names how many data rows were
     * written before it. Written to a file, the command says on standard error how many rows it wrote where.
     */
    void write(Rows rows, Path... inputs) throws IOException {
        write(rows, -1, inputs);
    }

    /** As {@link #write(Rows, Path...)}, {@code total} data rows (or -1 when unknown) shown in the progress line. */
    void write(Rows rows, long total, Path... inputs) throws IOException {
        CsvOut[] opened = new CsvOut[1];
        try {
            boolean toTerminal = output.toString().equals("-") && Progress.stdoutIsTerminal();
            try (Progress progress = Progress.start(toTerminal ? null : command.commandLine().getErr(), "circa " + command.name() + ": writing "
                    + (output.toString().equals("-") ? "rows" : output))) {
                AtomicOutput.write(output, stream -> {
                    CsvOut out = new CsvOut(new BufferedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8)),
                            progress, total);
                    opened[0] = out;
                    rows.write(out);
                    out.flush();
                }, inputs);
            }
            if (!output.toString().equals("-")) {
                command.commandLine().getErr().println("circa " + command.name() + ": wrote "
                        + Counts.grouped(Math.max(0, opened[0].records() - 1), "row") + " to " + output);
            }
        } catch (FormatException e) {
            if (!output.toString().equals("-") || opened[0] == null) {
                throw e;
            }
            opened[0].flushQuietly();
            long rowsOut = Math.max(0, opened[0].records() - 1);
            throw new FormatException(e.file(), e.line(), e.column(), e.pointer(), e.problem() + " ("
                    + Counts.grouped(rowsOut, "data row") + (rowsOut == 1 ? " was" : " were")
                    + " written to standard output before this error)");
        }
    }
}
