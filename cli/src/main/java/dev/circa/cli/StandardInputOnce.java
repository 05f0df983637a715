package dev.circa.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Set;
import picocli.CommandLine;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.ParseResult;

/**
 * Standard input can be read once: a command given {@code -} for two inputs (for example
 * {@code compare - -}, or {@code check --reference - --reference -}) is refused before any work,
 * whatever the command. Output options ({@code -o}, {@code --to-params}) are not inputs.
 */
final class StandardInputOnce {
    private static final Set<String> OUTPUT_OPTIONS = Set.of("-o", "--output", "--to-params");

    private StandardInputOnce() {
    }

    /** Throws a usage error naming the inputs when more than one of them is {@code -}. */
    static void check(ParseResult parsed) {
        ParseResult leaf = parsed;
        while (leaf.hasSubcommand()) {
            leaf = leaf.subcommand();
        }
        List<String> uses = new ArrayList<>();
        // an option given several times is matched several times, with one value holding them all
        for (ArgSpec a : new java.util.LinkedHashSet<>(leaf.matchedArgs())) {
            if (a instanceof OptionSpec o && isOutput(o)) {
                continue;
            }
            int n = dashes(a.getValue());
            String name = a instanceof OptionSpec o ? o.longestName() : a.paramLabel();
            for (int i = 0; i < n; i++) {
                uses.add(name);
            }
        }
        if (uses.size() > 1) {
            throw new CommandLine.ParameterException(leaf.commandSpec().commandLine(), "standard input (-) can be read only once,"
                    + " but " + uses.size() + " inputs name it (" + String.join(", ", uses)
                    + "); save it to a file and give the file's name for all but one of them");
        }
    }

    private static boolean isOutput(OptionSpec o) {
        for (String n : o.names()) {
            if (OUTPUT_OPTIONS.contains(n)) {
                return true;
            }
        }
        return false;
    }

    /** How many of the paths in {@code value} (a path, a collection or an array of them) are {@code -}. */
    private static int dashes(Object value) {
        if (value instanceof Path p) {
            return p.toString().equals("-") ? 1 : 0;
        }
        int n = 0;
        if (value instanceof Collection<?> c) {
            for (Object o : c) {
                n += dashes(o);
            }
        } else if (value instanceof Object[] arr) {
            for (Object o : arr) {
                n += dashes(o);
            }
        }
        return n;
    }
}
