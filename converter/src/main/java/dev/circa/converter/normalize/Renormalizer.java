package dev.circa.converter.normalize;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

/**
 * Exact renormalisation of a smooth, decomposable circuit with non-negative weights. With Z_j the
 * value of node j with every variable missing (computed bottom-up in log space: an input's total
 * mass, a product's the product of its children's, a sum's the weighted sum), every weight w_ij
 * becomes w_ij Z_j / Z_i and every categorical input whose probabilities do not add to 1 is divided
 * by their sum (one within {@link #ROUNDING} of 1 is left as written). Each node then computes
 * its old value divided by its Z, so every sum is locally normalised and every output is its
 * normalised distribution. Weights keep the form of the document
 * ({@code weights} or {@code logWeights}); a log-weight is rescaled by adding, exactly in log space.
 */
public final class Renormalizer {
    /**
     * A categorical whose log mass is within this of 0 is taken as normalised and left as written:
     * the rounding of a sum of a few dozen probabilities (64 ulps of 1).
     */
    public static final double ROUNDING = 64 * Math.ulp(1.0);

    /** The validator's structure checks only: embedded checks are not evaluated here. */
    private static final ValidationOptions STRUCTURE = ValidationOptions.defaults()
            .withRequire(Set.of(Property.SMOOTH, Property.DECOMPOSABLE)).withRule("CheckCaseFailed:off");

    private Renormalizer() {
    }

    /** Compiles and renormalises {@code doc}. */
    public static NormalizationResult normalize(CircuitDocument doc) throws CompileException, NotNormalizableException {
        return normalize(doc, CompiledCircuit.compile(doc));
    }

    /**
     * Renormalises {@code doc}, compiled as {@code c}.
     *
     * @throws NotNormalizableException when the circuit is not smooth or not decomposable (naming
     *     the node and a variable), has a negative weight or probability, or a sum of total mass 0
     */
    public static NormalizationResult normalize(CircuitDocument doc, CompiledCircuit c) throws NotNormalizableException {
        requireSmoothDecomposable(doc);
        int n = c.nodeCount();
        List<Node> nodes = doc.nodes();
        double[] logZ = new double[n];
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        double[] lw = c.logWeight();
        for (int i = 0; i < n; i++) {
            Node node = nodes.get(i);
            if (node instanceof InputNode in) {
                double m = inputLogMass(in);
                logZ[i] = Math.abs(m) <= ROUNDING ? 0 : m;
            } else if (node instanceof ProductNode) {
                double s = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    s += logZ[ci[k]];
                }
                logZ[i] = s;
            } else {
                SumNode sum = (SumNode) node;
                if (!sum.logWeights()) {
                    for (int j = 0; j < sum.weights().length; j++) {
                        if (!(sum.weights()[j] >= 0)) {
                            throw new NotNormalizableException("sum node " + sum.id() + " has weight " + sum.weights()[j]
                                    + " for child " + sum.children()[j] + "; renormalisation needs non-negative weights");
                        }
                    }
                }
                double m = Double.NEGATIVE_INFINITY;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    m = Math.max(m, lw[k] + logZ[ci[k]]);
                }
                if (m == Double.NEGATIVE_INFINITY) {
                    throw new NotNormalizableException("sum node " + sum.id()
                            + " has total mass 0 (every weight or every child's mass is 0); it cannot be normalised");
                }
                if (m == Double.POSITIVE_INFINITY) {
                    throw new NotNormalizableException("sum node " + sum.id() + " has infinite mass; it cannot be normalised");
                }
                double s = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    s += Math.exp(lw[k] + logZ[ci[k]] - m);
                }
                logZ[i] = m + Math.log(s);
            }
        }
        List<Node> out = new ArrayList<>(n);
        int sumsChanged = 0;
        int inputsChanged = 0;
        for (int i = 0; i < n; i++) {
            Node node = nodes.get(i);
            if (node instanceof InputNode in && in.family() == Family.CATEGORICAL && logZ[i] != 0) {
                double[] p = in.params().clone();
                double total = 0;
                for (double q : p) {
                    total += q;
                }
                for (int k = 0; k < p.length; k++) {
                    p[k] = in.logForm() ? p[k] - logZ[i] : p[k] / total;
                }
                out.add(new InputNode(in.id(), in.label(), in.family(), in.vars(), p, in.logForm()));
                inputsChanged++;
            } else if (node instanceof SumNode sum) {
                double[] w = new double[sum.weights().length];
                boolean changed = false;
                for (int j = 0; j < w.length; j++) {
                    double shift = logZ[ci[cs[i] + j]] - logZ[i];
                    if (sum.logWeights()) {
                        w[j] = sum.weights()[j] + shift;
                    } else {
                        w[j] = sum.weights()[j] == 0 ? 0 : Math.exp(Math.log(sum.weights()[j]) + shift);
                    }
                    changed |= w[j] != sum.weights()[j];
                }
                out.add(new SumNode(sum.id(), sum.label(), sum.children(), w, sum.logWeights()));
                if (changed) {
                    sumsChanged++;
                }
            } else {
                out.add(node);
            }
        }
        double[] before = new double[c.outputCount()];
        List<String> names = new ArrayList<>();
        for (int o = 0; o < c.outputCount(); o++) {
            before[o] = logZ[c.outputNode(o)];
            names.add(c.outputName(o));
        }
        CircuitDocument result = CircuitDocument.builder()
                .version(doc.version()).name(doc.name()).description(doc.description()).provenance(provenanceAfter(doc.provenance(), names, before))
                .variables(doc.variables()).nodes(out).outputs(doc.outputs())
                .checks(shiftedChecks(doc.checks(), c, before)).extensions(doc.extensions())
                .build();
        double[] after;
        try {
            after = new Evaluator(CompiledCircuit.compile(result)).logPartition();
        } catch (CompileException e) {
            throw new IllegalStateException("a renormalised circuit failed to compile: " + e.getMessage(), e);
        }
        return new NormalizationResult(result, names, before, after, sumsChanged, inputsChanged);
    }

    private static Checks shiftedChecks(Checks checks, CompiledCircuit c, double[] logZ) {
        if (checks == null) {
            return null;
        }
        List<CheckCase> cases = new ArrayList<>(checks.cases().size());
        for (CheckCase k : checks.cases()) {
            int o = k.output() == null ? 0 : c.outputIndex(k.output());
            double shift = o >= 0 ? logZ[o] : 0;
            double ld = k.logDensity() == Double.NEGATIVE_INFINITY ? k.logDensity() : k.logDensity() - shift;
            cases.add(new CheckCase(k.output(), k.values(), ld));
        }
        return new Checks(checks.atol(), checks.rtol(), cases);
    }

    /** log of the total mass of an input: 0 for a normalised family, log(sum of probabilities) for a categorical. */
    private static double inputLogMass(InputNode in) throws NotNormalizableException {
        if (in.family() != Family.CATEGORICAL) {
            return 0;
        }
        double[] p = in.params();
        if (in.logForm()) {
            double m = Double.NEGATIVE_INFINITY;
            for (double q : p) {
                m = Math.max(m, q);
            }
            if (m == Double.NEGATIVE_INFINITY) {
                throw new NotNormalizableException("categorical input " + in.id() + " has total mass 0");
            }
            double s = 0;
            for (double q : p) {
                s += Math.exp(q - m);
            }
            return m + Math.log(s);
        }
        double s = 0;
        for (double q : p) {
            if (!(q >= 0)) {
                throw new NotNormalizableException("categorical input " + in.id() + " has probability " + q
                        + "; renormalisation needs non-negative probabilities");
            }
            s += q;
        }
        if (s == 0) {
            throw new NotNormalizableException("categorical input " + in.id() + " has total mass 0");
        }
        return Math.log(s);
    }

    /**
     * Throws when the validator finds a product whose children share a variable or a sum whose
     * children differ in scope, naming the node and the variable.
     */
    static void requireSmoothDecomposable(CircuitDocument doc) throws NotNormalizableException {
        ValidationReport report = new Validator(STRUCTURE).validate(doc);
        if (report.property(Property.SMOOTH) == Verdict.TRUE && report.property(Property.DECOMPOSABLE) == Verdict.TRUE) {
            return;
        }
        for (Diagnostic d : report.diagnostics()) {
            String what = d.code().equals("ProductScopesOverlap") ? "not decomposable at product node "
                    : d.code().equals("SumScopesDiffer") ? "not smooth at sum node " : null;
            if (what != null) {
                throw new NotNormalizableException("the circuit is " + what + d.node() + ": " + d.message()
                        + "; renormalisation needs a smooth, decomposable circuit");
            }
        }
        throw new NotNormalizableException("the circuit is not proven smooth and decomposable; renormalisation needs "
                + "a smooth, decomposable circuit (run circa validate for the diagnostics)");
    }

    /** The provenance of the renormalised document: circa wrote it, saying from what and by how much. */
    private static dev.circa.format.Provenance provenanceAfter(dev.circa.format.Provenance was, List<String> outputs, double[] logZ) {
        StringBuilder sb = new StringBuilder("renormalised by circa normalize (log Z before:");
        for (int o = 0; o < outputs.size(); o++) {
            sb.append(o == 0 ? " " : ", ").append(outputs.get(o)).append(' ').append(logZ[o]);
        }
        sb.append(')');
        if (was != null && (was.producer() != null || was.source() != null)) {
            sb.append("; before:");
            if (was.producer() != null) {
                sb.append(" written by ").append(was.producer());
            }
            if (was.source() != null) {
                sb.append(was.producer() != null ? "," : "").append(" from ").append(was.source());
            }
        }
        // no time: the same input gives the same bytes, as for convert
        return new dev.circa.format.Provenance(dev.circa.converter.mixture.MixtureConverter.PRODUCER, null, sb.toString());
    }
}
