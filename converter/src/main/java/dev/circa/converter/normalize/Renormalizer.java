package dev.circa.converter.normalize;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.NodeTable;
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
        return normalize(doc, c, null);
    }

    /**
     * The same, given {@code report}, the validator's report of {@code doc} (for example the one it was
     * loaded with): when it proves the circuit smooth and decomposable, the structure is not validated
     * again; {@code null} or a report that does not prove both validates it here.
     */
    public static NormalizationResult normalize(CircuitDocument doc, CompiledCircuit c, ValidationReport report)
            throws NotNormalizableException {
        if (report == null || report.property(Property.SMOOTH) != Verdict.TRUE
                || report.property(Property.DECOMPOSABLE) != Verdict.TRUE) {
            requireSmoothDecomposable(doc);
        }
        NodeTable t = doc.nodeTable();
        double[] logZ = logPartitions(t, c);
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        int n = c.nodeCount();
        boolean[] changed = new boolean[n];
        double[] total = new double[n];
        for (int i = 0; i < n; i++) {
            if (t.kind(i) == NodeTable.INPUT && t.family(i) == Family.CATEGORICAL && logZ[i] != 0 && !t.logForm(i)) {
                for (int k = t.valueStart(i); k < t.valueEnd(i); k++) {
                    total[i] += t.value(k);
                }
            }
        }
        NodeTable rescaled = t.withNumbers((i, j, w) -> {
            byte kind = t.kind(i);
            double v = w;
            if (kind == NodeTable.SUM) {
                double shift = logZ[ci[cs[i] + j]] - logZ[i];
                v = t.logForm(i) ? w + shift : w == 0 ? 0 : Math.exp(Math.log(w) + shift);
                changed[i] |= v != w;
            } else if (kind == NodeTable.INPUT && t.family(i) == Family.CATEGORICAL && logZ[i] != 0) {
                v = t.logForm(i) ? w - logZ[i] : w / total[i];
                changed[i] = true;
            }
            return v;
        });
        int sumsChanged = 0;
        int inputsChanged = 0;
        for (int i = 0; i < n; i++) {
            if (changed[i]) {
                if (t.kind(i) == NodeTable.SUM) {
                    sumsChanged++;
                } else {
                    inputsChanged++;
                }
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
                .variables(doc.variables()).nodeTable(rescaled).outputs(doc.outputs())
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

    /**
     * Z_j of every node in log space, children first, read from the columns of {@code t}: an input's log mass
     * (0 within {@link #ROUNDING}), a product's the sum of its children's, a sum's the log-sum-exp of log-weight
     * plus child log Z. Throws on a negative weight or probability and on a sum of mass 0 or infinite mass.
     */
    private static double[] logPartitions(NodeTable t, CompiledCircuit c) throws NotNormalizableException {
        int n = c.nodeCount();
        double[] logZ = new double[n];
        int[] cs = c.childStart();
        int[] ci = c.childIndex();
        double[] lw = c.logWeight();
        for (int i = 0; i < n; i++) {
            byte kind = t.kind(i);
            if (kind == NodeTable.INPUT) {
                double m = inputLogMass(t, i);
                logZ[i] = Math.abs(m) <= ROUNDING ? 0 : m;
            } else if (kind == NodeTable.PRODUCT) {
                double s = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    s += logZ[ci[k]];
                }
                logZ[i] = s;
            } else {
                if (!t.logForm(i)) {
                    for (int k = t.valueStart(i); k < t.valueEnd(i); k++) {
                        if (!(t.value(k) >= 0)) {
                            throw new NotNormalizableException("sum node " + t.id(i) + " has weight " + t.value(k)
                                    + " for child " + t.childId(t.childStart(i) + k - t.valueStart(i))
                                    + "; renormalisation needs non-negative weights");
                        }
                    }
                }
                double m = Double.NEGATIVE_INFINITY;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    m = Math.max(m, lw[k] + logZ[ci[k]]);
                }
                if (m == Double.NEGATIVE_INFINITY) {
                    throw new NotNormalizableException("sum node " + t.id(i)
                            + " has total mass 0 (every weight or every child's mass is 0); it cannot be normalised");
                }
                if (m == Double.POSITIVE_INFINITY) {
                    throw new NotNormalizableException("sum node " + t.id(i) + " has infinite mass; it cannot be normalised");
                }
                double s = 0;
                for (int k = cs[i]; k < cs[i + 1]; k++) {
                    s += Math.exp(lw[k] + logZ[ci[k]] - m);
                }
                logZ[i] = m + Math.log(s);
            }
        }
        return logZ;
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

    /** log of the total mass of input {@code i}: 0 for a normalised family, log(sum of probabilities) for a categorical. */
    private static double inputLogMass(NodeTable t, int i) throws NotNormalizableException {
        if (t.family(i) != Family.CATEGORICAL) {
            return 0;
        }
        int a = t.valueStart(i);
        int b = t.valueEnd(i);
        if (t.logForm(i)) {
            double m = Double.NEGATIVE_INFINITY;
            for (int k = a; k < b; k++) {
                m = Math.max(m, t.value(k));
            }
            if (m == Double.NEGATIVE_INFINITY) {
                throw new NotNormalizableException("categorical input " + t.id(i) + " has total mass 0");
            }
            double s = 0;
            for (int k = a; k < b; k++) {
                s += Math.exp(t.value(k) - m);
            }
            return m + Math.log(s);
        }
        double s = 0;
        for (int k = a; k < b; k++) {
            double q = t.value(k);
            if (!(q >= 0)) {
                throw new NotNormalizableException("categorical input " + t.id(i) + " has probability " + q
                        + "; renormalisation needs non-negative probabilities");
            }
            s += q;
        }
        if (s == 0) {
            throw new NotNormalizableException("categorical input " + t.id(i) + " has total mass 0");
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
