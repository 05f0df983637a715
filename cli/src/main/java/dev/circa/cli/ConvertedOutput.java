package dev.circa.cli;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitWriter;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The end of {@code circa convert}: reports the converted circuit's validation errors and warnings and
 * writes the circuit only when it agrees with its source and validates, never over one of its inputs.
 */
final class ConvertedOutput {
    private final Path output;
    private final PrintWriter err;
    private final Path[] inputs;

    /** @param inputs the files the conversion read ({@code null} entries are skipped) */
    ConvertedOutput(Path output, PrintWriter err, Path... inputs) {
        this.output = output;
        this.err = err;
        List<Path> in = new ArrayList<>();
        for (Path p : inputs) {
            if (p != null) {
                in.add(p);
            }
        }
        this.inputs = in.toArray(new Path[0]);
    }

    /** Prints the report's errors and warnings, then writes {@code circuit} if it passed; the exit status. */
    int finish(CircuitDocument circuit, boolean verified, ValidationReport report) throws Exception {
        for (Diagnostic d : report.diagnostics()) {
            if (d.severity() == Severity.ERROR || d.severity() == Severity.WARNING) {
                err.println("circa convert: " + d.render());
            }
        }
        if (!verified) {
            err.println("circa convert: " + output + " not written: the circuit and the source disagree beyond tolerance");
            return ExitStatus.FAILED;
        }
        if (!report.valid()) {
            err.println("circa convert: " + output + " not written: the converted circuit does not validate");
            return ExitStatus.FAILED;
        }
        new CircuitWriter().write(circuit, output, inputs);
        err.println("wrote " + output);
        return ExitStatus.OK;
    }
}
