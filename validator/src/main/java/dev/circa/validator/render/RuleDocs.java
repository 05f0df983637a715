package dev.circa.validator.render;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;

/** The rule documentation ({@code dev/circa/validator/rules/rules.md}, one {@code ## Id} section per rule). */
public final class RuleDocs {
    /** The resource holding the pages. */
    public static final String RESOURCE = "/dev/circa/validator/rules/rules.md";

    private static final Map<String, String> SECTIONS = load();

    private RuleDocs() {
    }

    /** The text of rule {@code id}'s section, or {@code null} when it has none. */
    public static String section(String id) {
        return SECTIONS.get(id);
    }

    private static Map<String, String> load() {
        Map<String, String> m = new LinkedHashMap<>();
        try (InputStream in = RuleDocs.class.getResourceAsStream(RESOURCE)) {
            if (in == null) {
                return m;
            }
            String text = new String(in.readAllBytes(), StandardCharsets.UTF_8);
            String id = null;
            StringBuilder body = new StringBuilder();
            for (String line : text.split("\n", -1)) {
                if (line.startsWith("## ")) {
                    if (id != null) {
                        m.put(id, body.toString().strip());
                    }
                    id = line.substring(3).strip();
                    body.setLength(0);
                } else if (id != null) {
                    body.append(line).append('\n');
                }
            }
            if (id != null) {
                m.put(id, body.toString().strip());
            }
        } catch (IOException e) {
            throw new IllegalStateException("cannot read " + RESOURCE, e);
        }
        return m;
    }
}
