package dev.circa.model;

import dev.circa.format.certificate.Certificate;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.regression.CheckReport;
import java.util.List;

/**
 * The outcome of {@link Certifier#certify}: a certificate when everything passed, else what failed.
 *
 * @param certificate the sealed certificate, or {@code null} when something failed
 * @param report the validator's report of the model
 * @param checks the embedded check cases' report, or {@code null} when validation already failed
 * @param references one report per reference set run, in the order given
 * @param failures what failed, one sentence each; empty when the certificate was made
 */
public record Certification(Certificate certificate, ValidationReport report, CheckReport checks,
        List<CheckReport> references, List<String> failures) {
    /**
     * Copies the lists.
     *
     * @param certificate the sealed certificate, or {@code null} when something failed
     * @param report the validator's report of the model
     * @param checks the embedded check cases' report, or {@code null} when validation already failed
     * @param references one report per reference set run, in the order given
     * @param failures what failed, one sentence each; empty when the certificate was made
     */
    public Certification {
        references = List.copyOf(references);
        failures = List.copyOf(failures);
    }

    /**
     * Whether everything passed and a certificate was made.
     *
     * @return true when {@link #certificate()} is not {@code null}
     */
    public boolean passed() {
        return certificate != null;
    }
}
