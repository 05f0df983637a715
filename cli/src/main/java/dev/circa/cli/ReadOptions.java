package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.PrintWriter;
import java.nio.file.Path;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * The named read limits of CLI.md, shared by every subcommand that reads a file, with the command's
 * standard output and error and the loading of a circuit under those limits.
 */
public final class ReadOptions {
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

    /** The circuit in {@code file}, read under these limits, validated and compiled. */
    LoadedCircuit load(Path file) throws FormatException {
        return LoadedCircuit.load(file, limits(), err());
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
