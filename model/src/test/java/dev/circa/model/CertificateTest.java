package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.certificate.Certificate;
import dev.circa.format.certificate.CertificateReader;
import dev.circa.format.certificate.CertificateWriter;
import dev.circa.format.io.ReadLimits;
import dev.circa.model.CertificateMismatchException.Reason;
import dev.circa.validator.Property;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Certify, load with a certificate, and each refusal, through the API. */
class CertificateTest {
    @TempDir
    Path dir;

    private Path model() throws Exception {
        Path p = dir.resolve("pump-station.json");
        Files.copy(Fixtures.PUMP_STATION, p);
        return p;
    }

    /**
     * A reference set for the pump-station circuit; its log-densities from commons-math3's
     * NormalDistribution (0.85 N(3.1, 0.2) p1 + 0.15 N(2.2, 0.5) p2, the mixture of FORMAT.md section 2),
     * shifted by {@code offset} to make a failing set.
     */
    private Path reference(String name, double offset) throws Exception {
        double[] p1 = {0.05, 0.15, 0.80};
        double[] p2 = {0.6, 0.3, 0.1};
        String[] states = {"closed", "half", "open"};
        NormalDistribution a = new NormalDistribution(3.1, 0.2);
        NormalDistribution b = new NormalDistribution(2.2, 0.5);
        StringBuilder csv = new StringBuilder("inlet_pressure,valve,log_density\n");
        for (int i = 0; i < 30; i++) {
            double x = 1.5 + 0.08 * i;
            int v = i % 3;
            double p = 0.85 * a.density(x) * p1[v] + 0.15 * b.density(x) * p2[v];
            csv.append(String.format(Locale.ROOT, "%s,%s,%s%n", Double.toString(x), states[v], Double.toString(Math.log(p) + offset)));
        }
        Path p = dir.resolve(name);
        Files.writeString(p, csv, StandardCharsets.UTF_8);
        return p;
    }

    private static String sha256(Path p) throws Exception {
        // Source: java.security.MessageDigest over the whole file, independent of the loader's reading.
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(p)));
    }

    private Path certify(Path model, Requirement r, Path... refs) throws Exception {
        Certification c = new Certifier(ReadLimits.DEFAULT, r, null, null).certify(model, List.of(refs));
        assertTrue(c.passed(), c.failures().toString());
        Path cert = dir.resolve(model.getFileName() + ".cert.json");
        new CertificateWriter().write(c.certificate(), cert);
        return cert;
    }

    @Test
    void certify_pumpStation_digestSizeVerdictsAndEvidence() throws Exception {
        Path model = model();
        Path ref = reference("ref.csv", 0);
        Certification c = new Certifier(ReadLimits.DEFAULT, Requirement.DEFAULT, null, null).certify(model, List.of(ref));
        assertTrue(c.passed(), c.failures().toString());
        Certificate cert = c.certificate();
        assertEquals(sha256(model), cert.model().sha256());
        assertEquals(Files.size(model), cert.model().bytes());
        assertEquals("pump-station.json", cert.model().file());
        assertEquals("true", cert.properties().get("smooth"));
        assertEquals("false", cert.properties().get("deterministic"));
        assertEquals(Boolean.FALSE, cert.exactQueries().get("mpe"));
        assertEquals(Boolean.TRUE, cert.exactQueries().get("marginal"));
        assertEquals(2, cert.checks().cases());
        assertEquals(1, cert.references().size());
        assertEquals(sha256(ref), cert.references().get(0).sha256());
        assertEquals(30, cert.references().get(0).rows());
        assertTrue(cert.references().get(0).maxAbsError() < 1e-12, "agrees with commons-math3");
        assertEquals(CertificateWriter.seal(cert), cert.seal());
        assertEquals(List.of("smooth", "decomposable"), cert.requirement().properties());
        assertTrue(cert.requirement().embeddedChecks());
    }

    @Test
    void certify_gzipModel_digestOfCompressedBytes() throws Exception {
        Path gz = dir.resolve("pump-station.json.gz");
        try (var out = new java.util.zip.GZIPOutputStream(Files.newOutputStream(gz))) {
            out.write(Files.readAllBytes(Fixtures.PUMP_STATION));
        }
        Path cert = certify(gz, Requirement.DEFAULT);
        Certificate c = new CertificateReader().read(cert);
        assertEquals(sha256(gz), c.model().sha256());
        assertEquals(Files.size(gz), c.model().bytes());
        assertEquals(Model.load(gz).logDensity(Map.of("inlet_pressure", 3.0)),
                Model.loader().load(gz, cert).logDensity(Map.of("inlet_pressure", 3.0)));
    }

    @Test
    void certify_failingReference_noCertificate() throws Exception {
        Certification c = new Certifier(ReadLimits.DEFAULT, Requirement.DEFAULT, null, null)
                .certify(model(), List.of(reference("ok.csv", 0), reference("off.csv", 1e-3)));
        assertFalse(c.passed());
        assertNull(c.certificate());
        assertEquals(1, c.failures().size(), c.failures().toString());
        assertTrue(c.failures().get(0).endsWith("off.csv: 30 of 30 rows beyond tolerance"), c.failures().get(0));
    }

    @Test
    void certify_requirementNotProven_noCertificate() throws Exception {
        Path p = dir.resolve("two.json");
        Files.writeString(p, Fixtures.DETERMINISTIC.replace("\"weights\": [0.3, 0.7]", "\"weights\": [0.6, 0.7]"));
        Certification c = new Certifier(ReadLimits.DEFAULT, Requirement.also(Property.NORMALIZED), null, null)
                .certify(p, List.of());
        assertFalse(c.passed());
        assertFalse(c.report().valid());
    }

    @Test
    void loadWithCertificate_sameValuesAsValidatedLoad_reportFromCertificate() throws Exception {
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        Model plain = Model.load(model);
        Model certified = Model.loader().load(model, cert);
        Map<String, Object> row = Map.of("inlet_pressure", 3.0, "valve", "open");
        assertEquals(Fixtures.SCIPY_FULL, certified.logDensity(row), 1e-12);
        assertEquals(plain.logDensity(row), certified.logDensity(row));
        assertEquals(plain.report().properties(), certified.report().properties());
        assertEquals(plain.report().exactQueries(), certified.report().exactQueries());
        assertEquals(plain.report().stats(), certified.report().stats());
        assertEquals(plain.normalized(), certified.normalized());
    }

    @Test
    void loadWithCertificate_oneChangedByteInAWeight_refused() throws Exception {
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        String text = Files.readString(model);
        Files.writeString(model, text.replace("[0.85, 0.15]", "[0.86, 0.15]"));
        assertEquals(text.length(), Files.readString(model).length());
        CertificateMismatchException e = assertThrows(CertificateMismatchException.class,
                () -> Model.loader().load(model, cert));
        assertEquals(Reason.CONTENT_CHANGED, e.reason());
        assertTrue(e.getMessage().contains("changed after certification"), e.getMessage());
        assertThrows(CertificateMismatchException.class, () -> CertificateCheck.verify(model, cert, ReadLimits.DEFAULT, null));
    }

    @Test
    void loadWithCertificate_truncatedFile_refusedAsTruncated() throws Exception {
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        byte[] b = Files.readAllBytes(model);
        Files.write(model, java.util.Arrays.copyOf(b, b.length / 2));
        CertificateMismatchException e = assertThrows(CertificateMismatchException.class,
                () -> Model.loader().load(model, cert));
        assertEquals(Reason.SIZE_CHANGED, e.reason());
        assertTrue(e.getMessage().contains("truncated"), e.getMessage());
        assertTrue(e.getCause() instanceof ModelException, "the read error is kept as the cause");
    }

    @Test
    void loadWithCertificate_certificateOfAnotherModel_refused() throws Exception {
        Path model = model();
        Path other = dir.resolve("deterministic.json");
        Files.writeString(other, Fixtures.DETERMINISTIC);
        Path otherCert = certify(other, Requirement.DEFAULT);
        CertificateMismatchException e = assertThrows(CertificateMismatchException.class,
                () -> Model.loader().load(model, otherCert));
        assertEquals(Reason.OTHER_FILE, e.reason());
        assertTrue(e.getMessage().contains("another file, deterministic.json"), e.getMessage());
    }

    @Test
    void loadWithCertificate_editedField_refused() throws Exception {
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        String text = Files.readString(cert);
        assertTrue(text.contains("\"deterministic\":\"false\""), text);
        Files.writeString(cert, text.replace("\"deterministic\":\"false\"", "\"deterministic\":\"true\""));
        CertificateMismatchException e = assertThrows(CertificateMismatchException.class,
                () -> Model.loader().withRequirement(Requirement.also(Property.DETERMINISTIC)).load(model, cert));
        assertEquals(Reason.CERTIFICATE_EDITED, e.reason());
        assertTrue(e.getMessage().contains("edited"), e.getMessage());
    }

    @Test
    void loadWithCertificate_weakerThanRequired_refused() throws Exception {
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        CertificateMismatchException e = assertThrows(CertificateMismatchException.class,
                () -> Model.loader().withRequirement(Requirement.also(Property.DETERMINISTIC)).load(model, cert));
        assertEquals(Reason.WEAKER_REQUIREMENT, e.reason());
        assertTrue(e.getMessage().contains("deterministic is required"), e.getMessage());
    }

    @Test
    void loadWithCertificate_digestEqualsMessageDigestOfTheSameBytes() throws Exception {
        // The hook sees the same stored bytes the loader hashes; both digests agree with MessageDigest's.
        Path model = model();
        Path cert = certify(model, Requirement.DEFAULT);
        MessageDigest seen = MessageDigest.getInstance("SHA-256");
        Model.loader().withReadHook((stored, source) -> new java.security.DigestInputStream(stored, seen)).load(model, cert);
        assertEquals(sha256(model), new CertificateReader().read(cert).model().sha256());
        assertEquals(CertificateCheck.verify(model, cert, ReadLimits.DEFAULT, null).model().sha256(), sha256(model));
    }
}
