package dev.circa.cli;

import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.FormatException;
import java.nio.file.Path;
import java.util.Set;
import picocli.CommandLine;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.ParseResult;

/**
 * Checks, for every command and before any work, that each output it was given can be written: a
 * non-empty name, not a folder, in a folder that exists. A conversion that would run for minutes
 * then fail to write is stopped at once (status 2, naming the output).
 */
final class OutputTargets {
    static final Set<String> OUTPUT_OPTIONS = Set.of("-o", "--output", "--to-params");

    private OutputTargets() {
    }

    /** Throws a usage error naming the first output that cannot be written. */
    static void check(ParseResult parsed) {
        ParseResult leaf = parsed;
        while (leaf.hasSubcommand()) {
            leaf = leaf.subcommand();
        }
        for (OptionSpec o : leaf.matchedOptions()) {
            if (!(o.getValue() instanceof Path target) || java.util.Collections.disjoint(Set.of(o.names()), OUTPUT_OPTIONS)) {
                continue;
            }
            try {
                AtomicOutput.checkTarget(target);
            } catch (FormatException e) {
                throw new CommandLine.ParameterException(leaf.commandSpec().commandLine(), e.getMessage());
            }
        }
    }
}
