package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.URLDecoder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The documentation a clone carries is whole (issue 15): every relative link in README.md,
 * DEVELOPERS.md and docs/ resolves to a file of the repository (and a #fragment to a heading of it,
 * slugged as common Markdown renderers do: lower case, punctuation dropped, spaces to hyphens), and
 * nothing points outside the repository.
 */
class DocumentationLinksTest {
    private static final Path ROOT = Path.of("..").toAbsolutePath().normalize();
    private static final Pattern LINK = Pattern.compile("\\[[^\\]]*\\]\\(([^)\\s]+)\\)");
    private static final Pattern HEADING = Pattern.compile("^#{1,6}\\s+(.*)$", Pattern.MULTILINE);

    private static List<Path> pages() throws IOException {
        List<Path> pages = new ArrayList<>(List.of(ROOT.resolve("README.md"), ROOT.resolve("DEVELOPERS.md")));
        try (Stream<Path> s = Files.walk(ROOT.resolve("docs"))) {
            s.filter(p -> p.toString().endsWith(".md")).sorted().forEach(pages::add);
        }
        return pages;
    }

    @Test
    void everyRelativeLink_resolvesInsideTheRepository() throws IOException {
        List<String> broken = new ArrayList<>();
        int links = 0;
        for (Path page : pages()) {
            String text = Files.readString(page);
            Matcher m = LINK.matcher(text);
            while (m.find()) {
                String target = m.group(1);
                if (target.matches("^[a-z]+:.*")) {
                    continue; // absolute URLs (https:, mailto:) are not files of the clone
                }
                links++;
                String file = target.contains("#") ? target.substring(0, target.indexOf('#')) : target;
                String fragment = target.contains("#") ? target.substring(target.indexOf('#') + 1) : null;
                Path resolved = file.isEmpty() ? page : page.getParent().resolve(URLDecoder.decode(file, StandardCharsets.UTF_8)).normalize();
                String where = ROOT.relativize(page) + ": " + target;
                if (!resolved.startsWith(ROOT)) {
                    broken.add(where + " (outside the repository)");
                } else if (!Files.exists(resolved)) {
                    broken.add(where + " (no such file)");
                } else if (fragment != null && resolved.toString().endsWith(".md") && !anchors(resolved).contains(fragment)) {
                    broken.add(where + " (no such heading)");
                }
            }
        }
        assertEquals(List.of(), broken);
        assertTrue(links >= 20, "expected the documentation to link its pages, found " + links + " links");
    }

    @Test
    void noPageSendsTheReaderOutsideTheClone() throws IOException {
        for (Path page : pages()) {
            String text = Files.readString(page);
            assertTrue(!text.contains("../shared/design") && !text.contains("FORMAT.md") && !text.contains("CLI.md"),
                    ROOT.relativize(page) + " refers to design files a clone does not have");
        }
    }

    @Test
    void docsIndex_namesEverySchemaAndItsId() throws IOException {
        String index = Files.readString(ROOT.resolve("docs/README.md"));
        try (Stream<Path> s = Files.list(ROOT.resolve("schema/src/main/resources/dev/circa/format/schemas"))) {
            for (Path schema : s.sorted().toList()) {
                String text = Files.readString(schema);
                Matcher id = Pattern.compile("\"\\$id\"\\s*:\\s*\"([^\"]+)\"").matcher(text);
                assertTrue(id.find(), schema.toString());
                assertTrue(index.contains("`" + id.group(1) + "`"), "docs/README.md does not give the $id " + id.group(1));
                assertTrue(index.contains(schema.getFileName().toString()), "docs/README.md does not name " + schema.getFileName());
            }
        }
    }

    /** The anchors of a Markdown file's headings. */
    private static Set<String> anchors(Path md) throws IOException {
        Set<String> out = new HashSet<>();
        Matcher h = HEADING.matcher(Files.readString(md));
        while (h.find()) {
            String slug = h.group(1).trim().toLowerCase(Locale.ROOT).replaceAll("[^\\p{L}\\p{N} _-]", "").replace(' ', '-');
            out.add(slug);
        }
        return out;
    }
}
