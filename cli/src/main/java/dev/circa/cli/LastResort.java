package dev.circa.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Set;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.ParseResult;

/**
 * The messages of failures no command reports itself (an internal error of circa, memory or stack
 * exhausted), naming what was being done: the command and the inputs it was reading, never its output.
 */
final class LastResort {
    private String command = "circa";
    private final List<String> inputs = new ArrayList<>();

    /** Remembers the command and its inputs once the command line is parsed. */
    void parsed(ParseResult parsed) {
        ParseResult leaf = parsed;
        while (leaf.hasSubcommand()) {
            leaf = leaf.subcommand();
        }
        command = leaf.commandSpec().qualifiedName();
        inputs.clear();
        List<ArgSpec> args = new ArrayList<>(leaf.matchedPositionals());
        leaf.matchedOptions().stream().filter(o -> java.util.Collections.disjoint(Set.of(o.names()), OutputTargets.OUTPUT_OPTIONS))
                .forEach(args::add);
        for (ArgSpec a : args) {
            Object v = a.getValue();
            for (Object x : v instanceof Collection<?> c ? c : List.of(v == null ? "" : v)) {
                if (x instanceof Path p && !inputs.contains(p.toString())) {
                    inputs.add(p.toString());
                }
            }
        }
    }

    /** "circa eval reading a.json, b.csv" (or only the command when it read no file). */
    String doing() {
        return command + (inputs.isEmpty() ? "" : " reading " + String.join(", ", inputs));
    }

    String outOfMemory() {
        return "circa: out of memory in " + doing() + "; give Java more heap with CIRCA_JAVA_OPTS=-Xmx... "
                + "or give a smaller input";
    }

    String stackExhausted() {
        return "circa: " + doing() + ": the input is nested too deeply to process (stack exhausted)";
    }

    /** An error of circa itself: no class name, what was being done, where the details are. */
    String internal(boolean debug) {
        return "circa: internal error of circa in " + doing() + ": this is a fault of circa, not of the input; "
                + "please report it" + (debug ? " with the stack trace below" : " (run with --debug for the stack trace)");
    }
}
