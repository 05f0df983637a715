package dev.circa.format.mixture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.Family;
import dev.circa.format.ReadFinding;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class MixtureReaderTest {
    /** The example of FORMAT.md section 4, verbatim (the contract). */
    static final String FORMAT_EXAMPLE = MixtureExamples.FORMAT_EXAMPLE;

    private static final Path FIXTURE = Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml");

    private static MixtureDocument read(String text) throws FormatException {
        return MixtureReader.readString(text, "doc.yaml", ReadLimits.DEFAULT);
    }

    @Test
    void read_formatExample_resolvesLabelsUsesAndPaths() throws Exception {
        // expected values: the numbers written in FORMAT.md section 4
        MixtureDocument doc = read(FORMAT_EXAMPLE);
        assertEquals("pump-station-regimes", doc.name());
        assertEquals(2, doc.variables().size());
        MixtureExpr m = assertInstanceOf(MixtureExpr.class, doc.model());
        assertEquals(0.85, m.entries().get(0).weight());
        ProductExpr first = assertInstanceOf(ProductExpr.class, m.entries().get(0).expression());
        assertEquals("normal-operation", first.label());
        InputExpr valve = assertInstanceOf(InputExpr.class, first.factors().get(1));
        assertEquals(Family.CATEGORICAL, valve.family());
        assertArrayEquals(new double[] {0.05, 0.15, 0.80}, valve.params());
        assertArrayEquals(new int[] {1}, valve.vars());
        assertEquals("model.mixture[0].product[1]", valve.path());
        assertEquals(15, valve.location().line());
        assertEquals(11, valve.location().column());
        ProductExpr second = assertInstanceOf(ProductExpr.class, m.entries().get(1).expression());
        UseExpr use = assertInstanceOf(UseExpr.class, second.factors().get(1));
        assertEquals("worn-valve", use.name());
        InputExpr worn = assertInstanceOf(InputExpr.class, doc.definitions().get("worn-valve").expression());
        assertArrayEquals(new double[] {0.6, 0.3, 0.1}, worn.params());
        assertTrue(doc.findings().isEmpty());
    }

    @Test
    void read_sameModelAsJson_sameResolvedParameters() throws Exception {
        String json = """
                {"format": "circa.mixture", "version": "1.0",
                 "variables": [{"name": "inlet_pressure", "type": "real"},
                               {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]}],
                 "model": {"product": [
                   {"var": "inlet_pressure", "normal": {"mean": 3.1, "sd": 0.2}},
                   {"var": "valve", "categorical": [0.05, 0.15, 0.80]}]}}
                """;
        MixtureDocument doc = MixtureReader.readString(json, "doc.json", ReadLimits.DEFAULT);
        ProductExpr p = assertInstanceOf(ProductExpr.class, doc.model());
        assertArrayEquals(new double[] {3.1, 0.2}, ((InputExpr) p.factors().get(0)).params());
        assertArrayEquals(new double[] {0.05, 0.15, 0.80}, ((InputExpr) p.factors().get(1)).params());
        assertEquals("/model/product/1", p.factors().get(1).location().pointer());
    }

    @Test
    void read_demoFixture_readsEveryExpressionKind() throws Exception {
        MixtureDocument doc = MixtureReader.read(FIXTURE, ReadLimits.DEFAULT);
        assertEquals(6, doc.variables().size());
        MixtureExpr m = (MixtureExpr) doc.model();
        ProductExpr normal = (ProductExpr) m.entries().get(0).expression();
        GaussianMixtureExpr gm = assertInstanceOf(GaussianMixtureExpr.class, normal.factors().get(0));
        assertEquals(2, gm.components());
        assertArrayEquals(new double[] {0.04, 0.01, 0.01, 0.09}, gm.covariances()[0]);
        ProductExpr cavitation = (ProductExpr) m.entries().get(1).expression();
        InputExpr mv = (InputExpr) cavitation.factors().get(0);
        assertEquals(Family.MVNORMAL, mv.family());
        assertEquals(3 + 9, mv.params().length);
        ProductExpr blocked = (ProductExpr) m.entries().get(2).expression();
        assertArrayEquals(new double[] {5, 0.4}, ((InputExpr) blocked.factors().get(5)).params());
        assertArrayEquals(new double[] {0.2, 0.8}, ((InputExpr) blocked.factors().get(4)).params());
    }

    @Test
    void read_gzipYamlByName_decompressed(@TempDir Path dir) throws Exception {
        Path gz = dir.resolve("model.yaml.gz");
        try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(gz))) {
            out.write(FORMAT_EXAMPLE.getBytes(StandardCharsets.UTF_8));
        }
        assertEquals("pump-station-regimes", MixtureReader.read(gz, ReadLimits.DEFAULT).name());
    }

    @Test
    void read_jsonNameWithYamlContent_readAsJsonAndRejected(@TempDir Path dir) throws Exception {
        Path p = dir.resolve("model.json");
        Files.writeString(p, FORMAT_EXAMPLE);
        FormatException e = assertThrows(FormatException.class, () -> MixtureReader.read(p, ReadLimits.DEFAULT));
        assertTrue(e.problem().contains("JSON"), e.getMessage());
    }

    @Test
    void read_newerMinorVersion_unknownPropertyIsAFinding() throws Exception {
        MixtureDocument doc = read(FORMAT_EXAMPLE.replace("version: \"1.0\"", "version: \"1.3\"\ncolour: blue"));
        assertEquals(1, doc.findings().size());
        assertEquals(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR, doc.findings().get(0).kind());
    }

    @Test
    void read_yamlLabelsThatLookLikeOtherTypes_keptAsStrings() throws Exception {
        // YAML 1.2 core schema (yaml.org spec 1.2.2, section 10.3, from memory): No, Yes and 1st are strings
        MixtureDocument doc = read("""
                format: circa.mixture
                version: "1.0"
                variables:
                  - {name: survived, type: categorical, states: [No, Yes]}
                  - {name: class, type: categorical, states: [1st, 2nd, 3rd]}
                model:
                  product:
                    - {var: survived, categorical: {No: 0.7, Yes: 0.3}}
                    - {var: class, indicator: {value: 1}}
                """);
        assertEquals(List.of("No", "Yes"), doc.variables().get(0).states());
        assertEquals(List.of("1st", "2nd", "3rd"), doc.variables().get(1).states());
        ProductExpr p = (ProductExpr) doc.model();
        assertArrayEquals(new double[] {0.7, 0.3}, ((InputExpr) p.factors().get(0)).params());
    }

    /** One malformed document: its expected location, model path and a fragment of the message. */
    private record Bad(String name, String text, int line, int column, String path, String fragment) {
    }

    private static final String HEAD = """
            format: circa.mixture
            version: "1.0"
            variables:
              - {name: x, type: real}
              - {name: v, type: categorical, states: [a, b]}
            """;

    @Test
    void read_malformedDocuments_locatedMessages() {
        List<Bad> table = List.of(
                new Bad("alias", HEAD + "definitions:\n  d: &shared {var: x, normal: {mean: 0, sd: 1}}\n"
                        + "model: *shared\n", 7, 6, null, "anchor &shared"),
                new Bad("alias only", HEAD + "model: {product: [{var: x, normal: {mean: 0, sd: *s}}]}\n",
                        6, 50, null, "alias *s"),
                new Bad("inf", HEAD + "model: {var: x, normal: {mean: .inf, sd: 1}}\n", 6, 32, null, ".inf"),
                new Bad("nan", HEAD + "model: {var: x, normal: {mean: 0, sd: .NaN}}\n", 6, 39, null, ".NaN"),
                new Bad("tag", HEAD + "model: {var: x, normal: {mean: !!float 1, sd: 1}}\n", 6, 32, null, "tag"),
                new Bad("unknown variable", HEAD + "model:\n  product:\n    - {var: y, normal: {mean: 0, sd: 1}}\n",
                        8, 13, "model.product[0].var", "unknown variable \"y\""),
                new Bad("unknown state", HEAD + "model:\n  product:\n    - {var: x, normal: {mean: 0, sd: 1}}\n"
                        + "    - {var: v, categorical: {a: 0.5, c: 0.5}}\n",
                        9, 41, "model.product[1].categorical.c", "unknown state \"c\" of v"),
                new Bad("unknown definition", HEAD + "model:\n  product:\n    - {use: nowhere}\n",
                        8, 13, "model.product[0].use", "unknown definition \"nowhere\""),
                new Bad("family on wrong type", HEAD + "model: {var: v, normal: {mean: 0, sd: 1}}\n",
                        6, 14, "model.var", "normal needs a variable of type real"),
                new Bad("missing weight", HEAD + "model:\n  mixture:\n    - {var: x, normal: {mean: 0, sd: 1}}\n",
                        8, 7, "model.mixture[0]", "needs a \"weight\""),
                new Bad("two kinds", HEAD + "model: {var: x, normal: {mean: 0, sd: 1}, product: []}\n",
                        6, 52, "model.product", "both \"normal\" and \"product\""),
                new Bad("no kind", HEAD + "model: {}\n", 6, 8, "model", "needs one of mixture"),
                new Bad("label outside an entry", HEAD + "model: {label: x, var: x, normal: {mean: 0, sd: 1}}\n",
                        6, 16, "model.label", "\"label\" belongs in a mixture entry"),
                new Bad("unknown property", HEAD + "model: {var: x, normal: {mean: 0, sd: 1}, colour: red}\n",
                        6, 51, "model.colour", "unknown property \"colour\""),
                new Bad("missing parameter", HEAD + "model: {var: x, normal: {mean: 0}}\n",
                        6, 25, "model.normal", "normal needs \"sd\""),
                new Bad("duplicate key", HEAD + "model: {var: x, var: x, normal: {mean: 0, sd: 1}}\n",
                        6, 20, null, "duplicate key"),
                new Bad("yaml syntax", HEAD + "model: {var: x, normal: {mean: 0, sd: 1}\n", 7, 1, null,
                        "not valid YAML"),
                new Bad("wrong format", "format: circa.circuit\n", 1, 9, "format", "unknown format"),
                new Bad("short weights, means and variances agree", HEAD + "model:\n  gaussian-mixture:\n    vars: [x]\n"
                        + "    weights: [0.5, 0.5]\n    means: [[0], [1], [2]]\n    variances: [[1], [1], [1]]\n",
                        9, 14, "model.gaussian-mixture.weights", "expected 3 component weights (one per mean and variance"),
                new Bad("short means", HEAD + "model:\n  gaussian-mixture:\n    vars: [x]\n"
                        + "    weights: [0.2, 0.3, 0.5]\n    means: [[0], [1]]\n    variances: [[1], [1], [1]]\n",
                        10, 12, "model.gaussian-mixture.means", "expected a list of 3 means of 1 number each, found a list of 2"));
        for (Bad b : table) {
            FormatException e = assertThrows(FormatException.class, () -> read(b.text()), b.name());
            assertEquals(b.line(), e.line(), b.name() + ": " + e.getMessage());
            assertEquals(b.column(), e.column(), b.name() + ": " + e.getMessage());
            assertEquals(b.path(), e.pointer(), b.name() + ": " + e.getMessage());
            assertTrue(e.getMessage().contains(b.fragment()), b.name() + ": " + e.getMessage());
            assertTrue(e.getMessage().startsWith("doc.yaml:" + b.line() + ":" + b.column() + ": "), e.getMessage());
        }
    }

    @Test
    void read_billionLaughs_rejectedAtFirstAnchor() {
        StringBuilder y = new StringBuilder(HEAD + "extensions:\n  a: &a [x, x, x, x, x, x, x, x, x]\n");
        for (int i = 1; i < 9; i++) {
            char c = (char) ('a' + i);
            char p = (char) ('a' + i - 1);
            y.append("  ").append(c).append(": &").append(c).append(" [*").append(p).append(", *").append(p)
                    .append(", *").append(p).append(", *").append(p).append("]\n");
        }
        y.append("model: {var: x, normal: {mean: 0, sd: 1}}\n");
        FormatException e = assertThrows(FormatException.class, () -> read(y.toString()));
        assertEquals(7, e.line(), e.getMessage());
        assertTrue(e.getMessage().contains("anchor"), e.getMessage());
    }

    @Test
    void read_nestingBeyondMaxDepth_namesTheLimit() {
        StringBuilder deep = new StringBuilder(HEAD + "model: ");
        for (int i = 0; i < 10; i++) {
            deep.append("{product: [");
        }
        deep.append("{var: x, normal: {mean: 0, sd: 1}}");
        for (int i = 0; i < 10; i++) {
            deep.append("]}");
        }
        LimitExceededException e = assertThrows(LimitExceededException.class,
                () -> MixtureReader.readString(deep.toString() + "\n", "doc.yaml", ReadLimits.DEFAULT.withMaxDepth(8)));
        assertEquals(ReadLimits.MAX_DEPTH, e.option());
        assertEquals(6, e.line(), e.getMessage());
    }

    @Test
    void read_nameWithoutSyntax_decidedByContent(@TempDir Path dir) throws Exception {
        Path yaml = dir.resolve("model.txt");
        Files.writeString(yaml, FORMAT_EXAMPLE);
        assertEquals("pump-station-regimes", MixtureReader.read(yaml, ReadLimits.DEFAULT).name());
        Path json = dir.resolve("model.mix");
        Files.writeString(json, "  {\"format\": \"circa.mixture\", \"version\": \"1.0\", \"variables\": "
                + "[{\"name\": \"x\", \"type\": \"real\"}], \"model\": {\"var\": \"x\", "
                + "\"normal\": {\"mean\": 0, \"sd\": 1}} ,}");
        FormatException e = assertThrows(FormatException.class, () -> MixtureReader.read(json, ReadLimits.DEFAULT));
        assertTrue(e.problem().startsWith("not valid JSON"), e.getMessage());
        assertEquals(MixtureReader.Syntax.YAML, MixtureReader.syntaxOf(Path.of("a.yml.gz")));
        assertEquals(MixtureReader.Syntax.JSON, MixtureReader.syntaxOf(Path.of("a.JSON")));
        assertEquals(null, MixtureReader.syntaxOf(Path.of("a.txt")));
    }

    @Test
    void read_labelLongerThanMaxString_namesTheLimit() {
        String text = FORMAT_EXAMPLE.replace("label: cavitation", "label: " + "c".repeat(100));
        LimitExceededException e = assertThrows(LimitExceededException.class,
                () -> MixtureReader.readString(text, "doc.yaml", ReadLimits.DEFAULT.withMaxString(50)));
        assertEquals(ReadLimits.MAX_STRING, e.option());
        assertTrue(e.line() > 0, e.getMessage());
    }

    @Test
    void read_acceptedDocuments_conformToTheMixtureSchema() throws Exception {
        // the bundled JSON Schema of the mixture document (schema/src/main/resources, FORMAT.md section 4)
        tools.jackson.databind.ObjectMapper yaml = tools.jackson.dataformat.yaml.YAMLMapper.builder().build();
        for (String text : List.of(FORMAT_EXAMPLE, Files.readString(FIXTURE))) {
            read(text);
            tools.jackson.databind.JsonNode tree = yaml.readTree(text);
            assertEquals(List.of(), dev.circa.format.schema.SchemaCatalog.get()
                    .validate(dev.circa.format.schema.SchemaCatalog.Kind.MIXTURE, tree));
        }
    }
}
