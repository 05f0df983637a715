package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureReader;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.distribution.MixtureMultivariateNormalDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.fitting.MultivariateNormalMixtureExpectationMaximization;
import org.apache.commons.math3.util.Pair;
import org.junit.jupiter.api.Test;

/**
 * Mixtures built from the open datasets in fixtures/data (sources in fixtures/data/SOURCES.md),
 * converted; the circuit's and the source evaluator's densities against commons-math3 3.6.1 and
 * against exact counts.
 */
class DatasetConversionTest {
    private static String num(double v) {
        return Double.toString(v);
    }

    private static String list(double[] v) {
        List<String> s = new ArrayList<>();
        for (double d : v) {
            s.add(num(d));
        }
        return "[" + String.join(", ", s) + "]";
    }

    private static void closeRel(double expected, double actual, double rel, String what) {
        assertTrue(Math.abs(expected - actual) <= rel * Math.abs(expected),
                () -> String.format(Locale.ROOT, "%s: expected %s, got %s (rel %s)", what, expected, actual,
                        Math.abs(expected - actual) / Math.abs(expected)));
    }

    private static MixtureDocument read(String json) throws Exception {
        return MixtureReader.readString(json, "generated.json", ReadLimits.DEFAULT);
    }

    @Test
    void oldFaithful_emFittedThreeComponents_densityEqualsCommonsMathAtAll272Points() throws Exception {
        // data: Old Faithful (fixtures/data/old-faithful.csv, R datasets::faithful)
        double[][] data = Datasets.numbers("old-faithful.csv", 0, 1);
        assertEquals(272, data.length);
        // commons-math3 3.6.1: EM from its own deterministic initial mixture (estimate)
        MultivariateNormalMixtureExpectationMaximization em = new MultivariateNormalMixtureExpectationMaximization(data);
        em.fit(MultivariateNormalMixtureExpectationMaximization.estimate(data, 3));
        MixtureMultivariateNormalDistribution fitted = em.getFittedModel();
        List<String> weights = new ArrayList<>();
        List<String> means = new ArrayList<>();
        List<String> covs = new ArrayList<>();
        for (Pair<Double, MultivariateNormalDistribution> c : fitted.getComponents()) {
            weights.add(num(c.getFirst()));
            means.add(list(c.getSecond().getMeans()));
            double[][] cov = c.getSecond().getCovariances().getData();
            covs.add("[" + list(cov[0]) + ", " + list(cov[1]) + "]");
        }
        String json = """
                {"format": "circa.mixture", "version": "1.0", "name": "old-faithful-em3",
                 "variables": [{"name": "eruptions", "type": "real", "unit": "min"},
                               {"name": "waiting", "type": "real", "unit": "min"}],
                 "model": {"gaussian-mixture": {"vars": ["eruptions", "waiting"],
                   "weights": [%s], "means": [%s], "covariances": [%s]}}}
                """.formatted(String.join(", ", weights), String.join(", ", means), String.join(", ", covs));
        MixtureDocument doc = read(json);
        CircuitDocument circuit = ConversionAssertions.convertVerified(doc, MixtureOptions.DEFAULT);
        double[] rows = new double[data.length * 2];
        for (int r = 0; r < data.length; r++) {
            rows[2 * r] = data[r][0];
            rows[2 * r + 1] = data[r][1];
        }
        double[] circuitLog = ConversionAssertions.circuitLogDensity(circuit, rows, data.length);
        double[] sourceLog = new double[data.length];
        MixtureDensity.of(doc, false).logDensity(rows, data.length, sourceLog);
        for (int r = 0; r < data.length; r++) {
            double expected = fitted.density(data[r]);
            closeRel(expected, Math.exp(circuitLog[r]), 1e-10, "circuit at row " + r);
            closeRel(expected, Math.exp(sourceLog[r]), 1e-10, "source at row " + r);
        }
    }

    @Test
    void iris_perSpeciesDiagonalGaussians_densityEqualsCommonsMathProducts() throws Exception {
        // data: Iris (fixtures/data/iris.csv, R datasets::iris); closed-form ML: mean, biased variance
        List<String[]> rows = Datasets.csv("iris.csv");
        String[] names = {"sepal_length", "sepal_width", "petal_length", "petal_width"};
        Map<String, List<double[]>> bySpecies = new LinkedHashMap<>();
        for (String[] r : rows.subList(1, rows.size())) {
            double[] x = new double[4];
            for (int j = 0; j < 4; j++) {
                x[j] = Double.parseDouble(r[j]);
            }
            bySpecies.computeIfAbsent(r[4], k -> new ArrayList<>()).add(x);
        }
        int total = rows.size() - 1;
        assertEquals(150, total);
        List<String> entries = new ArrayList<>();
        List<double[]> means = new ArrayList<>();
        List<double[]> sds = new ArrayList<>();
        List<Double> weights = new ArrayList<>();
        for (Map.Entry<String, List<double[]>> s : bySpecies.entrySet()) {
            List<double[]> xs = s.getValue();
            double[] mean = new double[4];
            double[] var = new double[4];
            for (double[] x : xs) {
                for (int j = 0; j < 4; j++) {
                    mean[j] += x[j] / xs.size();
                }
            }
            for (double[] x : xs) {
                for (int j = 0; j < 4; j++) {
                    var[j] += (x[j] - mean[j]) * (x[j] - mean[j]) / xs.size();
                }
            }
            double[] sd = new double[4];
            List<String> factors = new ArrayList<>();
            for (int j = 0; j < 4; j++) {
                sd[j] = Math.sqrt(var[j]);
                factors.add("{\"var\": \"" + names[j] + "\", \"normal\": {\"mean\": " + num(mean[j]) + ", \"sd\": "
                        + num(sd[j]) + "}}");
            }
            double w = (double) xs.size() / total;
            entries.add("{\"weight\": " + num(w) + ", \"label\": \"" + s.getKey() + "\", \"product\": ["
                    + String.join(", ", factors) + "]}");
            means.add(mean);
            sds.add(sd);
            weights.add(w);
        }
        List<String> vars = new ArrayList<>();
        for (String n : names) {
            vars.add("{\"name\": \"" + n + "\", \"type\": \"real\", \"unit\": \"cm\"}");
        }
        String json = "{\"format\": \"circa.mixture\", \"version\": \"1.0\", \"name\": \"iris-species\", "
                + "\"variables\": [" + String.join(", ", vars) + "], \"model\": {\"mixture\": ["
                + String.join(", ", entries) + "]}}";
        MixtureDocument doc = read(json);
        CircuitDocument circuit = ConversionAssertions.convertVerified(doc, MixtureOptions.DEFAULT);
        // every flower complete, then the same flower with the petal measurements missing
        double[] data = new double[total * 2 * 4];
        int r = 0;
        for (List<double[]> xs : bySpecies.values()) {
            for (double[] x : xs) {
                System.arraycopy(x, 0, data, r * 4, 4);
                System.arraycopy(x, 0, data, (total + r) * 4, 2);
                data[(total + r) * 4 + 2] = Double.NaN;
                data[(total + r) * 4 + 3] = Double.NaN;
                r++;
            }
        }
        double[] circuitLog = ConversionAssertions.circuitLogDensity(circuit, data, 2 * total);
        for (int k = 0; k < 2 * total; k++) {
            double expected = 0;
            for (int s = 0; s < means.size(); s++) {
                double p = weights.get(s);
                for (int j = 0; j < 4; j++) {
                    double x = data[k * 4 + j];
                    if (!Double.isNaN(x)) {
                        // commons-math3 3.6.1: NormalDistribution.density; a missing factor is dropped
                        p *= new NormalDistribution(means.get(s)[j], sds.get(s)[j]).density(x);
                    }
                }
                expected += p;
            }
            closeRel(expected, Math.exp(circuitLog[k]), 1e-10, "iris point " + k);
        }
    }

    @Test
    void titanic_exactEmpiricalJoint_cellAndSurvivalProbabilitiesExact() throws Exception {
        // data: Titanic counts (fixtures/data/titanic-counts.csv, R datasets::Titanic)
        List<String[]> rows = Datasets.csv("titanic-counts.csv");
        String[] names = rows.get(0);
        List<List<String>> states = new ArrayList<>();
        for (int j = 0; j < 4; j++) {
            List<String> s = new ArrayList<>();
            for (String[] r : rows.subList(1, rows.size())) {
                if (!s.contains(r[j])) {
                    s.add(r[j]);
                }
            }
            states.add(s);
        }
        int total = 0;
        int survived = 0;
        for (String[] r : rows.subList(1, rows.size())) {
            int n = Integer.parseInt(r[4]);
            total += n;
            if (r[3].equals("Yes")) {
                survived += n;
            }
        }
        // SOURCES.md: 2201 people, 711 survived
        assertEquals(2201, total);
        assertEquals(711, survived);
        List<String> entries = new ArrayList<>();
        for (String[] r : rows.subList(1, rows.size())) {
            int n = Integer.parseInt(r[4]);
            if (n == 0) {
                continue;
            }
            List<String> factors = new ArrayList<>();
            for (int j = 0; j < 4; j++) {
                double[] onehot = new double[states.get(j).size()];
                onehot[states.get(j).indexOf(r[j])] = 1;
                factors.add("{\"var\": \"" + names[j] + "\", \"categorical\": " + list(onehot) + "}");
            }
            entries.add("{\"weight\": " + num((double) n / total) + ", \"product\": [" + String.join(", ", factors)
                    + "]}");
        }
        List<String> vars = new ArrayList<>();
        for (int j = 0; j < 4; j++) {
            vars.add("{\"name\": \"" + names[j] + "\", \"type\": \"categorical\", \"states\": [\""
                    + String.join("\", \"", states.get(j)) + "\"]}");
        }
        String json = "{\"format\": \"circa.mixture\", \"version\": \"1.0\", \"name\": \"titanic-joint\", "
                + "\"variables\": [" + String.join(", ", vars) + "], \"model\": {\"mixture\": ["
                + String.join(", ", entries) + "]}}";
        MixtureDocument doc = read(json);
        CircuitDocument circuit = ConversionAssertions.convertVerified(doc, MixtureOptions.DEFAULT);
        int cells = rows.size() - 1;
        double[] data = new double[(cells + 1) * 4];
        for (int c = 0; c < cells; c++) {
            for (int j = 0; j < 4; j++) {
                data[c * 4 + j] = states.get(j).indexOf(rows.get(c + 1)[j]);
            }
        }
        data[cells * 4] = Double.NaN;
        data[cells * 4 + 1] = Double.NaN;
        data[cells * 4 + 2] = Double.NaN;
        data[cells * 4 + 3] = states.get(3).indexOf("Yes");
        double[] log = ConversionAssertions.circuitLogDensity(circuit, data, cells + 1);
        for (int c = 0; c < cells; c++) {
            double expected = Integer.parseInt(rows.get(c + 1)[4]) / 2201.0;
            assertEquals(expected, Math.exp(log[c]), 1e-12, "cell " + c);
        }
        assertEquals(711.0 / 2201.0, Math.exp(log[cells]), 1e-12, "P(Survived = Yes)");
    }
}
