package dev.circa.cli;

import dev.circa.converter.regions.GridRegions;
import dev.circa.converter.regions.RandomRegions;
import dev.circa.format.Variable;
import dev.circa.format.regions.RegionGraph;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code circa regions}: generate region graphs. */
@Command(name = "regions", mixinStandardHelpOptions = true,
        description = "Generates a region graph (see docs/region-graph.md).",
        subcommands = {RegionsCommand.Random.class, RegionsCommand.Grid.class})
final class RegionsCommand implements Runnable {
    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new picocli.CommandLine.ParameterException(spec.commandLine(), "choose random or grid");
    }

    /** {@code circa regions random}. */
    @Command(name = "random", mixinStandardHelpOptions = true,
            description = {"Random splits of the variable set to depth D, repeated R times from the root, seeded.",
                "How a split is drawn: " + RandomRegions.SPLIT_RULE})
    static final class Random implements Callable<Integer> {
        @Option(names = "--vars", paramLabel = "N", description = "Number of real variables x0 ... x<N-1>.")
        Integer vars;

        @Option(names = "--variables", paramLabel = "FILE.json", description = "A JSON array of variables (see docs/documents.md).")
        Path variablesFile;

        @Option(names = "--depth", required = true, paramLabel = "D", description = "Depth of the splits.")
        int depth;

        @Option(names = "--repeats", paramLabel = "R", description = "Splits of the root (default: ${DEFAULT-VALUE}).")
        int repeats = 1;

        @Option(names = "--seed", paramLabel = "S", description = "Seed (default: ${DEFAULT-VALUE}).")
        long seed = 0;

        @Option(names = RandomRegions.MAX_VARIABLES, paramLabel = "N",
                description = "Most variables generated, checked first (default: ${DEFAULT-VALUE}).")
        long maxVars = RandomRegions.DEFAULT_MAX_VARIABLES;

        @Mixin
        RegionGraphOutput output;

        @Mixin
        ReadOptions read;

        @Override
        public Integer call() throws Exception {
            if ((vars == null) == (variablesFile == null)) {
                throw new UsageException("give exactly one of --vars N or --variables FILE.json");
            }
            if (depth < 0 || repeats < 1) {
                throw new UsageException("--depth must be >= 0 and --repeats >= 1");
            }
            List<Variable> variables;
            if (vars != null) {
                if (vars < 1) {
                    throw new UsageException("--vars must be >= 1, got " + vars);
                }
                try {
                    RandomRegions.checkLimits(vars, depth, repeats, read.limits(), maxVars);
                } catch (dev.circa.format.io.LimitExceededException e) {
                    throw new UsageException(e.problem()); // no file to name: the options ask for too much
                }
                variables = RandomRegions.realVariables(vars);
            } else {
                variables = RandomRegions.readVariables(variablesFile, read.limits());
            }
            RegionGraph g;
            try {
                g = RandomRegions.generate(variables, depth, repeats, seed, read.limits(), maxVars);
            } catch (IllegalArgumentException e) {
                throw new UsageException(e.getMessage());
            }
            output.write(g, variablesFile);
            return ExitStatus.OK;
        }
    }

    /** {@code circa regions grid}. */
    @Command(name = "grid", mixinStandardHelpOptions = true,
            description = {"Recursive axis-aligned halving of an H x W grid of real variables r<row>c<col>, row-major:",
                "each region splits its longer side (height on ties) at floor(length / 2), down to single cells."})
    static final class Grid implements Callable<Integer> {
        @Option(names = "--height", required = true, paramLabel = "H", description = "Rows.")
        int height;

        @Option(names = "--width", required = true, paramLabel = "W", description = "Columns.")
        int width;

        @Mixin
        RegionGraphOutput output;

        @Override
        public Integer call() throws Exception {
            if (height < 1 || width < 1) {
                throw new UsageException("--height and --width must be >= 1");
            }
            RegionGraph g = GridRegions.generate(height, width);
            output.write(g);
            return ExitStatus.OK;
        }
    }
}
