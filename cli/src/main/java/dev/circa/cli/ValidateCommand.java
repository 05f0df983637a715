package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.model.Requirement;
import dev.circa.validator.ReportFormat;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationOutcome;
import dev.circa.validator.Validator;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa validate}: proves circuit files valid, or says exactly why not. */
@Command(name = "validate", mixinStandardHelpOptions = true,
        description = {"Checks schema, references, children-first order, scopes, properties (smooth,",
            "decomposable, deterministic, structured-decomposable, normalized), parameters, normalisation",
            "and embedded checks, and says which queries are exact. Exit status: 0 valid, 1 an error",
            "diagnostic, 2 a file from which no model can be built (the highest over all files)."})
final class ValidateCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "FILE", description = "Circuit files (.json, .json.gz, or - for standard input).")
    List<Path> files;

    @Option(names = "--require", paramLabel = "LIST",
            description = "Properties that must be proven true (default: ${DEFAULT-VALUE}); empty requires none.")
    String require = "smooth,decomposable,normalized";

    @Option(names = "--tolerance", paramLabel = "T",
            description = "Bound on |sum of weights - 1|, |sum of probabilities - 1| and |log Z| (default: ${DEFAULT-VALUE}).")
    double tolerance = ValidationOptions.DEFAULT_TOLERANCE;

    @Option(names = "--max-enumeration", paramLabel = "N",
            description = "Assignments enumerated to prove a sum deterministic (default: ${DEFAULT-VALUE}).")
    int maxEnumeration = ValidationOptions.DEFAULT_MAX_ENUMERATION;

    @Option(names = "--rule", paramLabel = "CODE:off|warn|error", description = "Change one rule's severity (repeatable).")
    List<String> rules = new ArrayList<>();

    @Option(names = "--format", paramLabel = "FORMAT", description = "text (default), json or sarif.")
    String format = "text";

    @Option(names = "--schema-check", paramLabel = "WHEN",
            description = {"auto (default): check against the bundled JSON Schema, streamed beside the read",
                "(it costs less than the rest of validation, so every file is checked); always; never."})
    String schemaCheck = "auto";

    @Mixin
    CircuitReadOptions read;

    @Override
    public Integer call() throws Exception {
        ReportFormat fmt;
        ValidationOptions options;
        try {
            fmt = ReportFormat.fromName(format);
            options = ValidationOptions.defaults().withRequire(require).withTolerance(tolerance)
                    .withMaxEnumeration(maxEnumeration);
            for (String r : rules) {
                options = options.withRule(r);
            }
        } catch (IllegalArgumentException e) {
            throw new UsageException(e.getMessage());
        }
        if (!List.of("auto", "always", "never").contains(schemaCheck)) {
            throw new UsageException("--schema-check must be auto, always or never, got \"" + schemaCheck + "\"");
        }
        if (read.certified()) {
            boolean asked = read.command.commandLine().getParseResult().hasMatchedOption("--require");
            return read.verifyCertificate(files, asked ? Requirement.parse(require).withTolerance(tolerance) : null);
        }
        PrintWriter out = read.out();
        PrintWriter err = read.err();
        List<ValidationOutcome> outcomes = new ArrayList<>();
        try (Progress progress = Progress.start(err, "circa validate")) {
            for (Path f : files) {
                progress.phase("circa validate: validating " + f);
                Validator v = new Validator(options, useSchema(f) ? SchemaCheck.BUNDLED : SchemaCheck.NONE);
                try {
                    outcomes.add(ValidationOutcome.of(v.validate(f, read.limits())));
                } catch (FormatException failure) {
                    FormatException e = ConvertibleDocument.explain(f, failure, read.limits());
                    progress.clear();
                    err.println("circa: " + e.getMessage());
                    outcomes.add(ValidationOutcome.failed(f.toString(), e));
                }
            }
        }
        String rendered = fmt.renderOutcomes(outcomes);
        if (fmt != ReportFormat.TEXT || outcomes.stream().anyMatch(o -> o.report() != null)) {
            out.print(rendered);
            out.flush();
        }
        return ValidationOutcome.exitStatus(outcomes);
    }

    private boolean useSchema(Path f) {
        // auto: the streaming schema check costs less than the rest of validation at any size (docs/command-line.md)
        return !schemaCheck.equals("never");
    }
}
