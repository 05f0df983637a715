package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code circa sample} on the FORMAT.md example: moments of the samples against those of the mixture. */
class SampleCommandTest {
    private static final int N = 20000;

    @TempDir
    Path tmp;

    @Test
    void sample_moments_matchTheMixture() throws Exception {
        Path out = tmp.resolve("s.csv");
        Cli.Result r = Cli.run("sample", Cli.EXAMPLE.toString(), "-n", String.valueOf(N), "--seed", "11",
                "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        List<String> lines = Files.readAllLines(out);
        assertEquals("inlet_pressure,valve", lines.get(0));
        assertEquals(N + 1, lines.size());
        SummaryStatistics pressure = new SummaryStatistics();
        SummaryStatistics open = new SummaryStatistics();
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            pressure.addValue(Double.parseDouble(cells[0]));
            open.addValue("open".equals(cells[1]) ? 1 : 0);
        }
        // Mixture moments by hand (common practice): mean = sum w_k mu_k,
        // variance = sum w_k (sd_k^2 + mu_k^2) - mean^2, P(open) = sum w_k p_k(open).
        double mean = 0.85 * 3.1 + 0.15 * 2.2;
        double variance = 0.85 * (0.04 + 3.1 * 3.1) + 0.15 * (0.25 + 2.2 * 2.2) - mean * mean;
        double pOpen = 0.85 * 0.80 + 0.15 * 0.1;
        // Sample moments by commons-math3; bounds of five standard errors.
        assertEquals(mean, pressure.getMean(), 5 * Math.sqrt(variance / N));
        assertEquals(variance, pressure.getVariance(), 5 * variance * Math.sqrt(2.0 / N) * 2);
        assertEquals(pOpen, open.getMean(), 5 * Math.sqrt(pOpen * (1 - pOpen) / N));
    }

    @Test
    void sample_sameSeed_sameBytes_otherSeed_otherBytes() throws Exception {
        String a = sample("3", "a.csv");
        String b = sample("3", "b.csv");
        String c = sample("4", "c.csv");
        assertEquals(51, a.lines().count());
        assertEquals(a, b);
        assertTrue(!a.equals(c), "another seed gives other samples");
    }

    private String sample(String seed, String name) throws Exception {
        Path out = tmp.resolve(name);
        Cli.Result r = Cli.run("sample", Cli.EXAMPLE.toString(), "-n", "50", "--seed", seed, "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        return Files.readString(out);
    }

    @Test
    void sample_negativeCount_status2() {
        Cli.assertUnusable(Cli.run("sample", Cli.EXAMPLE.toString(), "-n", "-1"), "-n", ">= 0");
    }
}
