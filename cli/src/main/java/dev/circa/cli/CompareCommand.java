package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.validator.compare.CircuitComparison;
import dev.circa.validator.compare.CompareOptions;
import dev.circa.validator.compare.ComparisonReport;
import dev.circa.validator.compare.IncompatibleCircuitsException;
import java.io.PrintWriter;
import dev.circa.model.Model;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa compare}: numerical equivalence of two circuits over the same variables. */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = {"Compares two circuits over the same variables (matched by name; types and",
            "states must agree): log-densities at points sampled from each, and at the",
            "same points with random variables missing. Log-densities a and b agree when",
            "|a - b| <= atol + rtol * max(|a|, |b|). Says when the circuits are",
            "structurally identical up to node order. Exit status 1 beyond tolerance."})
final class CompareCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "A", description = "The first circuit.")
    Path first;

    @Parameters(index = "1", paramLabel = "B", description = "The second circuit.")
    Path second;

    @Option(names = "--samples", paramLabel = "N", description = "Points sampled from each circuit per output (default: ${DEFAULT-VALUE}).")
    int samples = CompareOptions.DEFAULT.samples();

    @Option(names = "--seed", paramLabel = "S", description = "Seed (default: ${DEFAULT-VALUE}).")
    long seed = CompareOptions.DEFAULT.seed();

    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance (default: ${DEFAULT-VALUE}).")
    double atol = CompareOptions.DEFAULT.atol();

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance (default: ${DEFAULT-VALUE}).")
    double rtol = CompareOptions.DEFAULT.rtol();

    @Mixin
    TextOrJson format;

    @Mixin
    ReadOptions read;

    @Override
    public Integer call() throws FormatException {
        if (samples < 1) {
            throw new UsageException("--samples must be >= 1, got " + samples);
        }
        CompareOptions options;
        try {
            options = new CompareOptions(samples, seed, atol, rtol);
        } catch (IllegalArgumentException e) {
            throw new UsageException("--atol and --rtol must be finite and >= 0");
        }
        Model a = read.load(first);
        Model b = read.load(second);
        ComparisonReport report;
        try {
            report = CircuitComparison.compare(a.circuit(), b.circuit(), options);
        } catch (IncompatibleCircuitsException e) {
            throw new UsageException("cannot compare " + first + " with " + second + ": " + e.getMessage());
        }
        PrintWriter out = read.out();
        out.print(format.json() ? report.toJson() : report.toText());
        out.flush();
        return report.passed() ? ExitStatus.OK : ExitStatus.FAILED;
    }
}
