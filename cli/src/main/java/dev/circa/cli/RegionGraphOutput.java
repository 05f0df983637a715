package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphWriter;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** The {@code -o/--output} option of the region graph generators, and the writing with its one-line summary. */
final class RegionGraphOutput {
    @Option(names = {"-o", "--output"}, required = true, paramLabel = "OUT", description = "The region graph to write.")
    Path output;

    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    /** Writes {@code g} (never over one of {@code inputs}) and says on standard error what was written. */
    void write(RegionGraph g, Path... inputs) throws IOException {
        new RegionGraphWriter().write(g, output, inputs);
        PrintWriter err = command.commandLine().getErr();
        err.printf("wrote %s: %s, %s, %s%n", output, Counts.of(g.variables().size(), "variable"),
                Counts.of(g.regions().size(), "region"), Counts.of(g.partitions().size(), "partition"));
    }
}
