package dev.circa.format.certificate;

import dev.circa.format.io.DocumentHeader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.format.schema.SchemaViolation;
import java.io.ByteArrayInputStream;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * Reads a certificate strictly: JSON syntax and the {@link ReadLimits} while reading, then the whole
 * document against certificate.schema.json; any problem is one located {@link FormatException} (the
 * line and column of the top-level member at fault). Unknown members are refused whatever the minor
 * version, since the seal covers only the members this reader knows. The seal itself is not checked
 * here (see {@link CertificateWriter#seal}). Instances hold only their limits and are thread-safe.
 */
public final class CertificateReader {
    private final ReadLimits limits;

    public CertificateReader() {
        this(ReadLimits.DEFAULT);
    }

    public CertificateReader(ReadLimits limits) {
        this.limits = limits;
    }

    /** Reads {@code path} ({@code -} for standard input). */
    public Certificate read(Path path) throws FormatException {
        try (JsonInput in = JsonInput.openJson(path, limits)) {
            return read(in);
        }
    }

    /** Reads from {@code stream}; {@code file} names it in messages. */
    public Certificate read(InputStream stream, String file) throws FormatException {
        try (JsonInput in = JsonInput.fromStream(stream, file, limits)) {
            return read(in);
        }
    }

    /** Reads a certificate from text (tests, small inputs). */
    public Certificate readString(String json, String file) throws FormatException {
        return read(new ByteArrayInputStream(json.getBytes(StandardCharsets.UTF_8)), file);
    }

    private static Certificate read(JsonInput in) throws FormatException {
        in.startDocument("a certificate document");
        int[] root = {in.line(), in.column()};
        ObjectNode doc = JsonNodeFactory.instance.objectNode();
        Map<String, int[]> at = new HashMap<>();
        String member;
        while ((member = in.nextProperty()) != null) {
            at.put(member, new int[] {in.line(), in.column()});
            if (member.equals("version") && in.token() == tools.jackson.core.JsonToken.VALUE_STRING) {
                String v = in.readString("/version");
                DocumentHeader.checkVersion(in, v, "/version");
                doc.put(member, v);
            } else {
                doc.set(member, in.readTree());
            }
        }
        in.endDocument();
        List<SchemaViolation> violations = SchemaCatalog.get().validate(SchemaCatalog.Kind.CERTIFICATE, doc);
        if (!violations.isEmpty()) {
            SchemaViolation v = violations.get(0);
            String top = v.pointer().length() > 1 ? v.pointer().substring(1).split("/", 2)[0] : "";
            int[] loc = at.getOrDefault(top, root);
            throw new FormatException(in.file(), loc[0], loc[1], v.pointer(), "not a valid certificate: "
                    + v.message() + (violations.size() > 1 ? " (and " + (violations.size() - 1) + " more)" : ""));
        }
        return toCertificate(doc);
    }

    private static Certificate toCertificate(JsonNode d) {
        JsonNode m = d.get("model");
        JsonNode r = d.get("requirement");
        List<String> required = new ArrayList<>();
        for (int i = 0; i < r.get("properties").size(); i++) {
            required.add(r.get("properties").get(i).asString());
        }
        Map<String, String> properties = new LinkedHashMap<>();
        for (Map.Entry<String, JsonNode> e : d.get("properties").properties()) {
            properties.put(e.getKey(), e.getValue().asString());
        }
        Map<String, Boolean> exact = new LinkedHashMap<>();
        for (Map.Entry<String, JsonNode> e : d.get("exactQueries").properties()) {
            exact.put(e.getKey(), e.getValue().asBoolean());
        }
        JsonNode s = d.get("size");
        JsonNode c = d.get("checks");
        List<Certificate.ReferenceEvidence> refs = new ArrayList<>();
        for (int i = 0; i < d.get("references").size(); i++) {
            JsonNode x = d.get("references").get(i);
            refs.add(new Certificate.ReferenceEvidence(x.get("file").asString(), x.get("sha256").asString(),
                    x.get("rows").asLong(), x.get("maxAbsError").asDouble(), x.get("maxRelError").asDouble()));
        }
        return new Certificate(d.get("version").asString(),
                new Certificate.CertifiedFile(m.get("file").asString(), m.get("sha256").asString(), m.get("bytes").asLong()),
                d.get("circa").asString(), d.get("created").asString(),
                new Certificate.CertifiedRequirement(required, r.get("tolerance").asDouble(),
                        r.get("maxEnumeration").asInt(), r.get("embeddedChecks").asBoolean()),
                d.get("checkTolerance").get("atol").asDouble(), d.get("checkTolerance").get("rtol").asDouble(),
                properties, exact, new Certificate.CertifiedSize(s.get("variables").asInt(), s.get("nodes").asInt(),
                        s.get("edges").asLong(), s.get("depth").asInt()),
                new Certificate.CheckEvidence(c.get("cases").asLong(), c.get("maxAbsError").asDouble(),
                        c.get("maxRelError").asDouble()),
                refs, d.get("seal").asString());
    }
}
