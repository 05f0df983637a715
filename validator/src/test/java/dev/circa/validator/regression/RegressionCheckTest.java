package dev.circa.validator.regression;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.BufferedWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.MixtureMultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RegressionCheckTest {
    private static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");

    @TempDir
    Path dir;

    /** Writes 300 rows sampled from the commons-math3 mixture, some with a variable missing; columns in another order. */
    private Path mixtureReference(String name) throws Exception {
        MixtureMultivariateNormalDistribution ref = GaussianMixtureFixture.reference(42);
        StringBuilder sb = new StringBuilder("# reference densities from commons-math3 3.6.1\noutlet_pressure,inlet_pressure,log_density\n");
        for (int r = 0; r < 300; r++) {
            double[] x = ref.sample();
            if (r % 3 == 1) {
                // commons-math3 NormalDistribution mixture: the marginal of inlet_pressure
                sb.append(',').append(x[0]).append(',').append(GaussianMixtureFixture.marginalLogDensity(0, x[0]));
            } else if (r % 5 == 2) {
                // commons-math3 NormalDistribution mixture: the marginal of outlet_pressure
                sb.append(x[1]).append(",,").append(GaussianMixtureFixture.marginalLogDensity(1, x[1]));
            } else if (r == 299) {
                // everything missing: the mixture's total mass, 1 (weights add to 1; common practice)
                sb.append(",,0.0");
            } else {
                // commons-math3 MixtureMultivariateNormalDistribution.density
                sb.append(x[1]).append(',').append(x[0]).append(',').append(Math.log(ref.density(x)));
            }
            sb.append('\n');
        }
        Path p = dir.resolve(name);
        Files.writeString(p, sb.toString());
        return p;
    }

    private static CheckReport check(CircuitDocument doc, Tolerance tol, Path... refs) throws Exception {
        RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(doc), tol);
        check.checkEmbedded(doc);
        for (Path p : refs) {
            check.checkReference(p, ReadLimits.DEFAULT);
        }
        return check.report();
    }

    @Test
    void checkReference_gaussianMixtureFromCommonsMath_passesAtDefaultTolerance() throws Exception {
        CheckReport r = check(GaussianMixtureFixture.circuit(false), Tolerance.DEFAULT, mixtureReference("ref.csv"));
        assertEquals(300, r.cases());
        assertEquals(0, r.failures(), r::toText);
        assertTrue(r.passed());
        assertTrue(r.maxAbsError() < 1e-12, r::toText);
        assertEquals(1, r.outputs().size());
        assertEquals(300, r.outputs().get(0).cases());
    }

    @Test
    void include_stretchesCheckedApart_reportEqualsOneCheckOfTheWholeFile() throws Exception {
        // the reference set split at line boundaries, each stretch read with the lines and rows before it
        // (as a distributed reader does), the partial reports included in reverse order
        Path ref = mixtureReference("ref.csv");
        CircuitDocument rounded = GaussianMixtureFixture.circuit(true);
        CompiledCircuit c = CompiledCircuit.compile(rounded);
        List<String> lines = Files.readAllLines(ref);
        for (Tolerance tol : List.of(new Tolerance(1e-9, 1e-9), new Tolerance(1e-5, 1e-5), new Tolerance(1, 1))) {
            CheckReport whole = check(rounded, tol, ref);
            int[] cuts = {0, 2, 57, 58, 190, lines.size()};
            List<CheckReport> parts = new java.util.ArrayList<>();
            long rowsBefore = 0;
            for (int k = 0; k + 1 < cuts.length; k++) {
                String text = (k == 0 ? "" : lines.get(1) + "\n")
                        + String.join("\n", lines.subList(Math.max(cuts[k], k == 0 ? 0 : 2), cuts[k + 1])) + "\n";
                int firstLine = k == 0 ? 1 : Math.max(cuts[k], 2);
                dev.circa.format.csv.CsvReader csv = new dev.circa.format.csv.CsvReader(new java.io.StringReader(text),
                        ref.toString(), ReadLimits.DEFAULT, firstLine);
                RegressionCheck part = new RegressionCheck(c, tol);
                ReferenceSetReader reader = new ReferenceSetReader(csv, c.variables(), List.of(c.outputName(0)), rowsBefore);
                part.checkReference(reader);
                rowsBefore = reader.rowsRead();
                parts.add(0, part.report());
            }
            RegressionCheck merged = new RegressionCheck(c, tol);
            merged.checkEmbedded(rounded);
            merged.include(parts);
            assertEquals(whole.toJson(), merged.report().toJson(), "atol = rtol = " + tol.atol());
        }
    }

    @Test
    void checkReference_float32RoundedExport_failsAt1e9PassesAt1e5() throws Exception {
        // common practice: single-precision training code rounds every weight and parameter to float
        Path ref = mixtureReference("ref.csv");
        CircuitDocument rounded = GaussianMixtureFixture.circuit(true);
        CheckReport strict = check(rounded, new Tolerance(1e-9, 1e-9), ref);
        assertTrue(strict.failures() > 0, strict::toText);
        assertFalse(strict.passed());
        assertEquals(CheckReport.WORST, strict.worst().size());
        assertFalse(strict.worst().get(0).passed());
        assertTrue(strict.maxAbsError() > 1e-9 && strict.maxAbsError() < 1e-5, strict::toText);
        CheckReport loose = check(rounded, new Tolerance(1e-5, 1e-5), ref);
        assertEquals(0, loose.failures(), loose::toText);
        assertEquals(300, loose.cases());
    }

    @Test
    void checkReference_minusInfinity_passesOnlyWhenComputedIsMinusInfinity() throws Exception {
        // common practice: an indicator has mass 1 at its value and 0 elsewhere (log 0 = -inf)
        CircuitDocument doc = new CircuitReader().readString("""
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "alarm", "type": "binary", "states": ["off", "on"]}],
             "nodes": [{"id": 0, "input": "indicator", "var": 0, "value": 1}],
             "outputs": [{"name": "joint", "node": 0}]}
            """, "inline");
        Path ref = dir.resolve("inf.csv");
        Files.writeString(ref, "alarm,log_density\noff,-inf\non,0\noff,-30\non,-inf\n");
        CheckReport r = check(doc, Tolerance.DEFAULT, ref);
        assertEquals(4, r.cases());
        assertEquals(2, r.failures());
        assertEquals(Double.POSITIVE_INFINITY, r.maxAbsError());
        List<Long> failingRows = r.worst().stream().filter(c -> !c.passed()).map(CaseResult::row).sorted().toList();
        assertEquals(List.of(3L, 4L), failingRows);
        assertTrue(r.toJson().contains("\"maxAbsError\": null"));
    }

    @Test
    void checkReference_outputColumnByNameAndIndex_checksEachOutput() throws Exception {
        CircuitDocument doc = new CircuitReader().readString("""
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "inlet_pressure", "type": "real"},
                           {"name": "valve", "type": "categorical", "states": ["closed", "half", "open"]}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 3.1, "sd": 0.2},
                       {"id": 1, "input": "categorical", "var": 1, "probs": [0.05, 0.15, 0.80]},
                       {"id": 2, "product": [0, 1]},
                       {"id": 3, "input": "normal", "var": 0, "mean": 2.2, "sd": 0.5},
                       {"id": 4, "input": "categorical", "var": 1, "probs": [0.6, 0.3, 0.1]},
                       {"id": 5, "product": [3, 4]},
                       {"id": 6, "sum": [2, 5], "weights": [0.85, 0.15]}],
             "outputs": [{"name": "joint", "node": 6}, {"name": "cavitation", "node": 5}]}
            """, "inline");
        NormalDistribution n0 = new NormalDistribution(null, 3.1, 0.2);
        NormalDistribution n1 = new NormalDistribution(null, 2.2, 0.5);
        // commons-math3 NormalDistribution densities times the categorical masses of the document
        double joint = Math.log(0.85 * n0.density(2.5) * 0.15 + 0.15 * n1.density(2.5) * 0.3);
        double cav = Math.log(n1.density(2.5) * 0.3);
        double cavMarginal = n1.logDensity(2.0);
        Path ref = dir.resolve("outputs.csv");
        Files.writeString(ref, "valve,output,inlet_pressure,log_density\n"
                + "half,joint," + 2.5 + "," + joint + "\n"
                + "1,1," + 2.5 + "," + cav + "\n"
                + ",cavitation,2.0," + cavMarginal + "\n"
                + ",0,2.5," + (cav + 1) + "\n");
        CheckReport r = check(doc, Tolerance.DEFAULT, ref);
        assertEquals(4, r.cases());
        assertEquals(1, r.failures(), r::toText);
        assertEquals(2, r.outputs().size());
        assertEquals("joint", r.outputs().get(0).output());
        assertEquals(2, r.outputs().get(0).cases());
        assertEquals(1, r.outputs().get(0).failures());
        assertEquals("cavitation", r.outputs().get(1).output());
        assertEquals(0, r.outputs().get(1).failures());
        assertEquals(4, r.worst().get(0).row());
        assertEquals(5, r.worst().get(0).line());
    }

    @Test
    void checkReference_commentsAndBlankLines_rowsCountDataOnlyAndLinesAreReal() throws Exception {
        Path ref = dir.resolve("comments.csv");
        // commons-math3 NormalDistribution.logDensity for the single normal below
        double good = new NormalDistribution(null, 0, 1).logDensity(0.5);
        Files.writeString(ref, "# made by a test\nx,log_density\n\n# a comment between rows\n0.5," + good + "\n0.5,1.0\n");
        CircuitDocument doc = new CircuitReader().readString("""
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "x", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 0, "sd": 1}], "outputs": [{"name": "joint", "node": 0}]}
            """, "inline");
        CheckReport r = check(doc, Tolerance.DEFAULT, ref);
        assertEquals(2, r.cases());
        assertEquals(1, r.failures());
        CaseResult worst = r.worst().get(0);
        assertEquals(2, worst.row());
        assertEquals(6, worst.line());
        assertTrue(r.toText().contains("comments.csv row 2 (line 6)"), r::toText);
    }

    @Test
    void checkReference_byteOrderMarkBeforeHeader_accepted() throws Exception {
        // common practice: spreadsheet programs start UTF-8 CSV files with the byte-order mark U+FEFF
        Path ref = dir.resolve("bom.csv");
        Files.writeString(ref, "\uFEFFinlet_pressure,valve,log_density\n3.0,open,0.18261296103078395\n");
        // FORMAT.md: 0.18261296103078395 computed with SciPy 1.10
        RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(PUMP), Tolerance.DEFAULT);
        check.checkReference(ref, ReadLimits.DEFAULT);
        CheckReport r = check.report();
        assertEquals(1, r.cases());
        assertEquals(0, r.failures(), r::toText);
    }

    private static final CircuitDocument PUMP = readPump();

    private static CircuitDocument readPump() {
        try {
            return new CircuitReader().read(EXAMPLE);
        } catch (FormatException e) {
            throw new IllegalStateException(e);
        }
    }

    private record BadFile(String content, int line, int column, String fragment) {
    }

    @Test
    void referenceSetReader_malformedFiles_locatedErrors() throws Exception {
        List<BadFile> table = List.of(
                new BadFile("inlet_pressure,pressure,log_density\n", 1, 16, "unknown column \"pressure\""),
                new BadFile("valve,valve,log_density\n", 1, 7, "appears twice"),
                new BadFile("inlet_pressure,valve\n3.0,open\n", 1, 1, "no log_density column"),
                new BadFile("inlet_pressure,log_density\n3.0,-1\nabc,-2\n", 3, 1, "row 2, column inlet_pressure"),
                new BadFile("valve,log_density\nopen,-1\nwide,-2\n", 3, 1, "not a value of valve"),
                new BadFile("valve,log_density\n3,-1\n", 2, 1, "not a value of valve"),
                new BadFile("valve,log_density\nopen,high\n", 2, 6, "not a log-density"),
                new BadFile("valve,output,log_density\nopen,leak,-1\n", 2, 6, "is not an output"),
                new BadFile("valve,output,log_density\nopen,1,-1\n", 2, 6, "is not an output"),
                new BadFile("valve,log_density\nopen,-1,7\n", 2, 6, "has 3 fields; expected 2"),
                new BadFile("", 1, 1, "the file is empty"));
        CompiledCircuit c = CompiledCircuit.compile(PUMP);
        for (BadFile b : table) {
            Path p = dir.resolve("bad.csv");
            Files.writeString(p, b.content());
            RegressionCheck check = new RegressionCheck(c, Tolerance.DEFAULT);
            FormatException e = assertThrows(FormatException.class, () -> check.checkReference(p, ReadLimits.DEFAULT), b.content());
            assertEquals(b.line(), e.line(), b.content() + " -> " + e.getMessage());
            assertEquals(b.column(), e.column(), b.content() + " -> " + e.getMessage());
            assertTrue(e.getMessage().contains(b.fragment()), e.getMessage());
            assertTrue(e.getMessage().startsWith(p.toString()), e.getMessage());
        }
    }

    @Test
    void referenceSetReader_variableNamedLikeReservedColumn_rejected() throws Exception {
        CircuitDocument doc = new CircuitReader().readString("""
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "output", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 0, "sd": 1}], "outputs": [{"name": "joint", "node": 0}]}
            """, "inline");
        Path p = dir.resolve("r.csv");
        Files.writeString(p, "log_density\n0\n");
        RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(doc), Tolerance.DEFAULT);
        FormatException e = assertThrows(FormatException.class, () -> check.checkReference(p, ReadLimits.DEFAULT));
        assertTrue(e.getMessage().contains("reserved"), e.getMessage());
    }

    @Test
    void checkEmbedded_formatExample_passesWithSciPyValues() throws Exception {
        // the two values of FORMAT.md were computed with SciPy 1.10 (scipy.stats.norm.pdf)
        CheckReport r = check(PUMP, Tolerance.resolve(PUMP.checks(), null, null));
        assertEquals(2, r.cases());
        assertEquals(0, r.failures(), r::toText);
        assertTrue(r.maxAbsError() < 1e-12);
        assertEquals("/checks/cases/0", r.worst().stream().map(CaseResult::pointer).sorted().findFirst().orElseThrow());
    }

    @Test
    void checkEmbedded_alteredReference_failsAtItsCase() throws Exception {
        CheckCase good = PUMP.checks().cases().get(1);
        CircuitDocument altered = rebuildWithChecks(new Checks(1e-9, 1e-9, List.of(PUMP.checks().cases().get(0),
                new CheckCase(good.output(), good.values(), good.logDensity() + 1e-6))));
        CheckReport r = check(altered, Tolerance.resolve(altered.checks(), null, null));
        assertEquals(1, r.failures());
        assertEquals(2, r.worst().get(0).row());
        assertEquals("/checks/cases/1", r.worst().get(0).pointer());
        assertEquals(1e-6, r.maxAbsError(), 1e-12);
        CheckReport relaxed = check(altered, Tolerance.resolve(altered.checks(), 1e-5, null));
        assertEquals(0, relaxed.failures());
    }

    @Test
    void checkEmbedded_unknownVariableOrLabel_formatException() throws Exception {
        for (Map<String, Object> values : List.of(Map.<String, Object>of("pressure", 3.0),
                Map.<String, Object>of("valve", "wide"), Map.<String, Object>of("valve", 2.5))) {
            CircuitDocument doc = rebuildWithChecks(new Checks(1e-9, 1e-9, List.of(new CheckCase(null, values, -1))));
            RegressionCheck check = new RegressionCheck(CompiledCircuit.compile(doc), Tolerance.DEFAULT);
            FormatException e = assertThrows(FormatException.class, () -> check.checkEmbedded(doc));
            assertTrue(e.pointer().startsWith("/checks/cases/0/values/"), e.getMessage());
        }
    }

    private static CircuitDocument rebuildWithChecks(Checks checks) {
        return CircuitDocument.builder().variables(PUMP.variables()).nodes(PUMP.nodes()).outputs(PUMP.outputs())
                .checks(checks).source("altered.json").build();
    }

    @Test
    void tolerance_resolve_optionOverFileOverDefault() {
        Checks file = new Checks(1e-6, 1e-7, List.of());
        assertEquals(new Tolerance(1e-6, 1e-7), Tolerance.resolve(file, null, null));
        assertEquals(new Tolerance(1e-3, 1e-7), Tolerance.resolve(file, 1e-3, null));
        assertEquals(new Tolerance(1e-9, 1e-9), Tolerance.resolve(null, null, null));
        // FORMAT.md pass rule: |computed - expected| <= atol + rtol * |expected|
        Tolerance t = new Tolerance(0.1, 0.01);
        assertTrue(t.passes(-10.19, -10.0));
        assertFalse(t.passes(-10.21, -10.0));
    }

    @Test
    void report_toJson_startsWithTheFieldsOfCliMd() throws Exception {
        CheckReport r = check(PUMP, Tolerance.DEFAULT);
        String json = r.toJson();
        assertTrue(json.startsWith("{\"cases\": 2, \"failures\": 0, \"maxAbsError\": "), json);
        assertTrue(json.contains(", \"maxRelError\": ") && json.contains(", \"worst\": ["), json);
    }

    @Test
    void checkReference_millionRows_streamsAndCountsEveryRow() throws Exception {
        // commons-math3 BinomialDistribution(1, p) gives the Bernoulli masses of the tiny circuit
        double p = 0.25;
        BinomialDistribution bern = new BinomialDistribution(null, 1, p);
        String on = Double.toString(bern.logProbability(1));
        String off = Double.toString(bern.logProbability(0));
        Path ref = dir.resolve("million.csv");
        int rows = 1_000_000;
        try (BufferedWriter w = Files.newBufferedWriter(ref, StandardCharsets.UTF_8)) {
            w.write("alarm,log_density\n");
            for (int r = 1; r <= rows; r++) {
                boolean alarm = (r * 2654435761L >>> 7) % 4 == 0;
                if (r % 100_000 == 0) {
                    w.write(alarm ? "on,-0.5\n" : "off,-0.5\n");
                } else if (r % 7 == 0) {
                    w.write(",0.0\n");
                } else {
                    w.write(alarm ? "on," + on + "\n" : "off," + off + "\n");
                }
            }
        }
        CircuitDocument doc = new CircuitReader().readString("""
            {"format": "circa.circuit", "version": "1.0",
             "variables": [{"name": "alarm", "type": "binary", "states": ["off", "on"]}],
             "nodes": [{"id": 0, "input": "bernoulli", "var": 0, "p": 0.25}], "outputs": [{"name": "joint", "node": 0}]}
            """, "inline");
        CheckReport r = check(doc, Tolerance.DEFAULT, ref);
        assertEquals(rows, r.cases());
        assertEquals(10, r.failures(), r::toText);
        List<Long> failing = r.worst().stream().map(CaseResult::row).sorted().toList();
        assertEquals(List.of(100_000L, 200_000L, 300_000L, 400_000L, 500_000L, 600_000L, 700_000L, 800_000L, 900_000L, 1_000_000L),
                failing);
        assertEquals(100_001L, r.worst().stream().filter(c -> c.row() == 100_000L).findFirst().orElseThrow().line());
    }

    @Test
    void worst_orderedByMarginPastThePassRule_marginShownInTextAndJson() {
        // margin = |a - b| / (atol + rtol * |b|), the pass rule of CLI.md written as a ratio (a case passes at <= 1)
        ReportBuilder b = new ReportBuilder(Tolerance.DEFAULT, List.of("p"), null);
        // a reference near 0: relative error (5e-17 - 2.8e-17) / 2.8e-17 = 0.786, yet far inside the rule
        b.add("ref.csv", 1, 2, null, 0, 2.8e-17, 5e-17);
        // relative error 1e-8 / 3 = 3.3e-9, but past the rule: margin 1e-8 / (1e-9 + 3e-9) = 2.5
        b.add("ref.csv", 2, 3, null, 0, -3.0, -3.0 - 1e-8);
        // margin 4e-9 / (1e-9 + 1e-9) = 2, between the two
        b.add("ref.csv", 3, 4, null, 0, -1.0, -1.0 - 4e-9);
        CheckReport r = b.build();
        assertEquals(List.of(2L, 3L, 1L), r.worst().stream().map(CaseResult::row).toList());
        assertEquals(2.5, r.worst().get(0).excess(), 1e-6);
        assertEquals(2.0, r.worst().get(1).excess(), 1e-6);
        assertEquals(2.2e-17 / (1e-9 + 1e-9 * 2.8e-17), r.worst().get(2).excess(), 1e-20);
        assertEquals(2.2 / 2.8, r.worst().get(2).relError(), 1e-9, "the relative error stays |a - b| / |b|");
        String json = r.toJson();
        assertTrue(json.contains("\"row\": 2,") && json.contains("\"relError\": 3.3333333130750966E-9, \"margin\": 2.4999999848063226, \"passed\": false"), json);
        String text = r.toText();
        assertTrue(text.contains("FAIL margin 2.50, ref.csv row 2"), text);
        assertTrue(text.contains("pass margin 2.20e-08, ref.csv row 1"), text);
        assertTrue(text.indexOf("row 2 ") < text.indexOf("row 3 ") && text.indexOf("row 3 ") < text.indexOf("row 1 "), text);
    }
}
