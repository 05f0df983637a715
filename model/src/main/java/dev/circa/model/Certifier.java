package dev.circa.model;

import dev.circa.format.Counts;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.certificate.Certificate;
import dev.circa.format.certificate.CertificateWriter;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import dev.circa.validator.regression.CheckReport;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import dev.circa.validator.render.SarifReport;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Certifies a circuit file: validates it under a {@link Requirement} (embedded checks included), runs
 * its embedded check cases and the given reference sets with the regression check, and, only when
 * everything passes, makes a sealed {@link Certificate} of the file's stored bytes (hashed while they
 * are read) and of what was proven. Immutable and thread-safe.
 */
public final class Certifier {
    private final ReadLimits limits;
    private final Requirement requirement;
    private final Double atol;
    private final Double rtol;

    /**
     * A certifier.
     *
     * @param limits read limits for the model and the reference sets
     * @param requirement what must be proven; the embedded checks are always run as well
     * @param atol absolute tolerance of the check cases and reference sets, or {@code null} for the
     *     model's {@code checks} value, else 1e-9
     * @param rtol relative tolerance, or {@code null} likewise
     */
    public Certifier(ReadLimits limits, Requirement requirement, Double atol, Double rtol) {
        this.limits = limits;
        this.requirement = requirement.withEmbeddedChecks(true);
        this.atol = atol;
        this.rtol = rtol;
    }

    /**
     * Certifies {@code model} against its embedded checks and {@code references}.
     *
     * @param model the circuit file
     * @param references reference CSV files (header: variable names, log_density, optionally output)
     * @return the certificate, or what failed
     * @throws FormatException when the model or a reference set cannot be read
     * @throws IllegalArgumentException when a tolerance is negative or not finite
     */
    public Certification certify(Path model, List<Path> references) throws FormatException {
        String name = InputFiles.displayName(model);
        ModelLoader loader = Model.loader().withLimits(limits).withRequirement(requirement);
        DigestingInputStream d = ModelLoader.openDigested(model);
        CircuitDocument doc;
        try {
            doc = loader.read(d, name, ModelLoader.isGzip(model));
        } catch (ModelException e) {
            d.abort();
            throw e;
        }
        try {
            d.finish(Long.MAX_VALUE - 1);
        } catch (IOException e) {
            throw new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage());
        }
        List<String> failures = new ArrayList<>();
        ValidationReport report = new Validator(requirement.validationOptions()).validate(doc);
        if (!report.valid()) {
            failures.add(name + ": " + Counts.of(report.count(Severity.ERROR), "error") + " found by the validator");
            return new Certification(null, report, null, List.of(), failures);
        }
        CompiledCircuit circuit = ModelLoader.compile(name, doc);
        Tolerance tol = Tolerance.resolve(doc.checks(), atol, rtol);
        RegressionCheck embedded = new RegressionCheck(circuit, tol);
        embedded.checkEmbedded(doc);
        CheckReport checks = embedded.report();
        if (!checks.passed()) {
            failures.add(name + ": " + checks.failures() + " of " + Counts.of(checks.cases(), "embedded check case") + " failed");
        }
        List<CheckReport> refReports = new ArrayList<>();
        List<Certificate.ReferenceEvidence> evidence = new ArrayList<>();
        for (Path ref : references) {
            String refName = InputFiles.displayName(ref);
            String sha;
            try {
                sha = CertificateCheck.sha256(InputFiles.openStored(ref));
            } catch (IOException e) {
                throw new FormatException(refName, 0, 0, null, "cannot be read: " + e.getMessage());
            }
            RegressionCheck check = new RegressionCheck(circuit, tol);
            check.checkReference(ref, limits);
            CheckReport r = check.report();
            refReports.add(r);
            if (!r.passed()) {
                failures.add(refName + ": " + r.failures() + " of " + Counts.of(r.cases(), "row") + " beyond tolerance");
            } else if (r.cases() == 0) {
                failures.add(refName + ": the reference set has no rows");
            }
            evidence.add(new Certificate.ReferenceEvidence(refName, sha, r.cases(), r.maxAbsError(), r.maxRelError()));
        }
        if (!failures.isEmpty()) {
            return new Certification(null, report, checks, refReports, failures);
        }
        Path base = model.getFileName();
        Certificate cert = new Certificate("1.0",
                new Certificate.CertifiedFile(base == null ? name : base.toString(), d.sha256(), d.count()),
                SarifReport.TOOL_VERSION, Instant.now().truncatedTo(ChronoUnit.SECONDS).toString(),
                certifiedRequirement(), tol.atol(), tol.rtol(), verdicts(report), exact(report.exactQueries()),
                new Certificate.CertifiedSize(report.stats().variables(), report.stats().nodes(),
                        report.stats().edges(), report.stats().depth()),
                new Certificate.CheckEvidence(checks.cases(), checks.maxAbsError(), checks.maxRelError()),
                evidence, null);
        return new Certification(cert.withSeal(CertificateWriter.seal(cert)), report, checks, refReports, failures);
    }

    private Certificate.CertifiedRequirement certifiedRequirement() {
        List<String> props = new ArrayList<>();
        for (Property p : requirement.properties()) {
            props.add(p.jsonName());
        }
        return new Certificate.CertifiedRequirement(props, requirement.tolerance(), requirement.maxEnumeration(), true);
    }

    private static Map<String, String> verdicts(ValidationReport report) {
        Map<String, String> m = new TreeMap<>();
        for (Property p : Property.values()) {
            Verdict v = report.property(p);
            m.put(p.jsonName(), (v == null ? Verdict.UNKNOWN : v).name().toLowerCase(java.util.Locale.ROOT));
        }
        return m;
    }

    private static Map<String, Boolean> exact(ExactQueries q) {
        return Map.of("density", q.density(), "marginal", q.marginal(), "conditional", q.conditional(),
                "mpe", q.mpe(), "sampling", q.sampling());
    }
}
