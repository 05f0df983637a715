package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * {@code circa inspect} on the FORMAT.md example. The expected counts are derived by hand from
 * fixtures/circuits/pump-station.json: nodes 0, 1, 3, 4 are inputs (two normal, two categorical),
 * 2 and 5 products of two children each, 6 a sum of two; edges 2 + 2 + 2 = 6; the longest path
 * from the output (6 -> 2 -> 0) has 2 edges; the sum's weights add to 1 and each input is normalised,
 * so log Z = 0; both components give every state a positive probability, so the sum is not
 * deterministic.
 */
class InspectCommandTest {
    @Test
    void inspect_example_countsDerivedByHand() {
        Cli.Result r = Cli.run("inspect", Cli.EXAMPLE.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        String out = r.out();
        assertTrue(out.contains("(pump-station-health)"), out);
        assertTrue(out.contains("  variables: 2\n"), out);
        assertTrue(out.contains("  nodes:     7 (4 inputs, 2 products, 1 sum)\n"), out);
        assertTrue(out.contains("  edges:     6\n"), out);
        assertTrue(out.contains("  depth:     2\n"), out);
        assertTrue(out.contains("  families:  categorical 2, normal 2\n"), out);
        assertTrue(out.contains("    joint = node 6, log Z = 0.0\n"), out);
        assertTrue(out.matches("(?s).*deterministic +false\n.*"), out);
        assertTrue(out.matches("(?s).*smooth +true\n.*"), out);
        assertTrue(out.matches("(?s).*decomposable +true\n.*"), out);
    }

    @Test
    void inspect_missingFile_status2NamingIt() {
        Cli.Result r = Cli.run("inspect", "no-such-circuit.json");
        Cli.assertUnusable(r, "no-such-circuit.json", "no-such-circuit.json");
    }
}
