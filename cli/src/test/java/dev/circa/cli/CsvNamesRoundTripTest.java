package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.csv.CsvRecords;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Variable names and labels are exact as written: a circuit with variables " a" and "a" and labels
 * "x", " x" and "#x" goes through sample, eval, impute and check with every name and value intact.
 */
class CsvNamesRoundTripTest {
    private static final double[] PROBS = {0.2, 0.3, 0.5};
    private static final String[] LABELS = {"x", " x", "#x"};
    private static final NormalDistribution NORMAL = new NormalDistribution(1.0, 2.0);

    @TempDir
    Path tmp;

    private Path circuit() throws Exception {
        Path p = tmp.resolve("spaces.json");
        Files.writeString(p, """
                {"format": "circa.circuit", "version": "1.0",
                 "variables": [{"name": " a", "type": "categorical", "states": ["x", " x", "#x"]},
                               {"name": "a", "type": "real"}],
                 "nodes": [{"id": 0, "input": "categorical", "var": 0, "probs": [0.2, 0.3, 0.5]},
                           {"id": 1, "input": "normal", "var": 1, "mean": 1.0, "sd": 2.0},
                           {"id": 2, "product": [0, 1]}],
                 "outputs": [{"name": "joint", "node": 2}]}
                """);
        return p;
    }

    @Test
    void validate_namesAndLabelsWithSurroundingSpaces_accepted() throws Exception {
        Cli.Result r = Cli.run("validate", circuit().toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
    }

    @Test
    void sampleThenEval_namesWithSpaces_everyRowScoredAsWritten() throws Exception {
        Path c = circuit();
        Path sample = tmp.resolve("sample.csv");
        Cli.Result s = Cli.run("sample", c.toString(), "-n", "300", "--seed", "5", "-o", sample.toString());
        assertEquals(ExitStatus.OK, s.status(), s::describe);
        // the header quotes the name with a space, so that any CSV reader keeps it (common practice)
        assertEquals("\" a\",a", Files.readAllLines(sample).get(0));
        Path scored = tmp.resolve("scored.csv");
        Cli.Result e = Cli.run("eval", c.toString(), "--data", sample.toString(), "-o", scored.toString());
        assertEquals(ExitStatus.OK, e.status(), e::describe);
        List<List<String>> rows = records(scored);
        assertEquals(List.of(" a", "a", "log_density"), rows.get(0));
        assertEquals(301, rows.size());
        int[] seen = new int[3];
        for (List<String> row : rows.subList(1, rows.size())) {
            int k = List.of(LABELS).indexOf(row.get(0));
            assertTrue(k >= 0, "a label read back as written: " + row);
            seen[k]++;
            double x = Double.parseDouble(row.get(1));
            // commons-math3 3.6.1 NormalDistribution.logDensity; the categorical's probability as written
            double expected = Math.log(PROBS[k]) + NORMAL.logDensity(x);
            assertEquals(expected, Double.parseDouble(row.get(2)), 1e-12 * Math.abs(expected), row.toString());
        }
        for (int k = 0; k < 3; k++) {
            assertTrue(seen[k] > 0, "label \"" + LABELS[k] + "\" drawn and read back");
        }
    }

    @Test
    void evalGivenAndCheck_exactNamesFirst() throws Exception {
        Path c = circuit();
        Path data = tmp.resolve("data.csv");
        Files.writeString(data, "a,\" a\"\n0.5,\" x\"\n0.5,x\n");
        Path out = tmp.resolve("given.csv");
        Cli.Result r = Cli.run("eval", c.toString(), "--data", data.toString(), "--given", "a", "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        List<List<String>> rows = records(out);
        // given a, log p(" a" | a) = log of the label's probability (the variables are independent)
        assertEquals(Math.log(0.3), Double.parseDouble(rows.get(1).get(2)), 1e-15);
        assertEquals(Math.log(0.2), Double.parseDouble(rows.get(2).get(2)), 1e-15);
        Path ref = tmp.resolve("reference.csv");
        double d = Math.log(0.5) + NORMAL.logDensity(0.5);
        Files.writeString(ref, "\" a\",a,log_density\n\"#x\",0.5," + d + "\n");
        Cli.Result k = Cli.run("check", c.toString(), "--reference", ref.toString());
        assertEquals(ExitStatus.OK, k.status(), k::describe);
        Files.writeString(ref, "\"a \",a,log_density\n\"#x\",0.5," + d + "\n");
        Cli.Result bad = Cli.run("check", c.toString(), "--reference", ref.toString());
        assertEquals(ExitStatus.UNUSABLE, bad.status(), bad::describe);
        assertTrue(bad.err().contains("unknown column \"a \""), bad::describe);
    }

    private static List<List<String>> records(Path p) throws Exception {
        return CsvRecords.of(p);
    }
}
