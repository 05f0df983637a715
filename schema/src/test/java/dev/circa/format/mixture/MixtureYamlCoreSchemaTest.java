package dev.circa.format.mixture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.nio.charset.Charset;
import org.junit.jupiter.api.Test;

/**
 * Mixture documents in YAML follow the YAML 1.2 core schema (yaml.org, YAML 1.2.2, section 10.3.2:
 * integers [-+]?[0-9]+, 0o[0-7]+, 0x[0-9a-fA-F]+; floats [-+]?(\.[0-9]+|[0-9]+(\.[0-9]*)?)([eE][-+]?[0-9]+)?),
 * are read in UTF-8, UTF-16 or UTF-32 with a byte-order mark (section 5.2), and follow one rule: no
 * anchor, alias or tag anywhere. {@code version} is the string "1.0" in JSON and YAML alike.
 */
class MixtureYamlCoreSchemaTest {
    private static final String NUMBERS = """
            format: circa.mixture
            version: "1.0"
            variables:
              - {name: x, type: real}
              - {name: c, type: count}
            model:
              mixture:
                - weight: .5
                  product:
                    - {var: x, normal: {mean: -.5, sd: +1}}
                    - {var: c, poisson: {rate: 0x1F}}
                - weight: 0.5
                  product:
                    - {var: x, normal: {mean: 0o17, sd: 2.}}
                    - {var: c, poisson: {rate: 1e-3}}
            """;

    @Test
    void read_coreSchemaNumberSpellings_numbers() throws FormatException {
        MixtureDocument doc = MixtureReader.readString(NUMBERS, "n.yaml", ReadLimits.DEFAULT);
        assertNumbers(doc);
    }

    private static void assertNumbers(MixtureDocument doc) {
        MixtureExpr m = assertInstanceOf(MixtureExpr.class, doc.model());
        assertEquals(0.5, m.entries().get(0).weight());
        ProductExpr first = (ProductExpr) m.entries().get(0).expression();
        assertArrayEquals(new double[] {-0.5, 1}, ((InputExpr) first.factors().get(0)).params());
        assertArrayEquals(new double[] {31}, ((InputExpr) first.factors().get(1)).params());
        ProductExpr second = (ProductExpr) m.entries().get(1).expression();
        assertArrayEquals(new double[] {15, 2}, ((InputExpr) second.factors().get(0)).params());
    }

    @Test
    void read_utf16And32WithByteOrderMark_sameDocument() throws FormatException {
        for (String cs : new String[] {"UTF-16BE", "UTF-16LE", "UTF-32BE", "UTF-32LE", "UTF-8"}) {
            byte[] bytes = ("\uFEFF" + NUMBERS).getBytes(Charset.forName(cs));
            MixtureDocument doc = MixtureReader.read(new ByteArrayInputStream(bytes), "n.yaml", MixtureReader.Syntax.YAML,
                    ReadLimits.DEFAULT);
            assertNumbers(doc);
        }
    }

    @Test
    void read_anchorsAliasesAndTagsAnywhere_locatedError() {
        String[][] cases = {
            // replaced text, replacement, expected fragment, line, column
            {"mean: -.5", "mean: &m -.5", "the YAML anchor &m", "10", "38"},
            {"- {var: c, poisson: {rate: 0x1F}}", "- &f {var: c, poisson: {rate: 0x1F}}", "the YAML anchor &f", "11", "23"},
            {"sd: +1", "sd: !!float +1", "the YAML tag tag:yaml.org,2002:float", "10", "43"},
            {"sd: +1", "!!str sd: +1", "the YAML tag tag:yaml.org,2002:str", "10", "38"},
            {"mean: 0o17", "mean: !custom 0o17", "the YAML tag !custom", "14", "38"},
            {"weight: 0.5", "weight: *w", "not allowed", "12", "19"},
        };
        for (String[] c : cases) {
            String text = NUMBERS.replace(c[0], c[1]);
            FormatException e = assertThrows(FormatException.class,
                    () -> MixtureReader.readString(text, "t.yaml", ReadLimits.DEFAULT), c[1]);
            assertTrue(e.getMessage().contains(c[2]), e.getMessage());
            assertEquals(Integer.parseInt(c[3]), e.line(), e.getMessage());
        }
    }

    @Test
    void read_versionAsNumber_refusedInJsonAndYamlWithAdviceToQuote() {
        FormatException y = assertThrows(FormatException.class, () -> MixtureReader.readString(
                NUMBERS.replace("version: \"1.0\"", "version: 1.0"), "v.yaml", ReadLimits.DEFAULT));
        assertTrue(y.getMessage().startsWith("v.yaml:2:10: "), y.getMessage());
        assertTrue(y.getMessage().contains("expected the string \"1.0\" (quote it"), y.getMessage());
        String json = "{\"format\": \"circa.mixture\", \"version\": 1.0, \"variables\": [{\"name\": \"x\", \"type\": \"real\"}],"
                + " \"model\": {\"var\": \"x\", \"normal\": {\"mean\": 0, \"sd\": 1}}}";
        FormatException j = assertThrows(FormatException.class, () -> MixtureReader.readString(json, "v.json", ReadLimits.DEFAULT));
        assertTrue(j.getMessage().contains("expected the string \"1.0\" (quote it"), j.getMessage());
    }

    @Test
    void read_errorDeepInNestedMixtures_pathBoundedWithStartAndEnd() {
        // paths are kept per expression: bounded, they cost memory linear in the nesting, not its square
        StringBuilder json = new StringBuilder("{\"format\": \"circa.mixture\", \"version\": \"1.0\", "
                + "\"variables\": [{\"name\": \"x\", \"type\": \"real\"}], \"model\": {");
        int depth = 300;
        for (int i = 0; i < depth; i++) {
            json.append("\"mixture\": [{\"weight\": 1, ");
        }
        json.append("\"var\": \"nope\", \"normal\": {\"mean\": 0, \"sd\": 1}");
        json.append("}]".repeat(depth)).append("}}");
        FormatException e = assertThrows(FormatException.class,
                () -> MixtureReader.readString(json.toString(), "deep.json", ReadLimits.DEFAULT.withMaxDepth(2000)));
        assertTrue(e.getMessage().contains("unknown variable \"nope\""), e.getMessage());
        String path = e.pointer();
        assertTrue(path.length() <= MixtureReader.MAX_PATH + 16, path.length() + ": " + path);
        assertTrue(path.startsWith("model.mixture[0].mixture[0]") && path.contains("...") && path.endsWith("mixture[0].var"), path);
    }
}
