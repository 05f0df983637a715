package dev.circa.format.mixture;

import dev.circa.format.Counts;
import dev.circa.format.Family;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Turns the located parameter blocks of inputs and Gaussian mixtures into the resolved records:
 * variable names to indices, state labels to indices, parameters to the circuit layout. Only the
 * reader uses it.
 */
final class InputResolver {
    /** Looks up a variable name (a located string) and fails with a located message. */
    interface VariableLookup {
        int index(Located name) throws FormatException;
    }

    private InputResolver() {
    }

    static InputExpr input(VariableLookup lookup, List<Variable> variables, Family family, Located var, Located vars,
            Located params, String label, String path, SourceLocation location, String file) throws FormatException {
        String fp = path + "." + family.jsonName();
        int[] ix;
        if (family == Family.MVNORMAL) {
            if (var != null) {
                throw error(file, var, "mvnormal takes \"vars\" (a list of at least 2 real variables), not \"var\"");
            }
            if (vars == null) {
                throw new FormatException(file, location.line(), location.column(), path,
                        "an mvnormal input needs \"vars\": a list of at least 2 real variables");
            }
            ix = variableList(lookup, vars, file, 2);
        } else {
            if (vars != null) {
                throw error(file, vars, family.jsonName() + " takes \"var\" (one variable), not \"vars\"");
            }
            if (var == null) {
                throw new FormatException(file, location.line(), location.column(), path,
                        "a " + family.jsonName() + " input needs \"var\": the name of its variable");
            }
            ix = new int[] {lookup.index(var)};
        }
        for (int k = 0; k < ix.length; k++) {
            Variable v = variables.get(ix[k]);
            if (!family.accepts(v.type())) {
                Located where = var != null ? var : vars.list().get(k);
                throw error(file, where, family.jsonName() + " needs a variable of type " + types(family)
                        + "; \"" + v.name() + "\" is " + typeName(v.type()));
            }
        }
        double[] p;
        switch (family) {
            case CATEGORICAL -> p = categorical(variables.get(ix[0]), params, file);
            case INDICATOR -> p = indicator(variables.get(ix[0]), params, file);
            case MVNORMAL -> p = mvnormal(ix.length, params, file);
            default -> p = scalar(family, params, file);
        }
        return new InputExpr(family, ix, p, label, path, location,
                new SourceLocation(params.location().pointer(), params.location().line(), params.location().column()));
    }

    static GaussianMixtureExpr gaussianMixture(VariableLookup lookup, List<Variable> variables, Located body,
            String label, String path, SourceLocation location, String file) throws FormatException {
        Map<String, Located> m = body.map();
        for (String k : m.keySet()) {
            if (!List.of("vars", "weights", "means", "covariances", "variances").contains(k)) {
                throw error(file, m.get(k), "unknown property \"" + k
                        + "\" in a gaussian-mixture; expected vars, weights, means and covariances or variances");
            }
        }
        for (String k : List.of("vars", "weights", "means")) {
            if (!m.containsKey(k)) {
                throw error(file, body, "a gaussian-mixture needs \"" + k + "\"");
            }
        }
        Located cov = m.get("covariances");
        Located var = m.get("variances");
        if ((cov == null) == (var == null)) {
            throw error(file, body, cov == null
                    ? "a gaussian-mixture needs \"covariances\" or \"variances\""
                    : "a gaussian-mixture has both \"covariances\" and \"variances\"; expected one of them");
        }
        int[] ix = variableList(lookup, m.get("vars"), file, 1);
        for (int k = 0; k < ix.length; k++) {
            Variable v = variables.get(ix[k]);
            if (v.type() != VariableType.REAL) {
                throw error(file, m.get("vars").list().get(k), "a gaussian-mixture needs real variables; \""
                        + v.name() + "\" is " + typeName(v.type()));
            }
        }
        int d = ix.length;
        double[] weights = numbers(m.get("weights"), file, -1, "a list of component weights");
        int n = weights.length;
        if (n == 0) {
            throw error(file, m.get("weights"), "a gaussian-mixture needs at least one component weight");
        }
        Located shapes = cov != null ? cov : var;
        Located meanList = m.get("means");
        if (meanList.isList() && shapes.isList() && meanList.list().size() == shapes.list().size()
                && meanList.list().size() != n) {
            // means and covariances agree on the components: the weights are the odd one out
            throw error(file, m.get("weights"), "expected " + meanList.list().size() + " component weights (one per mean and "
                    + (cov != null ? "covariance" : "variance vector") + "), found " + describeSize(m.get("weights")));
        }
        double[][] means = matrix(meanList, file, n, d, "means");
        if (!shapes.isList() || shapes.list().size() != n) {
            throw error(file, shapes, "expected a list of " + n + " " + (cov != null ? "covariance matrices"
                    : "variance vectors") + " (one per weight), found " + describeSize(shapes));
        }
        double[][] covs = new double[n][];
        SourceLocation[] locs = new SourceLocation[n];
        for (int c = 0; c < n; c++) {
            Located one = shapes.list().get(c);
            locs[c] = one.location();
            if (cov != null) {
                double[][] rows = matrix(one, file, d, d, "covariance rows");
                covs[c] = new double[d * d];
                for (int i = 0; i < d; i++) {
                    System.arraycopy(rows[i], 0, covs[c], i * d, d);
                }
            } else {
                double[] v = numbers(one, file, d, "a list of " + d + " variances");
                covs[c] = new double[d * d];
                for (int i = 0; i < d; i++) {
                    covs[c][i * d + i] = v[i];
                }
            }
        }
        return new GaussianMixtureExpr(ix, weights, means, covs, var != null, label, path, location, locs);
    }

    private static int[] variableList(VariableLookup lookup, Located vars, String file, int min) throws FormatException {
        if (!vars.isList()) {
            throw error(file, vars, "expected a list of variable names, found " + vars.describe());
        }
        List<Located> l = vars.list();
        if (l.size() < min) {
            throw error(file, vars, "expected at least " + min + " variable" + (min == 1 ? "" : "s") + ", found "
                    + l.size());
        }
        int[] ix = new int[l.size()];
        Set<Integer> seen = new HashSet<>();
        for (int k = 0; k < ix.length; k++) {
            ix[k] = lookup.index(l.get(k));
            if (!seen.add(ix[k])) {
                throw error(file, l.get(k), "variable \"" + l.get(k).value() + "\" is listed twice; expected "
                        + "distinct variables");
            }
        }
        return ix;
    }

    private static double[] categorical(Variable v, Located params, String file) throws FormatException {
        int k = v.stateCount();
        Located list = params;
        if (list.isList()) {
            return numbers(list, file, k, "a list of " + k + " probabilities (one per state of " + v.name() + ")");
        }
        if (!list.isMap()) {
            throw error(file, params, "categorical expects probabilities by state label or as a list, found "
                    + params.describe());
        }
        double[] p = new double[k];
        boolean[] given = new boolean[k];
        for (Map.Entry<String, Located> e : list.map().entrySet()) {
            int s = state(v, e.getKey());
            if (s < 0) {
                throw error(file, e.getValue(), "unknown state \"" + e.getKey() + "\" of " + v.name()
                        + "; expected one of " + String.join(", ", labels(v)));
            }
            p[s] = number(e.getValue(), file);
            given[s] = true;
        }
        List<String> missing = new ArrayList<>();
        for (int s = 0; s < k; s++) {
            if (!given[s]) {
                missing.add(labels(v).get(s));
            }
        }
        if (!missing.isEmpty()) {
            throw error(file, params, "categorical over " + v.name() + " gives no probability for "
                    + String.join(", ", missing) + "; expected one for every state (0 is allowed)");
        }
        return p;
    }

    private static double[] indicator(Variable v, Located params, String file) throws FormatException {
        if (!params.isMap() || params.map().size() != 1 || !params.map().containsKey("value")) {
            throw error(file, params, "indicator expects {value: STATE_INDEX}, found " + params.describe());
        }
        Located value = params.map().get("value");
        double d = number(value, file);
        if (d != Math.rint(d) || d < 0 || d >= v.stateCount()) {
            throw error(file, value, "state index " + format(d) + " is not a state of " + v.name()
                    + "; expected an integer from 0 to " + (v.stateCount() - 1));
        }
        return new double[] {d};
    }

    private static double[] mvnormal(int d, Located params, String file) throws FormatException {
        if (!params.isMap()) {
            throw error(file, params, "mvnormal expects {mean: [...], cov: [[...], ...]}, found " + params.describe());
        }
        Map<String, Located> m = params.map();
        for (String k : m.keySet()) {
            if (!k.equals("mean") && !k.equals("cov")) {
                throw error(file, m.get(k), "unknown parameter \"" + k + "\" of mvnormal; expected mean and cov");
            }
        }
        if (!m.containsKey("mean") || !m.containsKey("cov")) {
            throw error(file, params, "mvnormal needs \"mean\" and \"cov\"");
        }
        double[] mean = numbers(m.get("mean"), file, d, "a list of " + d + " means (one per variable)");
        double[][] cov = matrix(m.get("cov"), file, d, d, "covariance rows");
        double[] p = new double[d + d * d];
        System.arraycopy(mean, 0, p, 0, d);
        for (int i = 0; i < d; i++) {
            System.arraycopy(cov[i], 0, p, d + i * d, d);
        }
        return p;
    }

    private static double[] scalar(Family family, Located params, String file) throws FormatException {
        List<String> names = family.parameters();
        if (!params.isMap()) {
            throw error(file, params, family.jsonName() + " expects {" + String.join(", ", names) + "}, found "
                    + params.describe());
        }
        Map<String, Located> m = params.map();
        for (String k : m.keySet()) {
            if (!names.contains(k)) {
                throw error(file, m.get(k), "unknown parameter \"" + k + "\" of " + family.jsonName() + "; expected "
                        + String.join(" and ", names));
            }
        }
        double[] p = new double[names.size()];
        for (int i = 0; i < p.length; i++) {
            Located v = m.get(names.get(i));
            if (v == null) {
                throw error(file, params, family.jsonName() + " needs \"" + names.get(i) + "\"");
            }
            p[i] = number(v, file);
        }
        return p;
    }

    private static int state(Variable v, String label) {
        if (v.states().isEmpty() && v.type() == VariableType.BINARY) {
            return label.equals("0") ? 0 : label.equals("1") ? 1 : -1;
        }
        return v.stateIndex(label);
    }

    private static List<String> labels(Variable v) {
        return v.states().isEmpty() ? List.of("0", "1") : v.states();
    }

    private static double number(Located v, String file) throws FormatException {
        if (!v.isNumber()) {
            throw error(file, v, "expected a number, found " + v.describe());
        }
        return (Double) v.value();
    }

    private static double[] numbers(Located v, String file, int length, String what) throws FormatException {
        if (!v.isList() || (length >= 0 && v.list().size() != length)) {
            throw error(file, v, "expected " + what + ", found " + describeSize(v));
        }
        double[] out = new double[v.list().size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = number(v.list().get(i), file);
        }
        return out;
    }

    private static double[][] matrix(Located v, String file, int rows, int cols, String what) throws FormatException {
        if (!v.isList() || v.list().size() != rows) {
            throw error(file, v, "expected a list of " + rows + " " + what + " of " + Counts.of(cols, "number") + " each, found "
                    + describeSize(v));
        }
        double[][] out = new double[rows][];
        for (int i = 0; i < rows; i++) {
            out[i] = numbers(v.list().get(i), file, cols, "a list of " + Counts.of(cols, "number"));
        }
        return out;
    }

    private static String describeSize(Located v) {
        return v.isList() ? "a list of " + v.list().size() : v.describe();
    }

    private static String types(Family f) {
        List<String> t = new ArrayList<>();
        for (VariableType type : VariableType.values()) {
            if (f.accepts(type)) {
                t.add(typeName(type));
            }
        }
        return String.join(" or ", t);
    }

    private static String typeName(VariableType t) {
        return t.name().toLowerCase(Locale.ROOT);
    }

    private static String format(double d) {
        return d == Math.rint(d) && Math.abs(d) < 1e15 ? Long.toString((long) d) : String.format(Locale.ROOT, "%s", d);
    }

    private static FormatException error(String file, Located where, String problem) {
        return new FormatException(file, where.location().line(), where.location().column(), where.path(), problem);
    }
}
