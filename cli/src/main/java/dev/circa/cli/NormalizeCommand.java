package dev.circa.cli;

import dev.circa.converter.normalize.NormalizationResult;
import dev.circa.converter.normalize.NotNormalizableException;
import dev.circa.converter.normalize.Renormalizer;
import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.FormatException;
import java.io.IOException;
import java.io.PrintWriter;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa normalize}: exact, distribution-preserving renormalisation. */
@Command(name = "normalize", mixinStandardHelpOptions = true,
        description = {"Rescales the weights of a smooth, decomposable circuit bottom-up so that",
            "every sum is locally normalised (w_ij becomes w_ij Z_j / Z_i) and every",
            "output is its normalised distribution; unnormalised categorical inputs get",
            "probabilities that add to 1, embedded check values are shifted by -log Z.",
            "Reports log Z of each output before and after."})
final class NormalizeCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "CIRCUIT", description = "The circuit file.")
    Path circuitFile;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "OUT", description = "The renormalised circuit (- for standard output).")
    Path output;

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws IOException {
        AtomicOutput.refuseInputs(output, circuitFile);
        PrintWriter err = read.err();
        Model model = read.use(circuitFile);
        NormalizationResult r;
        try {
            r = Renormalizer.normalize(model.document(), model.circuit(), model.report());
        } catch (NotNormalizableException e) {
            throw new FormatException(circuitFile.toString(), 0, 0, null, "cannot be renormalised: " + e.getMessage());
        }
        new CircuitWriter().write(r.document(), output, circuitFile);
        for (int o = 0; o < r.outputs().size(); o++) {
            err.println(String.format(Locale.ROOT, "output %s: log Z %s before, %s after",
                    r.outputs().get(o), logZ(r.logPartitionBefore()[o]), logZ(r.logPartitionAfter()[o])));
        }
        err.println(String.format(Locale.ROOT, "%d sum%s and %d categorical input%s rescaled; wrote %s",
                r.sumsChanged(), r.sumsChanged() == 1 ? "" : "s", r.inputsChanged(), r.inputsChanged() == 1 ? "" : "s",
                output.toString().equals("-") ? "standard output" : output.toString()));
        err.flush();
        return ExitStatus.OK;
    }

    private static String logZ(double v) {
        return v == Double.NEGATIVE_INFINITY ? "-inf" : Double.toString(v);
    }
}
