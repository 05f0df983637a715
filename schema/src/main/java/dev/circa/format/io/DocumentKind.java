package dev.circa.format.io;

import java.nio.file.Path;
import tools.jackson.core.JsonToken;

/**
 * The kinds of circa document, told apart by their {@code format} member (FORMAT.md): a circuit, a
 * region graph or a mixture. YAML can only be a mixture: a file named {@code .yaml} or {@code .yml},
 * or any input (standard input, a pipe, a file of another name) whose content does not start as a
 * JSON object does.
 */
public enum DocumentKind {
    CIRCUIT("circa.circuit"),
    REGIONS("circa.regions"),
    MIXTURE("circa.mixture");

    private final String format;

    DocumentKind(String format) {
        this.format = format;
    }

    /** The value of {@code format} for this kind. */
    public String format() {
        return format;
    }

    /** Whether the first character of the content, after a byte-order mark and white space, is <code>{</code>. */
    private static boolean startsAsJson(Path path, ReadLimits limits) throws FormatException {
        try (java.io.InputStream in = InputFiles.open(path, limits.maxBytes())) {
            for (int i = 0; i < 4096; i++) {
                int b = in.read();
                // white space, NUL (the other half of a UTF-16 or UTF-32 character) and byte-order marks
                if (b == ' ' || b == '\t' || b == '\r' || b == '\n' || b == 0 || b == 0xEF || b == 0xBB || b == 0xBF
                        || b == 0xFE || b == 0xFF) {
                    continue;
                }
                return b == '{' || b == '[' || b < 0;
            }
            return true;
        } catch (FormatException e) {
            throw e;
        } catch (java.io.IOException e) {
            throw new FormatException(InputFiles.displayName(path), 0, 0, null, "cannot be read: " + IoMessages.of(e));
        }
    }

    /**
     * The kind of {@code path}, found by reading its top-level members up to {@code format}.
     *
     * @throws FormatException when the file is not JSON, has no {@code format} or an unknown one
     */
    public static DocumentKind detect(Path path, ReadLimits limits) throws FormatException {
        String name = path.getFileName() == null ? "" : path.getFileName().toString();
        if (name.endsWith(".gz")) {
            name = name.substring(0, name.length() - 3);
        }
        if (name.endsWith(".yaml") || name.endsWith(".yml") || !startsAsJson(path, limits)) {
            return MIXTURE;
        }
        try (JsonInput in = JsonInput.openJson(path, limits)) {
            in.startDocument("a circa document (circuit, region graph or mixture)");
            String member;
            while ((member = in.nextProperty()) != null) {
                if (member.equals("format")) {
                    if (in.token() != JsonToken.VALUE_STRING) {
                        throw in.error("/format", "expected \"format\" to be a string such as \"circa.circuit\"");
                    }
                    String f = in.readString("/format");
                    for (DocumentKind k : values()) {
                        if (k.format.equals(f)) {
                            return k;
                        }
                    }
                    throw in.error("/format", "unknown format \"" + f
                            + "\"; expected circa.circuit, circa.regions or circa.mixture");
                }
                in.skipValue();
            }
            throw new FormatException(in.file(), 1, 1, "/format",
                    "missing \"format\"; expected circa.circuit, circa.regions or circa.mixture");
        }
    }
}
