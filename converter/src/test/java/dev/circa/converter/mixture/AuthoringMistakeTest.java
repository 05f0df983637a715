package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.SumNode;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Authoring mistakes in mixture documents: each ends the conversion with one located message (file,
 * line, column, model path). The expected positions are those of the offending text in each inline
 * document (common practice: the message points at what the author must change).
 */
class AuthoringMistakeTest {
    private static final String HEAD = """
            format: circa.mixture
            version: "1.0"
            variables:
              - {name: pressure, type: real}
              - {name: valve, type: categorical, states: [closed, open]}
            """;
    /** After {@link #HEAD}: a mixture whose weights add to 0.9. */
    private static final String WEIGHTS_OFF = """
            model:
              product:
                - mixture:
                    - {weight: 0.6, var: pressure, normal: {mean: 3, sd: 1}}
                    - {weight: 0.3, var: pressure, normal: {mean: 2, sd: 1}}
                - {var: valve, categorical: [0.5, 0.5]}
            """;

    /** One mistake: the document, where the message must point, and a fragment it must contain. */
    private record Mistake(String name, String text, int line, int column, String path, String fragment) {
    }

    private static CircuitDocument convert(String text, boolean normalize) throws FormatException {
        return MixtureConverter.toCircuit(MixtureReader.readString(text, "model.yaml", ReadLimits.DEFAULT),
                MixtureOptions.DEFAULT.withNormalizeWeights(normalize));
    }

    @Test
    void convert_authoringMistakes_locatedMessagesWithModelPath() {
        List<Mistake> table = List.of(
                new Mistake("unknown variable", HEAD + """
                        model:
                          product:
                            - {var: pressure, normal: {mean: 3, sd: 1}}
                            - {var: vlave, categorical: [0.5, 0.5]}
                        """, 9, 13, "model.product[1].var", "unknown variable \"vlave\""),
                new Mistake("variable twice in a product", HEAD + """
                        model:
                          product:
                            - {var: pressure, normal: {mean: 3, sd: 1}}
                            - {var: valve, categorical: [0.5, 0.5]}
                            - {var: pressure, normal: {mean: 2, sd: 1}}
                        """, 10, 7, "model.product[2]", "variable pressure is used twice in one product"),
                new Mistake("components over different variables", HEAD + """
                        model:
                          mixture:
                            - weight: 0.5
                              product:
                                - {var: pressure, normal: {mean: 3, sd: 1}}
                                - {var: valve, categorical: [0.5, 0.5]}
                            - weight: 0.5
                              var: pressure
                              normal: {mean: 2, sd: 1}
                        """, 12, 7, "model.mixture[1]", "valve is in model.mixture[0] but not in model.mixture[1]"),
                new Mistake("weights not adding to 1", HEAD + WEIGHTS_OFF, 8, 7, "model.product[0].mixture", "add to 0.9 (expected 1 +/- 1e-09)"),
                new Mistake("negative sd", HEAD + """
                        model:
                          product:
                            - {var: pressure, normal: {mean: 3, sd: -0.5}}
                            - {var: valve, categorical: [0.5, 0.5]}
                        """, 8, 31, "model.product[0].normal", "sd is -0.5; expected sd > 0"),
                new Mistake("probabilities not adding to 1", HEAD + """
                        model:
                          product:
                            - {var: pressure, normal: {mean: 3, sd: 1}}
                            - {var: valve, categorical: {closed: 0.5, open: 0.4}}
                        """, 9, 33, "model.product[1].categorical", "add to 0.9"),
                new Mistake("covariance not positive definite", """
                        format: circa.mixture
                        version: "1.0"
                        variables: [{name: a, type: real}, {name: b, type: real}]
                        model:
                          gaussian-mixture:
                            vars: [a, b]
                            weights: [1]
                            means: [[0, 0]]
                            covariances: [[[1, 2], [2, 1]]]
                        """, 9, 19, "model.gaussian-mixture.covariances[0]", "not positive definite"),
                new Mistake("use cycle", HEAD + """
                        definitions:
                          leak: {product: [{use: drift}, {var: valve, categorical: [0.5, 0.5]}]}
                          drift: {use: leak}
                        model: {use: leak}
                        """, 8, 10, "definitions.drift", "a use cycle: leak uses drift uses leak"),
                new Mistake("declared variable never modelled", HEAD + """
                        model: {var: pressure, normal: {mean: 3, sd: 1}}
                        """, 6, 8, "model", "variable valve is declared but the model never uses it"));
        for (Mistake m : table) {
            FormatException e = assertThrows(FormatException.class, () -> convert(m.text(), false), m.name());
            assertEquals(m.line(), e.line(), m.name() + ": " + e.getMessage());
            assertEquals(m.column(), e.column(), m.name() + ": " + e.getMessage());
            assertEquals(m.path(), e.pointer(), m.name() + ": " + e.getMessage());
            assertTrue(e.getMessage().contains(m.fragment()), m.name() + ": " + e.getMessage());
            assertTrue(e.getMessage().startsWith("model.yaml:" + m.line() + ":" + m.column() + ": "), e.getMessage());
        }
    }

    @Test
    void convert_weightsOffWithNormalizeWeights_rescaled() throws Exception {
        CircuitDocument c = convert(HEAD + WEIGHTS_OFF, true);
        ConversionAssertions.assertValid(c);
        SumNode sum = (SumNode) c.nodes().get(2);
        // 0.6 / 0.9 and 0.3 / 0.9 (arithmetic)
        assertEquals(2.0 / 3.0, sum.weight(0), 1e-15);
        assertEquals(1.0 / 3.0, sum.weight(1), 1e-15);
    }

    @Test
    void convert_longUseChain_noStackOverflow() throws Exception {
        StringBuilder y = new StringBuilder(HEAD + "definitions:\n  d0: {product: [{var: pressure, normal: "
                + "{mean: 3, sd: 1}}, {var: valve, categorical: [0.5, 0.5]}]}\n");
        int n = 20_000;
        for (int i = 1; i < n; i++) {
            y.append("  d").append(i).append(": {use: d").append(i - 1).append("}\n");
        }
        y.append("model: {use: d").append(n - 1).append("}\n");
        CircuitDocument c = convert(y.toString(), false);
        assertEquals(3, c.nodes().size());
        ConversionAssertions.assertValid(c);
    }
}
