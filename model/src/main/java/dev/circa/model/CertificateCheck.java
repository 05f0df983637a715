package dev.circa.model;

import dev.circa.format.certificate.Certificate;
import dev.circa.format.certificate.CertificateReader;
import dev.circa.format.certificate.CertificateWriter;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.ReadLimits;
import dev.circa.model.CertificateMismatchException.Reason;
import dev.circa.validator.CircuitStats;
import dev.circa.validator.ExactQueries;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The rules that match a certificate to a circuit file: the seal (the certificate is intact), the
 * requirement (it proves at least what is asked) and the bytes (SHA-256 and size of the file as
 * stored). The seal detects edits, not authorship: anyone can compute a seal.
 */
public final class CertificateCheck {
    private CertificateCheck() {
    }

    /**
     * Checks {@code certificate} against {@code file} without reading the circuit: the seal, then the
     * SHA-256 and size of the file's stored bytes, read once (what {@code circa validate --certificate}
     * does).
     *
     * @param file the circuit file
     * @param certificate its certificate
     * @param limits read limits for the certificate
     * @param required what the certificate must prove, or {@code null} to leave that unchecked
     * @return the certificate, intact and matching the file
     * @throws ModelException when either cannot be read, or a {@link CertificateMismatchException}
     */
    public static Certificate verify(Path file, Path certificate, ReadLimits limits, Requirement required)
            throws ModelException {
        Certificate cert = read(certificate, limits);
        String certName = InputFiles.displayName(certificate);
        checkSeal(cert, certName);
        if (required != null) {
            checkCovers(cert, required, certName);
        }
        String name = InputFiles.displayName(file);
        DigestingInputStream d;
        try {
            d = new DigestingInputStream(InputFiles.openStored(file));
        } catch (FormatException e) {
            throw ModelException.unreadable(e);
        }
        try {
            d.finish(cert.model().bytes());
        } catch (IOException e) {
            throw ModelException.unreadable(new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage()));
        }
        checkBytes(cert, certName, d, file, null);
        return cert;
    }

    /** Reads a certificate; a read error is an unreadable input. */
    static Certificate read(Path certificate, ReadLimits limits) throws ModelException {
        try {
            return new CertificateReader(limits).read(certificate);
        } catch (FormatException e) {
            throw ModelException.unreadable(e);
        }
    }

    /** Refuses a certificate whose seal is not the digest of its content. */
    static void checkSeal(Certificate cert, String certName) throws CertificateMismatchException {
        String expected = CertificateWriter.seal(cert);
        if (!expected.equals(cert.seal())) {
            throw new CertificateMismatchException(certName, Reason.CERTIFICATE_EDITED, "the certificate's seal "
                    + cert.seal() + " is not the SHA-256 of its content (" + expected + "): a field was edited "
                    + "after certification, so nothing it says can be relied on; certify the model again", null);
        }
    }

    /** Refuses a certificate that proves less than {@code r}. */
    static void checkCovers(Certificate cert, Requirement r, String certName) throws CertificateMismatchException {
        for (Property p : r.properties()) {
            String verdict = cert.properties().get(p.jsonName());
            if (!"true".equals(verdict)) {
                throw weaker(certName, p.optionName() + " is required, but the certificate says "
                        + (verdict == null ? "nothing about it" : verdict));
            }
        }
        if (r.requires(Property.NORMALIZED) && cert.requirement().tolerance() > r.tolerance()) {
            throw weaker(certName, String.format(Locale.ROOT, "normalized is required within %s, but was proven "
                    + "within %s only", r.tolerance(), cert.requirement().tolerance()));
        }
        if (r.embeddedChecks() && !cert.requirement().embeddedChecks()) {
            throw weaker(certName, "the embedded checks are required to pass, but were not run");
        }
    }

    private static CertificateMismatchException weaker(String certName, String why) {
        return new CertificateMismatchException(certName, Reason.WEAKER_REQUIREMENT,
                "the certificate proves less than required: " + why, null);
    }

    /** Refuses a file whose bytes, as hashed by {@code d}, are not the certified ones. */
    static void checkBytes(Certificate cert, String certName, DigestingInputStream d, Path file, Throwable cause)
            throws CertificateMismatchException {
        String name = InputFiles.displayName(file);
        Path base = file.getFileName();
        String sha = d.sha256();
        Certificate.CertifiedFile c = cert.model();
        if (sha.equals(c.sha256()) && d.count() == c.bytes()) {
            return;
        }
        String seen = d.count() > c.bytes() ? "more than " + c.bytes() : Long.toString(d.count());
        if (base != null && !base.toString().equals(c.file())) {
            throw new CertificateMismatchException(name, Reason.OTHER_FILE, "the certificate " + certName
                    + " is of another file, " + c.file() + " (" + c.bytes() + " bytes, SHA-256 " + c.sha256()
                    + "); this one has " + seen + " bytes, SHA-256 " + sha, cause);
        }
        if (d.count() != c.bytes()) {
            throw new CertificateMismatchException(name, Reason.SIZE_CHANGED, "has " + seen + " bytes, but "
                    + certName + " certifies " + c.bytes() + ": the file was truncated or extended after "
                    + "certification", cause);
        }
        throw new CertificateMismatchException(name, Reason.CONTENT_CHANGED, "SHA-256 " + sha + " is not the "
                + "certified " + c.sha256() + " of " + certName + ": the file changed after certification", cause);
    }

    /**
     * The report a certified load serves instead of validating again: the certified verdicts, exact
     * queries and sizes; no log Z (the model computes its own) and no diagnostics.
     */
    static ValidationReport report(Certificate cert, String name) {
        Map<Property, Verdict> verdicts = new EnumMap<>(Property.class);
        for (Property p : Property.values()) {
            String v = cert.properties().getOrDefault(p.jsonName(), "unknown");
            verdicts.put(p, Verdict.valueOf(v.toUpperCase(Locale.ROOT)));
        }
        Map<String, Boolean> q = cert.exactQueries();
        ExactQueries exact = new ExactQueries(q.get("density"), q.get("marginal"), q.get("conditional"),
                q.get("mpe"), q.get("sampling"));
        Certificate.CertifiedSize s = cert.size();
        return new ValidationReport(name, true, verdicts, null, null, exact,
                new CircuitStats(s.variables(), s.nodes(), s.edges(), s.depth()), List.of());
    }

    /** Hashes a whole stream (a reference set), lower-case hex. */
    static String sha256(InputStream stored) throws IOException {
        try (DigestingInputStream d = new DigestingInputStream(stored)) {
            d.finish(Long.MAX_VALUE - 1);
            return d.sha256();
        }
    }
}
