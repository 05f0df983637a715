package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.CircuitWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.MixtureMultivariateNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.random.Well19937c;
import org.apache.commons.math3.util.Pair;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CheckCommandTest {
    static final Path EXAMPLE = Path.of("..", "fixtures", "circuits", "pump-station.json");
    private static final double[] WEIGHTS = {0.6, 0.4};
    private static final double[][] MEANS = {{3.1, 5.0}, {2.2, 4.1}};
    private static final double[][] SDS = {{0.2, 0.3}, {0.5, 0.4}};

    @TempDir
    Path dir;

    /** A two-regime Gaussian mixture over inlet and outlet pressure; with {@code float32} every number rounded to float. */
    private Path mixture(String name, boolean float32) throws Exception {
        List<Node> nodes = new ArrayList<>();
        for (int k = 0; k < 2; k++) {
            nodes.add(new InputNode(3 * k, null, Family.NORMAL, new int[] {0}, new double[] {f(MEANS[k][0], float32), f(SDS[k][0], float32)}, false));
            nodes.add(new InputNode(3 * k + 1, null, Family.NORMAL, new int[] {1}, new double[] {f(MEANS[k][1], float32), f(SDS[k][1], float32)}, false));
            nodes.add(new ProductNode(3 * k + 2, null, new int[] {3 * k, 3 * k + 1}));
        }
        nodes.add(new SumNode(6, null, new int[] {2, 5}, new double[] {f(WEIGHTS[0], float32), f(WEIGHTS[1], float32)}, false));
        CircuitDocument doc = CircuitDocument.builder().name("pump-pressures")
                .variables(List.of(Variable.of("inlet_pressure", VariableType.REAL), Variable.of("outlet_pressure", VariableType.REAL)))
                .nodes(nodes).outputs(List.of(new Output("joint", 6))).build();
        Path p = dir.resolve(name);
        new CircuitWriter().write(doc, p);
        return p;
    }

    private static double f(double x, boolean float32) {
        return float32 ? (double) (float) x : x;
    }

    /** 500 rows sampled from commons-math3's MixtureMultivariateNormalDistribution, with its log-density. */
    private Path reference() throws Exception {
        List<Pair<Double, MultivariateNormalDistribution>> comps = new ArrayList<>();
        for (int k = 0; k < 2; k++) {
            comps.add(new Pair<>(WEIGHTS[k], new MultivariateNormalDistribution(MEANS[k],
                    new double[][] {{SDS[k][0] * SDS[k][0], 0}, {0, SDS[k][1] * SDS[k][1]}})));
        }
        MixtureMultivariateNormalDistribution m = new MixtureMultivariateNormalDistribution(new Well19937c(5), comps);
        StringBuilder sb = new StringBuilder("inlet_pressure,outlet_pressure,log_density\n");
        for (int r = 0; r < 500; r++) {
            double[] x = m.sample();
            // commons-math3 3.6.1 MixtureMultivariateNormalDistribution.density
            sb.append(x[0]).append(',').append(x[1]).append(',').append(Math.log(m.density(x))).append('\n');
        }
        Path p = dir.resolve("reference.csv");
        Files.writeString(p, sb.toString());
        return p;
    }

    @Test
    void check_commonsMathReference_passesWithStatus0() throws Exception {
        Cli.Result r = Cli.run("check", mixture("m.json", false).toString(), "--reference", reference().toString());
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        assertTrue(r.out().startsWith("PASSED: 500 cases, 0 failures (atol 1.00e-09, rtol 1.00e-09)"), r::toString);
    }

    @Test
    void check_float32Export_status1AtDefaultTolerance_status0At1e5() throws Exception {
        // common practice: single-precision training code rounds every weight and parameter to float
        Path model = mixture("m32.json", true);
        Path ref = reference();
        Cli.Result strict = Cli.run("check", model.toString(), "--reference", ref.toString());
        assertEquals(ExitStatus.FAILED, strict.status(), strict::toString);
        assertTrue(strict.out().startsWith("FAILED: 500 cases, "), strict::toString);
        assertTrue(strict.out().matches("(?s).*\n  FAIL margin [0-9.e+]+, " + java.util.regex.Pattern.quote(ref.toString()) + " row .*"), strict::toString);
        assertEquals(10, strict.out().lines().filter(l -> l.startsWith("  FAIL ") || l.startsWith("  pass ")).count(), strict::toString);
        Cli.Result loose = Cli.run("check", model.toString(), "--reference", ref.toString(), "--atol", "1e-5", "--rtol", "1e-5");
        assertEquals(ExitStatus.OK, loose.status(), loose::toString);
    }

    @Test
    void check_jsonFormat_givesTheFieldsOfCliMd() throws Exception {
        Cli.Result r = Cli.run("check", mixture("m32.json", true).toString(), "--reference", reference().toString(), "--format", "json");
        assertEquals(ExitStatus.FAILED, r.status(), r::toString);
        assertTrue(r.out().startsWith("{\"cases\": 500, \"failures\": "), r::toString);
        assertTrue(r.out().contains("\"maxAbsError\": ") && r.out().contains("\"maxRelError\": ")
                && r.out().contains("\"worst\": [\n  {\"source\": "), r::toString);
    }

    @Test
    void check_formatExampleEmbeddedChecks_status0() {
        // FORMAT.md's reference values, computed with SciPy 1.10
        Cli.Result r = Cli.run("check", EXAMPLE.toString());
        assertEquals(ExitStatus.OK, r.status(), r::toString);
        assertTrue(r.out().startsWith("PASSED: 2 cases, 0 failures"), r::toString);
    }

    @Test
    void check_badReferenceCell_status2WithFileLineAndColumn() throws Exception {
        Path ref = dir.resolve("bad.csv");
        Files.writeString(ref, "inlet_pressure,valve,log_density\n3.0,open,0.18\n2.1,shut,-2.1\n");
        Cli.Result r = Cli.run("check", EXAMPLE.toString(), "--reference", ref.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.err().startsWith("circa: " + ref + ":3:5: "), r::toString);
        assertTrue(r.err().contains("not a value of valve"), r::toString);
        assertEquals("", r.out());
    }

    @Test
    void check_nothingToCheck_status2() throws Exception {
        Cli.Result r = Cli.run("check", mixture("m.json", false).toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.err().contains("nothing to check"), r::toString);
    }
}
