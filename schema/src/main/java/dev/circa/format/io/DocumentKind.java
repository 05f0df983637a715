package dev.circa.format.io;

import java.nio.file.Path;
import tools.jackson.core.JsonToken;

/**
 * The kinds of circa document, told apart by their {@code format} member (FORMAT.md): a circuit, a
 * region graph or a mixture. YAML files ({@code .yaml}, {@code .yml}) can only be mixtures.
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
        if (name.endsWith(".yaml") || name.endsWith(".yml")) {
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
