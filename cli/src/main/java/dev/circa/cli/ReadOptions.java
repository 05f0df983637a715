package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.model.Model;
import dev.circa.model.ModelException;
import dev.circa.model.ModelLoader;
import dev.circa.validator.Diagnostic;
import java.io.PrintWriter;
import java.nio.file.Path;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * The named read limits of CLI.md, shared by every subcommand that reads a file, with the command's
 * standard output and error and the loading of a circuit under those limits.
 */
public class ReadOptions {
    @Option(names = "--max-bytes", paramLabel = "N",
            description = "Uncompressed bytes read from one file, gzip included (default: ${DEFAULT-VALUE}).")
    long maxBytes = ReadLimits.DEFAULT.maxBytes();

    @Option(names = "--max-nodes", paramLabel = "N", description = "Nodes in one circuit (default: ${DEFAULT-VALUE}).")
    long maxNodes = ReadLimits.DEFAULT.maxNodes();

    @Option(names = "--max-depth", paramLabel = "N", description = "JSON/YAML nesting depth (default: ${DEFAULT-VALUE}).")
    int maxDepth = ReadLimits.DEFAULT.maxDepth();

    @Option(names = "--max-string", paramLabel = "N", description = "Characters in one string (default: ${DEFAULT-VALUE}).")
    int maxString = ReadLimits.DEFAULT.maxString();

    @Option(names = "--max-number", paramLabel = "N", description = "Characters in one number (default: ${DEFAULT-VALUE}).")
    int maxNumber = ReadLimits.DEFAULT.maxNumber();

    @Option(names = "--debug", description = "Print stack traces of unexpected errors.")
    boolean debug;

    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    /** The command's standard output. */
    PrintWriter out() {
        return command.commandLine().getOut();
    }

    /** The command's standard error. */
    PrintWriter err() {
        return command.commandLine().getErr();
    }

    /** The model API's loader with these limits and its default requirement (smooth and decomposable). */
    ModelLoader loader() {
        return Model.loader().withLimits(limits());
    }

    /**
     * The circuit in {@code file} loaded through the model API as CLI.md requires of every command but
     * {@code validate}: read under these limits, proven smooth and decomposable (else the first 20 error
     * diagnostics on standard error and status 2), compiled; an unnormalised circuit gets a warning.
     */
    Model load(Path file) throws FormatException {
        Model model;
        try {
            model = loader().load(file);
        } catch (ModelException e) {
            if (e.unreadable()) {
                throw ConvertibleDocument.explain(file, e, limits());
            }
            for (Diagnostic d : e.diagnostics().subList(0, Math.min(20, e.diagnostics().size()))) {
                err().println(file + ": " + d.render());
            }
            throw new FormatException(file.toString(), 0, 0, null, "cannot be used: " + Counts.of(e.diagnostics().size(), "error")
                    + " found by the validator (listed above; a circuit must at least be smooth and "
                    + "decomposable, with valid references and parameters; run circa validate for the full report)");
        }
        if (!model.normalized()) {
            err().println("circa: warning: " + file + " is not proven normalized (log Z = "
                    + model.report().logPartition() + "); densities are those of the unnormalised circuit");
        }
        return model;
    }

    /** The limits as set on the command line. */
    public ReadLimits limits() {
        try {
            return new ReadLimits(maxBytes, maxNodes, maxDepth, maxString, maxNumber);
        } catch (IllegalArgumentException e) {
            throw new UsageException("every --max-* limit must be positive");
        }
    }
}
