package dev.circa.cli;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Set;

/**
 * A circuit input of a command: read, checked as CLI.md requires of every command but
 * {@code validate} (smooth and decomposable, else status 2 with the diagnostics; unnormalised is a
 * warning), and compiled.
 *
 * @param file the path as given
 * @param document the document as read
 * @param circuit the compiled circuit
 * @param report the validation report (embedded checks are not evaluated here)
 */
public record LoadedCircuit(Path file, CircuitDocument document, CompiledCircuit circuit, ValidationReport report) {
    private static final ValidationOptions LOAD_OPTIONS = ValidationOptions.defaults()
            .withRequire(Set.of(Property.SMOOTH, Property.DECOMPOSABLE))
            .withRule("CheckCaseFailed:off")
            // CLI.md: an unnormalised circuit gets a warning and the command goes on (normalize needs exactly those)
            .withRule("WeightsNotNormalized:warn")
            .withRule("ProbabilitiesNotNormalized:warn");

    /** Whether the validator proved the circuit deterministic (then MPE is exact). */
    public boolean deterministic() {
        return report.property(Property.DETERMINISTIC) == Verdict.TRUE;
    }

    /** Reads, validates and compiles {@code file}; diagnostics and warnings go to {@code err}. */
    public static LoadedCircuit load(Path file, ReadLimits limits, PrintWriter err) throws FormatException {
        CircuitDocument doc = new CircuitReader(limits).read(file);
        ValidationReport report = new Validator(LOAD_OPTIONS).validate(doc);
        if (!report.valid()) {
            int shown = 0;
            for (Diagnostic d : report.diagnostics()) {
                if (d.severity() == Severity.ERROR && shown++ < 20) {
                    err.println(file + ": " + d.render());
                }
            }
            throw new FormatException(file.toString(), 0, 0, null, "cannot be used: " + report.count(Severity.ERROR)
                    + " error(s) found by the validator (listed above; a circuit must at least be smooth and "
                    + "decomposable, with valid references and parameters; run circa validate for the full report)");
        }
        if (report.property(Property.NORMALIZED) != Verdict.TRUE) {
            err.println("circa: warning: " + file + " is not proven normalized (log Z = "
                    + report.logPartition() + "); densities are those of the unnormalised circuit");
        }
        try {
            return new LoadedCircuit(file, doc, CompiledCircuit.compile(doc), report);
        } catch (CompileException e) {
            throw new FormatException(file.toString(), 0, 0, null, e.getMessage());
        }
    }
}
