package dev.circa.format.certificate;

import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.NonClosingOutputStream;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonGenerator;
import tools.jackson.databind.ObjectMapper;

/**
 * Writes certificates in the member order of docs/certificate.md, one top-level member per line, and
 * computes their seal: the SHA-256 of the canonical form, which is the same document without
 * {@code seal} and without any whitespace, numbers as Java's {@link Double#toString(double)} writes
 * them. Stateless and thread-safe.
 */
public final class CertificateWriter {
    private static final ObjectMapper MAPPER = JsonInput.mapperFor(ReadLimits.DEFAULT);

    /** Writes {@code c} (sealed) to {@code target} whole or not at all; {@code inputs} must not be overwritten. */
    public void write(Certificate c, Path target, Path... inputs) throws IOException {
        AtomicOutput.write(target, out -> write(c, out), inputs);
    }

    /** Writes {@code c} to {@code out} (not closed), sealed with {@link #seal(Certificate)}. */
    public void write(Certificate c, OutputStream out) throws IOException {
        emit(c.withSeal(seal(c)), out, true);
    }

    /** The canonical form of {@code c}: every member but the seal, no whitespace, UTF-8. */
    public static byte[] canonical(Certificate c) {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream(1024);
        try {
            emit(c.withSeal(null), bytes, false);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return bytes.toByteArray();
    }

    /** The seal of {@code c}: SHA-256 of its {@linkplain #canonical canonical form}, lower-case hex. */
    public static String seal(Certificate c) {
        return sha256Hex(canonical(c));
    }

    /** SHA-256 of {@code bytes}, lower-case hex. */
    public static String sha256Hex(byte[] bytes) {
        return HexFormat.of().formatHex(newSha256().digest(bytes));
    }

    /** A new SHA-256 digest (present in every Java runtime). */
    public static MessageDigest newSha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("this Java runtime has no SHA-256", e);
        }
    }

    private static void emit(Certificate c, OutputStream out, boolean pretty) throws IOException {
        try (JsonGenerator g = MAPPER.createGenerator(new NonClosingOutputStream(out))) {
            String nl = pretty ? "\n" : "";
            g.writeStartObject();
            member(g, nl, "format");
            g.writeString(Certificate.FORMAT);
            member(g, nl, "version");
            g.writeString(c.version());
            member(g, nl, "model");
            g.writeStartObject();
            g.writeName("file");
            g.writeString(c.model().file());
            g.writeName("sha256");
            g.writeString(c.model().sha256());
            g.writeName("bytes");
            g.writeNumber(c.model().bytes());
            g.writeEndObject();
            member(g, nl, "circa");
            g.writeString(c.circa());
            member(g, nl, "created");
            g.writeString(c.created());
            member(g, nl, "requirement");
            g.writeStartObject();
            g.writeName("properties");
            g.writeStartArray();
            for (String p : c.requirement().properties()) {
                g.writeString(p);
            }
            g.writeEndArray();
            number(g, "tolerance", c.requirement().tolerance());
            g.writeName("maxEnumeration");
            g.writeNumber(c.requirement().maxEnumeration());
            g.writeName("embeddedChecks");
            g.writeBoolean(c.requirement().embeddedChecks());
            g.writeEndObject();
            member(g, nl, "checkTolerance");
            g.writeStartObject();
            number(g, "atol", c.atol());
            number(g, "rtol", c.rtol());
            g.writeEndObject();
            member(g, nl, "properties");
            g.writeStartObject();
            for (Map.Entry<String, String> e : c.properties().entrySet()) {
                g.writeName(e.getKey());
                g.writeString(e.getValue());
            }
            g.writeEndObject();
            member(g, nl, "exactQueries");
            g.writeStartObject();
            for (Map.Entry<String, Boolean> e : c.exactQueries().entrySet()) {
                g.writeName(e.getKey());
                g.writeBoolean(e.getValue());
            }
            g.writeEndObject();
            member(g, nl, "size");
            g.writeStartObject();
            g.writeName("variables");
            g.writeNumber(c.size().variables());
            g.writeName("nodes");
            g.writeNumber(c.size().nodes());
            g.writeName("edges");
            g.writeNumber(c.size().edges());
            g.writeName("depth");
            g.writeNumber(c.size().depth());
            g.writeEndObject();
            member(g, nl, "checks");
            g.writeStartObject();
            g.writeName("cases");
            g.writeNumber(c.checks().cases());
            number(g, "maxAbsError", c.checks().maxAbsError());
            number(g, "maxRelError", c.checks().maxRelError());
            g.writeEndObject();
            member(g, nl, "references");
            g.writeStartArray();
            for (Certificate.ReferenceEvidence r : c.references()) {
                g.writeRaw(pretty ? "\n  " : "");
                g.writeStartObject();
                g.writeName("file");
                g.writeString(r.file());
                g.writeName("sha256");
                g.writeString(r.sha256());
                g.writeName("rows");
                g.writeNumber(r.rows());
                number(g, "maxAbsError", r.maxAbsError());
                number(g, "maxRelError", r.maxRelError());
                g.writeEndObject();
            }
            g.writeRaw(pretty && !c.references().isEmpty() ? "\n" : "");
            g.writeEndArray();
            if (c.seal() != null) {
                member(g, nl, "seal");
                g.writeString(c.seal());
            }
            g.writeRaw(nl);
            g.writeEndObject();
            g.writeRaw(nl);
        } catch (JacksonException e) {
            if (e.getCause() instanceof IOException io) {
                throw io;
            }
            throw new IOException(e.getMessage(), e);
        }
    }

    private static void member(JsonGenerator g, String nl, String name) {
        g.writeRaw(nl);
        g.writeName(name);
    }

    private static void number(JsonGenerator g, String name, double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(name + " is not finite (" + v + "); a certificate holds finite numbers only");
        }
        g.writeName(name);
        g.writeNumber(Double.toString(v));
    }
}
