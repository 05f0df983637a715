package dev.circa.cli;

import java.util.Map;
import picocli.CommandLine;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.ParseResult;

/**
 * The ranges of the numeric options that several commands share, checked for every command before
 * it does any work: a value out of range is a usage error (status 2) naming the option, whichever
 * command it is given to. A command that adds an option of one of these names gets the check too.
 */
final class OptionValues {
    /** Smallest accepted value of each whole-number option. */
    private static final Map<String, Long> AT_LEAST = Map.ofEntries(
            Map.entry("--sums", 1L), Map.entry("--inputs", 1L), Map.entry("--outputs", 1L),
            Map.entry("--verify", 1L), Map.entry("--samples", 1L), Map.entry("-n", 0L),
            Map.entry("--vars", 1L), Map.entry("--depth", 0L), Map.entry("--repeats", 1L),
            Map.entry("--height", 1L), Map.entry("--width", 1L), Map.entry("--max-enumeration", 1L),
            Map.entry("--max-render-nodes", 0L), Map.entry("--max-bytes", 1L), Map.entry("--max-nodes", 1L),
            Map.entry("--max-depth", 1L), Map.entry("--max-string", 1L), Map.entry("--max-number", 1L));

    /** Options that are tolerances: finite numbers >= 0. */
    private static final java.util.Set<String> TOLERANCES = java.util.Set.of("--atol", "--rtol", "--tolerance");

    private OptionValues() {
    }

    /** Throws a usage error for the first given option whose value is out of its range. */
    static void check(ParseResult parsed) {
        ParseResult leaf = parsed;
        while (leaf.hasSubcommand()) {
            leaf = leaf.subcommand();
        }
        for (OptionSpec o : leaf.matchedOptions()) {
            String name = o.longestName();
            Object v = o.getValue();
            String problem = null;
            if (TOLERANCES.contains(name) && v instanceof Number n) {
                double d = n.doubleValue();
                if (!Double.isFinite(d) || d < 0) {
                    problem = name + " takes a finite number >= 0 (a tolerance); got " + o.originalStringValues().get(0);
                }
            } else if (AT_LEAST.containsKey(name) && v instanceof Number n && n.longValue() < AT_LEAST.get(name)) {
                problem = name + " takes a whole number >= " + AT_LEAST.get(name) + "; got " + n.longValue();
            }
            if (problem != null) {
                throw new CommandLine.ParameterException(leaf.commandSpec().commandLine(), problem);
            }
        }
    }
}
