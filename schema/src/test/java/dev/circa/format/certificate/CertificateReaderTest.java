package dev.circa.format.certificate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.schema.SchemaCatalog;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.json.JsonMapper;

/** The certificate reader and writer: round trip, the seal, strictness and located errors. */
class CertificateReaderTest {
    private static final Path CORPUS = Path.of("..", "fixtures", "schema-corpus", "certificate");
    private static final Path SEALED = CORPUS.resolve("valid").resolve("pump-station.cert.json");

    private static Certificate sample() {
        return new Certificate("1.0", new Certificate.CertifiedFile("pump.json", "0".repeat(64), 1117), "0.1.0",
                "2026-12-02T18:00:00Z", new Certificate.CertifiedRequirement(List.of("smooth", "decomposable"), 1e-9, 65536, true),
                1e-9, 2.5e-7, Map.of("smooth", "true", "normalized", "unknown"),
                Map.of("density", true, "marginal", true, "conditional", true, "mpe", false, "sampling", true),
                new Certificate.CertifiedSize(2, 7, 6, 2), new Certificate.CheckEvidence(2, 4.163336342344337E-16, 0.1 + 0.2),
                List.of(new Certificate.ReferenceEvidence("ref.csv", "a".repeat(64), 30, 0, 1e-300)), null);
    }

    private static String written(Certificate c) throws Exception {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        new CertificateWriter().write(c, out);
        return out.toString(StandardCharsets.UTF_8);
    }

    @Test
    void roundTrip_everyValueBitExact_andSealed() throws Exception {
        Certificate c = sample();
        String text = written(c);
        Certificate back = new CertificateReader().readString(text, "c.json");
        assertEquals(c.withSeal(back.seal()), back);
        assertEquals(CertificateWriter.seal(c), back.seal());
        assertEquals(0.1 + 0.2, back.checks().maxRelError());
        // the written document conforms to the bundled schema
        assertEquals(List.of(), SchemaCatalog.get().validate(SchemaCatalog.Kind.CERTIFICATE, JsonMapper.builder().build().readTree(text)));
    }

    @Test
    void seal_isSha256OfCanonicalForm_perMessageDigest() throws Exception {
        // Source: java.security.MessageDigest over the canonical text as docs/certificate.md defines it,
        // built here by removing the line breaks and the seal member from the written file.
        String text = written(sample());
        String canonical = text.replace("\n", "").replace("  {", "{").replaceAll(",\"seal\":\"[0-9a-f]{64}\"", "");
        String expected = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                .digest(canonical.getBytes(StandardCharsets.UTF_8)));
        assertEquals(expected, new CertificateReader().readString(text, "c.json").seal());
    }

    @Test
    void corpusCertificate_sealStillMatches() throws Exception {
        Certificate c = new CertificateReader().read(SEALED);
        assertEquals(CertificateWriter.seal(c), c.seal());
        assertEquals("pump-station.json", c.model().file());
    }

    @Test
    void editedValue_changesSeal_whitespaceDoesNot() throws Exception {
        String text = Files.readString(SEALED);
        Certificate edited = new CertificateReader().readString(text.replace("\"rows\":1", "\"rows\":2"), "c.json");
        assertNotEquals(CertificateWriter.seal(edited), edited.seal());
        Certificate spaced = new CertificateReader().readString(text.replace(",", " ,\n "), "c.json");
        assertEquals(CertificateWriter.seal(spaced), spaced.seal());
    }

    @Test
    void unknownMember_refusedAtItsLine() throws Exception {
        String text = Files.readString(SEALED).replace(",\"seal\"", ",\"signedBy\":\"me\"\n,\"seal\"");
        FormatException e = assertThrows(FormatException.class, () -> new CertificateReader().readString(text, "c.json"));
        assertEquals(16, e.line(), e.getMessage());
        assertTrue(e.getMessage().contains("signedBy"), e.getMessage());
    }

    @Test
    void majorVersion2_refused() throws Exception {
        String text = Files.readString(SEALED).replace("\"version\":\"1.0\"", "\"version\":\"2.0\"");
        FormatException e = assertThrows(FormatException.class, () -> new CertificateReader().readString(text, "c.json"));
        assertTrue(e.getMessage().contains("major version"), e.getMessage());
    }

    @Test
    void nonFiniteError_notWritten() {
        Certificate c = sample();
        Certificate bad = new Certificate(c.version(), c.model(), c.circa(), c.created(), c.requirement(), c.atol(), c.rtol(),
                c.properties(), c.exactQueries(), c.size(), new Certificate.CheckEvidence(1, Double.NaN, 0), c.references(), null);
        assertThrows(IllegalArgumentException.class, () -> written(bad));
    }
}
