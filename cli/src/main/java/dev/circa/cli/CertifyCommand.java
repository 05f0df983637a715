package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.format.certificate.Certificate;
import dev.circa.format.certificate.CertificateWriter;
import dev.circa.format.io.FormatException;
import dev.circa.model.Certification;
import dev.circa.model.Certifier;
import dev.circa.model.Requirement;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Severity;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code circa certify}: validate once, and write a certificate that later loads check instead. */
@Command(name = "certify", mixinStandardHelpOptions = true,
        description = {"Certifies a circuit file: validates it (--require), runs its embedded checks and",
            "every --reference set, and only when all pass writes a certificate (-o) holding the",
            "SHA-256 and size of the file's bytes, what was required and proven, which queries are",
            "exact, and each reference set's SHA-256, rows and largest errors. Commands given",
            "--certificate then check the bytes instead of validating again. Exit status 1 when",
            "the model has an error or a check fails (nothing written), 2 when an input cannot be read."})
final class CertifyCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL", description = "The circuit file (.json or .json.gz).")
    Path modelFile;

    @Option(names = "--reference", paramLabel = "REF.csv", description = "A reference set (repeatable).")
    List<Path> references = new ArrayList<>();

    @Option(names = "--require", paramLabel = "PROPS",
            description = "Properties that must be proven (default: smooth,decomposable, what a model load requires).")
    String require;

    @Option(names = "--tolerance", paramLabel = "T", description = "Bound on normalisation errors (default: 1e-9).")
    Double tolerance;

    @Option(names = "--atol", paramLabel = "A", description = "Absolute tolerance of the checks (default: the file's checks value, else 1e-9).")
    Double atol;

    @Option(names = "--rtol", paramLabel = "R", description = "Relative tolerance of the checks (default: the file's checks value, else 1e-9).")
    Double rtol;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "MODEL.cert.json", description = "The certificate to write.")
    Path output;

    @Mixin
    ReadOptions read;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws FormatException, IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        List<Path> inputs = new ArrayList<>(references);
        inputs.add(modelFile);
        dev.circa.format.io.AtomicOutput.refuseInputs(output, inputs.toArray(Path[]::new));
        Certification c = new Certifier(read.limits(), requirement(), atol, rtol).certify(modelFile, references);
        if (!c.passed()) {
            int shown = 0;
            for (Diagnostic d : c.report().diagnostics()) {
                if (d.severity() == Severity.ERROR && shown++ < 20) {
                    err.println(modelFile + ": " + d.render());
                }
            }
            for (String f : c.failures()) {
                err.println("circa: " + f);
            }
            err.println("circa: not certified; " + output + " was not written");
            return ExitStatus.FAILED;
        }
        new CertificateWriter().write(c.certificate(), output, inputs.toArray(Path[]::new));
        Certificate cert = c.certificate();
        out.println("certified " + modelFile + " (" + Counts.of(cert.model().bytes(), "byte") + ", SHA-256 "
                + cert.model().sha256() + "): " + Counts.of(cert.checks().cases(), "embedded case") + ", "
                + Counts.of(cert.references().size(), "reference set") + "; certificate " + output);
        out.flush();
        return ExitStatus.OK;
    }

    private Requirement requirement() {
        try {
            Requirement r = require == null ? Requirement.DEFAULT : Requirement.parse(require);
            if (tolerance != null) {
                r = r.withTolerance(tolerance);
            }
            if (atol != null && !(atol >= 0 && Double.isFinite(atol)) || rtol != null && !(rtol >= 0 && Double.isFinite(rtol))) {
                throw new IllegalArgumentException("--atol and --rtol must be finite and >= 0");
            }
            return r;
        } catch (IllegalArgumentException e) {
            throw new UsageException(e.getMessage());
        }
    }
}
