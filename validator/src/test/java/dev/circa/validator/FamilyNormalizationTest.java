package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.List;
import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * The validator's claim that every valid input is a normalised distribution (log Z = 0 in one pass)
 * checked against an outside integral of the engine's density: commons-math3 3.6.1's
 * IterativeLegendreGaussIntegrator for real families, a plain sum over the support for discrete ones.
 */
class FamilyNormalizationTest {
    private static final double TOL = 1e-8;
    private static final IterativeLegendreGaussIntegrator GAUSS = new IterativeLegendreGaussIntegrator(32, 1e-13, 1e-13);

    private static CircuitDocument one(Variable v, Family f, double... params) {
        return CircuitDocument.builder().variables(List.of(v))
                .nodes(List.of(new InputNode(0, null, f, new int[] {0}, params, false)))
                .outputs(List.of(new Output("joint", 0))).build();
    }

    /** The validator's log Z, after checking it calls the input valid and normalised. */
    private static double validatorLogZ(CircuitDocument doc) {
        ValidationReport r = new Validator(ValidationOptions.defaults()).validate(doc);
        assertEquals(true, r.valid(), r.diagnostics().toString());
        assertEquals(Verdict.TRUE, r.property(Property.NORMALIZED));
        return r.logPartition().get("joint");
    }

    private static UnivariateFunction density(CircuitDocument doc) throws Exception {
        Evaluator ev = new Evaluator(CompiledCircuit.compile(doc));
        double[] row = new double[1];
        double[] out = new double[1];
        return x -> {
            row[0] = x;
            ev.logDensity(row, 1, out);
            return Math.exp(out[0]);
        };
    }

    private static void integral(CircuitDocument doc, double a, double b) throws Exception {
        double z = validatorLogZ(doc);
        // commons-math3 IterativeLegendreGaussIntegrator over [a, b]; the tails outside hold < 1e-12
        double mass = GAUSS.integrate(10_000_000, density(doc), a, b);
        assertEquals(Math.exp(z), mass, TOL, doc.nodes().get(0).toString());
    }

    private static void sum(CircuitDocument doc, int last) throws Exception {
        double z = validatorLogZ(doc);
        UnivariateFunction f = density(doc);
        double mass = 0;
        for (int k = 0; k <= last; k++) {
            mass += f.value(k);
        }
        // plain sum over the (finite, or truncated with tail < 1e-15) support
        assertEquals(Math.exp(z), mass, TOL);
    }

    private static final Variable REAL = Variable.of("inlet_pressure", VariableType.REAL);
    private static final Variable BINARY = Variable.of("alarm", VariableType.BINARY);
    private static final Variable COUNT = Variable.of("restarts", VariableType.COUNT);
    private static final Variable VALVE = new Variable("valve", VariableType.CATEGORICAL, List.of("closed", "half", "open"), null, null);

    @Test
    void normal_integral_one() throws Exception {
        integral(one(REAL, Family.NORMAL, 3.1, 0.2), 3.1 - 12 * 0.2, 3.1 + 12 * 0.2);
    }

    @Test
    void lognormal_integral_one() throws Exception {
        // upper bound: commons-math3 LogNormalDistribution quantile at 1 - 1e-13
        double hi = new LogNormalDistribution(0.3, 0.5).inverseCumulativeProbability(1 - 1e-13);
        integral(one(REAL, Family.LOGNORMAL, 0.3, 0.5), 0, hi);
    }

    @Test
    void exponential_integral_one() throws Exception {
        integral(one(REAL, Family.EXPONENTIAL, 1.7), 0, 40 / 1.7);
    }

    @Test
    void gamma_integral_one() throws Exception {
        // rate 1.5 is scale 1/1.5 in commons-math3's parameterisation
        double hi = new GammaDistribution(2.5, 1 / 1.5).inverseCumulativeProbability(1 - 1e-13);
        integral(one(REAL, Family.GAMMA, 2.5, 1.5), 0, hi);
    }

    @Test
    void beta_integral_one() throws Exception {
        integral(one(REAL, Family.BETA, 2.0, 3.5), 0, 1);
    }

    @Test
    void uniform_integral_one() throws Exception {
        integral(one(REAL, Family.UNIFORM, 2.0, 4.5), 2.0, 4.5);
    }

    @Test
    void bernoulli_sum_one() throws Exception {
        sum(one(BINARY, Family.BERNOULLI, 0.3), 1);
    }

    @Test
    void categorical_sum_one() throws Exception {
        sum(one(VALVE, Family.CATEGORICAL, 0.05, 0.15, 0.8), 2);
    }

    @Test
    void indicator_sum_one() throws Exception {
        sum(one(VALVE, Family.INDICATOR, 2), 2);
    }

    @Test
    void poisson_sum_one() throws Exception {
        // P(X > 100) for rate 3.5 is far below 1e-15
        sum(one(COUNT, Family.POISSON, 3.5), 100);
    }

    @Test
    void binomial_sum_one() throws Exception {
        sum(one(COUNT, Family.BINOMIAL, 12, 0.35), 12);
    }

    @Test
    void mvnormal_integral_one() throws Exception {
        Variable a = Variable.of("inlet_pressure", VariableType.REAL);
        Variable b = Variable.of("outlet_pressure", VariableType.REAL);
        double[] p = {3.1, 5.0, 0.04, 0.01, 0.01, 0.09};
        CircuitDocument doc = CircuitDocument.builder().variables(List.of(a, b))
                .nodes(List.of(new InputNode(0, null, Family.MVNORMAL, new int[] {0, 1}, p, false)))
                .outputs(List.of(new Output("joint", 0))).build();
        double z = validatorLogZ(doc);
        Evaluator ev = new Evaluator(CompiledCircuit.compile(doc));
        double[] row = new double[2];
        double[] out = new double[1];
        IterativeLegendreGaussIntegrator inner = new IterativeLegendreGaussIntegrator(32, 1e-12, 1e-12);
        // nested commons-math3 Legendre-Gauss integrals over +/- 10 sd in each coordinate
        UnivariateFunction outer = x -> inner.integrate(10_000_000, y -> {
            row[0] = x;
            row[1] = y;
            ev.logDensity(row, 1, out);
            return Math.exp(out[0]);
        }, 5.0 - 3.0, 5.0 + 3.0);
        double mass = GAUSS.integrate(10_000_000, outer, 3.1 - 2.0, 3.1 + 2.0);
        assertEquals(Math.exp(z), mass, 1e-7);
    }
}
