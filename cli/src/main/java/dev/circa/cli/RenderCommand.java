package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.converter.render.DotRenderer;
import dev.circa.converter.render.RenderOptions;
import dev.circa.format.io.AtomicOutput;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa render}: Graphviz DOT of a circuit's structure. */
@Command(name = "render", mixinStandardHelpOptions = true,
        description = {"Writes the structure of a circuit as Graphviz DOT (draw it with, e.g.,",
            "dot -Tsvg): node kind, input family, variable and rounded parameters,",
            "rounded sum weights on the edges, scopes with --scopes. Above",
            "--max-render-nodes nodes, a summary by scope: one node per distinct scope",
            "and kind with its node count, edges aggregated."})
final class RenderCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file.")
    Path circuitFile;

    @Option(names = {"-o", "--output"}, paramLabel = "OUT.dot", description = "Output file (default: standard output).")
    Path output = Path.of("-");

    @Option(names = "--scopes", description = "Show each node's scope.")
    boolean scopes;

    @Option(names = "--max-render-nodes", paramLabel = "N",
            description = "Above this many nodes, draw a summary by scope (default: ${DEFAULT-VALUE}).")
    int maxNodes = RenderOptions.DEFAULT_MAX_NODES;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws IOException {
        if (maxNodes < 0) {
            throw new UsageException("--max-render-nodes must be >= 0, got " + maxNodes);
        }
        AtomicOutput.refuseInputs(output, circuitFile);
        PrintWriter err = read.err();
        Model model = read.use(circuitFile);
        RenderOptions options = new RenderOptions(scopes, maxNodes);
        if (DotRenderer.isSummary(model.circuit(), options)) {
            err.println(String.format(Locale.ROOT, "%s is more than --max-render-nodes %d: drawing a summary by scope",
                    Counts.of(model.circuit().nodeCount(), "node"), maxNodes));
        }
        AtomicOutput.write(output, stream -> {
            BufferedWriter w = new BufferedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8));
            DotRenderer.render(model.circuit(), options, w, DotRenderer.labelsOf(model.document()));
            w.flush();
        }, circuitFile);
        return ExitStatus.OK;
    }
}
