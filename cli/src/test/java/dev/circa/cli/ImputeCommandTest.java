package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code circa impute} on the FORMAT.md example (two components: normal x categorical, weights 0.85 and 0.15). */
class ImputeCommandTest {
    private static final String[] VALVE = {"closed", "half", "open"};
    private static final double[] WEIGHT = {0.85, 0.15};
    private static final double[] MEAN = {3.1, 2.2};
    private static final double[] SD = {0.2, 0.5};
    private static final double[][] PROBS = {{0.05, 0.15, 0.80}, {0.6, 0.3, 0.1}};

    @TempDir
    Path tmp;

    @Test
    void impute_missingCells_takeTheMaxProductChoiceOfTheMixture() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.0,\n,closed\n2.0,half\n");
        Path out = tmp.resolve("out.csv");
        Cli.Result r = Cli.run("impute", Cli.EXAMPLE.toString(), "--data", data.toString(), "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        List<String> lines = Files.readAllLines(out);
        assertEquals("inlet_pressure,valve", lines.get(0));
        // Reference: max over components k and states v of w_k N(3.0; mu_k, sd_k) p_k(v), densities from
        // commons-math3 NormalDistribution (max-product over a sum of products, common practice).
        assertEquals("3.0," + VALVE[bestValveGiven(3.0)], lines.get(1));
        // Given valve = closed, each component's best pressure is its mean (the mode of a normal,
        // common practice); the component with the larger w_k p_k(closed) N(mu_k; mu_k, sd_k) wins.
        int k = bestComponentGivenClosed();
        assertEquals(MEAN[k], Double.parseDouble(lines.get(2).split(",")[0]), 0.0, lines::toString);
        assertEquals("closed", lines.get(2).split(",")[1]);
        assertEquals("2.0,half", lines.get(3), "complete rows are copied as they are");
        assertTrue(r.err().contains("approximate"), "the example is not deterministic: " + r.err());
    }

    @Test
    void impute_unknownOutputName_status2NamingTheOutputs() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.0,\n");
        Cli.Result r = Cli.run("impute", Cli.EXAMPLE.toString(), "--data", data.toString(), "--output-name", "nope");
        Cli.assertUnusable(r, "nope", "its outputs are joint");
    }

    @Test
    void impute_withoutData_status2() {
        Cli.Result r = Cli.run("impute", Cli.EXAMPLE.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains("--data"), r::describe);
    }

    private static int bestValveGiven(double pressure) {
        int best = -1;
        double bestScore = -1;
        for (int k = 0; k < 2; k++) {
            double f = WEIGHT[k] * new NormalDistribution(MEAN[k], SD[k]).density(pressure);
            for (int v = 0; v < VALVE.length; v++) {
                if (f * PROBS[k][v] > bestScore) {
                    bestScore = f * PROBS[k][v];
                    best = v;
                }
            }
        }
        return best;
    }

    private static int bestComponentGivenClosed() {
        double[] score = new double[2];
        for (int k = 0; k < 2; k++) {
            score[k] = WEIGHT[k] * PROBS[k][0] * new NormalDistribution(MEAN[k], SD[k]).density(MEAN[k]);
        }
        return score[0] >= score[1] ? 0 : 1;
    }
}
