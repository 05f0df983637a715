package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedWriter;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code circa sample} on the FORMAT.md example: moments of the samples against those of the mixture; and
 * a wide circuit, whose buffer is bounded by -n.
 */
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

    @Test
    void chunkRows_boundedByCountAndCellBudget() {
        assertEquals(3, SampleCommand.chunkRows(3, 200_000));
        assertEquals(5, SampleCommand.chunkRows(5000, 200_000));
        assertEquals(4096, SampleCommand.chunkRows(1_000_000, 2));
        assertEquals(1, SampleCommand.chunkRows(10, 5_000_000));
        assertEquals(1, SampleCommand.chunkRows(0, 10));
    }

    /** Was out of memory under the suite's 2 GiB heap: a 4096-row buffer of 200,000 cells each (6.5 GB). */
    @Test
    void sample_threeRowsOf200000Variables_fitsTheHeap() throws Exception {
        int nv = 200_000;
        Path circuit = tmp.resolve("wide.json");
        try (BufferedWriter w = Files.newBufferedWriter(circuit)) {
            w.write("{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [");
            for (int v = 0; v < nv; v++) {
                w.write((v == 0 ? "" : ",") + "{\"name\": \"x" + v + "\", \"type\": \"real\"}");
            }
            w.write("], \"nodes\": [");
            for (int v = 0; v < nv; v++) {
                w.write("{\"id\": " + v + ", \"input\": \"normal\", \"var\": " + v + ", \"mean\": 0, \"sd\": 1},");
            }
            w.write("{\"id\": " + nv + ", \"product\": [");
            for (int v = 0; v < nv; v++) {
                w.write((v == 0 ? "" : ",") + v);
            }
            w.write("]}], \"outputs\": [{\"name\": \"joint\", \"node\": " + nv + "}]}");
        }
        Path out = tmp.resolve("wide.csv");
        // in-process without the hang guard: reading 200,000 variables can take tens of seconds on a busy machine
        StringWriter err = new StringWriter();
        int status = Main.run(new String[] {"sample", circuit.toString(), "-n", "3", "--seed", "1", "-o", out.toString()},
                new PrintWriter(new StringWriter(), true), new PrintWriter(err, true));
        assertEquals(ExitStatus.OK, status, err::toString);
        List<String> lines = Files.readAllLines(out);
        assertEquals(4, lines.size());
        for (String line : lines.subList(1, 4)) {
            String[] cells = line.split(",", -1);
            assertEquals(nv, cells.length);
            for (String c : cells) {
                // a standard normal draw: beyond 10 sd with probability ~1e-23 (common practice)
                assertTrue(Math.abs(Double.parseDouble(c)) < 10, c);
            }
        }
    }
}
