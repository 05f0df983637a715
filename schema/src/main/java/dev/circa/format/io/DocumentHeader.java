package dev.circa.format.io;

import dev.circa.format.Provenance;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import java.util.List;
import tools.jackson.core.JsonGenerator;
import tools.jackson.core.JsonToken;

/**
 * The members every document kind shares: {@code version} and {@code provenance}, read and written
 * the same way by the circuit, region graph and mixture readers and writers.
 */
public final class DocumentHeader {
    private DocumentHeader() {
    }

    /**
     * Checks a {@code version} value: MAJOR.MINOR with major 1 (FORMAT.md: another major is rejected).
     *
     * @param in positioned on the value, for the location of the error
     */
    public static void checkVersion(JsonInput in, String version, String pointer) throws FormatException {
        if (!version.matches("[0-9]+\\.[0-9]+")) {
            throw in.error(pointer, "version \"" + version + "\" is not MAJOR.MINOR; expected \"1.0\"");
        }
        if (!version.startsWith("1.")) {
            throw in.error(pointer, "unsupported major version \"" + version + "\"; this reader reads version 1.x");
        }
    }

    /** The minor number of a checked version, e.g. 0 for "1.0". */
    public static int minor(String version) {
        try {
            return Integer.parseInt(version.substring(version.indexOf('.') + 1));
        } catch (NumberFormatException | IndexOutOfBoundsException e) {
            return Integer.MAX_VALUE;
        }
    }

    /**
     * Reads a {@code provenance} object at the current token; unknown members become findings.
     *
     * @param pointer the object's JSON pointer
     */
    public static Provenance readProvenance(JsonInput in, String pointer, List<ReadFinding> findings)
            throws FormatException {
        in.expect(JsonToken.START_OBJECT, pointer, "an object {producer, created, source}");
        String producer = null;
        String created = null;
        String source = null;
        String m;
        while ((m = in.nextProperty()) != null) {
            String p = pointer + "/" + m;
            switch (m) {
                case "producer" -> producer = in.readString(p);
                case "created" -> created = in.readString(p);
                case "source" -> source = in.readString(p);
                default -> {
                    findings.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY,
                            "unknown property \"" + m + "\" in provenance; expected producer, created or source",
                            new SourceLocation(p, in.line(), in.column())));
                    in.skipValue();
                }
            }
        }
        return new Provenance(producer, created, source);
    }

    /** Writes a {@code provenance} member on a line of its own. */
    public static void writeProvenance(JsonGenerator g, Provenance p) {
        g.writeRaw("\n");
        g.writeName("provenance");
        g.writeStartObject();
        if (p.producer() != null) {
            g.writeName("producer");
            g.writeString(p.producer());
        }
        if (p.created() != null) {
            g.writeName("created");
            g.writeString(p.created());
        }
        if (p.source() != null) {
            g.writeName("source");
            g.writeString(p.source());
        }
        g.writeEndObject();
    }
}
