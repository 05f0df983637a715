package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class EvalCommandTest {
    private static final String EXAMPLE = "../fixtures/circuits/pump-station.json";
    /** |a - b| <= TOL * max(1, |b|) for the FORMAT.md reference values. */
    private static final double TOL = 1e-12;

    @TempDir
    Path tmp;

    @Test
    void eval_formatExample_reproducesScipyReferenceValues() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.0,open\n2.1,\n");
        Path out = tmp.resolve("out.csv");
        Cli.Result r = Cli.run("eval", EXAMPLE, "--data", data.toString(), "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        List<String> lines = Files.readAllLines(out);
        assertEquals("inlet_pressure,valve,log_density", lines.get(0));
        // Reference values of FORMAT.md, computed independently with SciPy 1.10 (scipy.stats.norm.pdf).
        assertClose(0.18261296103078395, Double.parseDouble(lines.get(1).split(",")[2]));
        assertClose(-2.1428574782131147, Double.parseDouble(lines.get(2).split(",", -1)[2]));
    }

    @Test
    void eval_toStandardOutput_badRowFarDown_saysHowManyRowsWereWritten() throws Exception {
        StringBuilder csv = new StringBuilder("inlet_pressure,valve\n");
        for (int i = 0; i < 5000; i++) {
            csv.append("3.0,open\n");
        }
        csv.append("3.0,ajar\n");
        Path data = tmp.resolve("bad-late.csv");
        Files.writeString(data, csv.toString());
        Cli.Result r = Cli.run("eval", EXAMPLE, "--data", data.toString());
        assertEquals(2, r.status(), r::describe);
        java.util.regex.Matcher m = java.util.regex.Pattern
                .compile("\\(([\\d,]+) data rows? (?:was|were) written to standard output before this error\\)").matcher(r.err());
        assertTrue(m.find(), r::describe);
        long said = Long.parseLong(m.group(1).replace(",", ""));
        // rows go out in batches of the data reader: a whole number of them, all before the bad row
        assertTrue(said > 0 && said <= 5000, "rows before the bad one: " + said);
    }

    @Test
    void eval_givenColumn_conditionalEqualsJointMinusMarginal() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.0,open\n");
        Path joint = tmp.resolve("j.csv");
        Path cond = tmp.resolve("c.csv");
        Path marg = tmp.resolve("m.csv");
        Path justPressure = tmp.resolve("p.csv");
        Files.writeString(justPressure, "inlet_pressure\n3.0\n");
        assertEquals(0, Cli.run("eval", EXAMPLE, "--data", data.toString(), "-o", joint.toString()).status());
        assertEquals(0, Cli.run("eval", EXAMPLE, "--data", data.toString(), "--given", "inlet_pressure",
                "-o", cond.toString()).status());
        assertEquals(0, Cli.run("eval", EXAMPLE, "--data", justPressure.toString(), "-o", marg.toString()).status());
        double j = lastValue(joint);
        double c = lastValue(cond);
        double m = lastValue(marg);
        // Definition of a conditional density (common practice): log p(v | p) = log p(p, v) - log p(p).
        assertEquals(j - m, c, 1e-12);
    }

    @Test
    void eval_unknownColumn_status2WithLocation() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,flow\n3.0,1\n");
        Cli.Result r = Cli.run("eval", EXAMPLE, "--data", data.toString());
        assertEquals(2, r.status());
        assertTrue(r.err().contains("d.csv:1:16"), r.err());
        assertTrue(r.err().contains("unknown column \"flow\""), r.err());
    }

    @Test
    void sample_sameSeed_sameBytes() throws Exception {
        Path a = tmp.resolve("a.csv");
        Path b = tmp.resolve("b.csv");
        assertEquals(0, Cli.run("sample", EXAMPLE, "-n", "5000", "--seed", "7", "-o", a.toString()).status());
        assertEquals(0, Cli.run("sample", EXAMPLE, "-n", "5000", "--seed", "7", "-o", b.toString()).status());
        assertEquals(Files.readString(a), Files.readString(b));
        List<String> lines = Files.readAllLines(a);
        assertEquals("inlet_pressure,valve", lines.get(0));
        assertEquals(5001, lines.size());
        // The example's P(valve = open) = 0.85 * 0.80 + 0.15 * 0.1 = 0.695 (FORMAT.md parameters, common practice):
        // within four binomial standard errors at n = 5000.
        long open = lines.stream().skip(1).filter(l -> l.endsWith(",open")).count();
        double se = Math.sqrt(0.695 * 0.305 / 5000);
        assertEquals(0.695, open / 5000.0, 4 * se);
    }

    @Test
    void impute_missingValve_filledWithMostProbableState() throws Exception {
        Path data = tmp.resolve("d.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.1,\n2.0,\n");
        Path out = tmp.resolve("o.csv");
        Cli.Result r = Cli.run("impute", EXAMPLE, "--data", data.toString(), "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        List<String> lines = Files.readAllLines(out);
        // At 3.1 bar the normal-operation component dominates (valve mostly open); at 2.0 bar the cavitation
        // component does (valve mostly closed): max-product by hand from the FORMAT.md parameters.
        assertEquals("3.1,open", lines.get(1));
        assertEquals("2.0,closed", lines.get(2));
    }

    private static double lastValue(Path csv) throws Exception {
        List<String> lines = Files.readAllLines(csv);
        String[] f = lines.get(1).split(",", -1);
        return Double.parseDouble(f[f.length - 1]);
    }

    private static void assertClose(double expected, double actual) {
        assertTrue(Math.abs(actual - expected) <= TOL * Math.max(1, Math.abs(expected)),
                "expected " + expected + " got " + actual);
    }
}
