package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.distribution.MixtureMultivariateNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.fitting.MultivariateNormalMixtureExpectationMaximization;
import org.apache.commons.math3.util.Pair;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Old Faithful (fixtures/data/old-faithful.csv, R datasets::faithful; see fixtures/data/SOURCES.md): a
 * three-component Gaussian mixture fitted by commons-math3 3.6.1's EM, converted by the mixture converter,
 * written, and loaded through the model API; its log-densities against commons-math3's.
 */
class OldFaithfulTest {
    private static final double REL = 1e-10;
    private static double[][] data;
    private static MixtureMultivariateNormalDistribution fitted;
    private static Model model;

    @BeforeAll
    static void fitConvertLoad(@TempDir Path dir) throws Exception {
        List<String> lines = Files.readAllLines(Path.of("..", "fixtures", "data", "old-faithful.csv"));
        assertEquals("\"eruptions\",\"waiting\"", lines.get(0));
        data = new double[lines.size() - 1][];
        for (int r = 1; r < lines.size(); r++) {
            String[] cells = lines.get(r).split(",");
            data[r - 1] = new double[] {Double.parseDouble(cells[0]), Double.parseDouble(cells[1])};
        }
        assertEquals(272, data.length);
        // commons-math3 EM started from its own initial mixture (estimate), which is deterministic: the same
        // fit on every run without a random seed
        MultivariateNormalMixtureExpectationMaximization em = new MultivariateNormalMixtureExpectationMaximization(data);
        em.fit(MultivariateNormalMixtureExpectationMaximization.estimate(data, 3));
        fitted = em.getFittedModel();
        List<String> weights = new ArrayList<>();
        List<String> means = new ArrayList<>();
        List<String> covs = new ArrayList<>();
        for (Pair<Double, MultivariateNormalDistribution> c : fitted.getComponents()) {
            weights.add(Double.toString(c.getFirst()));
            means.add(list(c.getSecond().getMeans()));
            double[][] cov = c.getSecond().getCovariances().getData();
            covs.add("[" + list(cov[0]) + ", " + list(cov[1]) + "]");
        }
        String mixture = """
                {"format": "circa.mixture", "version": "1.0", "name": "old-faithful-em3",
                 "variables": [{"name": "eruptions", "type": "real", "unit": "min"},
                               {"name": "waiting", "type": "real", "unit": "min"}],
                 "model": {"gaussian-mixture": {"vars": ["eruptions", "waiting"],
                   "weights": [%s], "means": [%s], "covariances": [%s]}}}
                """.formatted(String.join(", ", weights), String.join(", ", means), String.join(", ", covs));
        MixtureConverter.Result converted = MixtureConverter.convert(
                MixtureReader.readString(mixture, "old-faithful-em3.json", ReadLimits.DEFAULT), MixtureOptions.DEFAULT);
        assertTrue(converted.verification().passed(), converted.summary());
        Path file = dir.resolve("old-faithful-em3.circuit.json");
        new CircuitWriter().write(converted.circuit(), file);
        model = Model.load(file);
    }

    private static String list(double[] v) {
        List<String> s = new ArrayList<>();
        for (double d : v) {
            s.add(Double.toString(d));
        }
        return "[" + String.join(", ", s) + "]";
    }

    private static void closeRel(double expected, double actual, String what) {
        assertTrue(Math.abs(expected - actual) <= REL * Math.max(1, Math.abs(expected)), () -> String.format(Locale.ROOT,
                "%s: expected %s, got %s", what, expected, actual));
    }

    @Test
    void logDensity_everyRowByName_equalsCommonsMathMixture() {
        // source: commons-math3 3.6.1 MixtureMultivariateNormalDistribution.density
        for (int r = 0; r < data.length; r++) {
            double expected = Math.log(fitted.density(data[r]));
            closeRel(expected, model.logDensity(Map.of("eruptions", data[r][0], "waiting", data[r][1])), "row " + r);
        }
    }

    @Test
    void logDensity_oneVariableMissing_equalsMixtureOfCommonsMathMarginals() {
        // source: commons-math3 3.6.1 NormalDistribution with each component's mean and variance of the variable
        String[] names = {"eruptions", "waiting"};
        for (int keep = 0; keep < 2; keep++) {
            Row row = model.newRow();
            for (int r = 0; r < data.length; r++) {
                double expected = 0;
                for (Pair<Double, MultivariateNormalDistribution> c : fitted.getComponents()) {
                    double mean = c.getSecond().getMeans()[keep];
                    double sd = Math.sqrt(c.getSecond().getCovariances().getEntry(keep, keep));
                    expected += c.getFirst() * new NormalDistribution(mean, sd).density(data[r][keep]);
                }
                Map<String, Object> values = new HashMap<>();
                values.put(names[keep], data[r][keep]);
                values.put(names[1 - keep], null);
                closeRel(Math.log(expected), model.logDensity(values), names[keep] + " only, row " + r);
                row.clear().set(names[keep], data[r][keep]);
                closeRel(Math.log(expected), model.logDensity(row), names[keep] + " only (row), row " + r);
            }
        }
    }

    @Test
    void logDensity_batch_equalsCommonsMathMixture() {
        // source: commons-math3 3.6.1 MixtureMultivariateNormalDistribution.density
        double[] cells = new double[data.length * 2];
        for (int r = 0; r < data.length; r++) {
            cells[2 * r] = data[r][0];
            cells[2 * r + 1] = data[r][1];
        }
        double[] out = new double[data.length];
        model.logDensity(cells, data.length, out);
        for (int r = 0; r < data.length; r++) {
            closeRel(Math.log(fitted.density(data[r])), out[r], "batch row " + r);
        }
    }
}
