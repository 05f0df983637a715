package dev.circa.engine.family;

import dev.circa.format.Family;
import dev.circa.format.NodeTable;
import java.util.List;

/**
 * The one owner of each input family's parameter constraints (FORMAT.md's input table): which values
 * each parameter may take, in the order of {@link Family#parameters()}, and uniform's {@code low < high}.
 * The engine's compiler, the validator's parameter analysis, the mixture converter and the region-graph
 * parameter reader ask it; each words its own message. The JSON Schemas state the same limits (a test
 * compares them). Finiteness is checked before any of these; a categorical's log-probabilities and an
 * mvnormal's covariance (symmetric positive definite) are checked apart. Stateless.
 */
public final class ParameterLimits {
    private ParameterLimits() {
    }

    /** What one parameter may be. */
    public enum Limit {
        /** Any finite number. */
        ANY,
        /** A number > 0. */
        POSITIVE,
        /** A probability: 0 {@literal <=} x {@literal <=} 1. */
        PROBABILITY,
        /** A number >= 0 (each of a categorical's probabilities). */
        NON_NEGATIVE,
        /**
         * A whole number from 0 to 2^53 (binomial trials): the integers a double holds exactly, so a draw
         * of at most that many trials is a count every reader accepts ({@link Families#MAX_COUNT}).
         */
        COUNT,
        /** A state index: a whole number >= 0, below the variable's number of states. */
        STATE;

        /** Whether {@code x} is within this limit; {@code states} bounds a {@link #STATE} ({@code Integer.MAX_VALUE} when unknown). */
        public boolean holds(double x, int states) {
            return switch (this) {
                case ANY -> !Double.isNaN(x);
                case POSITIVE -> x > 0;
                case PROBABILITY -> x >= 0 && x <= 1;
                case NON_NEGATIVE -> x >= 0;
                case COUNT -> x >= 0 && x == Math.rint(x) && x <= Families.MAX_COUNT;
                case STATE -> x >= 0 && x == Math.rint(x) && x < states;
            };
        }
    }

    private static final List<Limit> ANY_ANY = List.of(Limit.ANY, Limit.ANY);
    private static final List<Limit> ANY_POSITIVE = List.of(Limit.ANY, Limit.POSITIVE);
    private static final List<Limit> POSITIVE = List.of(Limit.POSITIVE);
    private static final List<Limit> BOTH_POSITIVE = List.of(Limit.POSITIVE, Limit.POSITIVE);

    /** The limit of each parameter of {@code f}, in the order of {@link Family#parameters()}. */
    public static List<Limit> of(Family f) {
        return switch (f) {
            case BERNOULLI -> List.of(Limit.PROBABILITY);
            case CATEGORICAL -> List.of(Limit.NON_NEGATIVE);
            case INDICATOR -> List.of(Limit.STATE);
            case NORMAL, LOGNORMAL -> ANY_POSITIVE;
            case EXPONENTIAL, POISSON -> POSITIVE;
            case GAMMA, BETA -> BOTH_POSITIVE;
            case UNIFORM, MVNORMAL -> ANY_ANY;
            case BINOMIAL -> List.of(Limit.COUNT, Limit.PROBABILITY);
        };
    }

    /** The limit of the parameter of {@code f} named {@code name}. */
    public static Limit of(Family f, String name) {
        return of(f).get(f.parameters().indexOf(name));
    }

    /** Whether {@code f}'s parameters must be ordered: uniform's {@code low < high}. */
    public static boolean ordered(Family f) {
        return f == Family.UNIFORM;
    }

    /**
     * Whether one-variable input {@code i} of {@code t}, of a family other than categorical and mvnormal, has,
     * read from the table's columns, one number per parameter of its family, each finite and within its limit
     * ({@code states} bounds a {@link Limit#STATE}), in order: what {@link #holds} and a finiteness check say of
     * its parameters, without making a record of the node.
     */
    public static boolean holds(NodeTable t, int i, int states) {
        Family f = t.family(i);
        int a = t.valueStart(i);
        List<Limit> limits = of(f);
        if (f == Family.CATEGORICAL || f == Family.MVNORMAL || t.valueEnd(i) - a != limits.size()) {
            return false;
        }
        for (int k = 0; k < limits.size(); k++) {
            double x = t.value(a + k);
            if (!Double.isFinite(x) || !limits.get(k).holds(x, states)) {
                return false;
            }
        }
        return !ordered(f) || t.value(a) < t.value(a + 1);
    }

    /** Whether {@code p} (one value per parameter of {@code f}) keeps {@code f}'s order, if it has one. */
    public static boolean inOrder(Family f, double[] p) {
        return !ordered(f) || p[0] < p[1];
    }

    /**
     * Whether every value of {@code p} (laid out as {@link Family#parameters()}; one value per state for
     * a categorical in linear form) is within its limit and in order. Not for log-probabilities or mvnormal.
     */
    public static boolean holds(Family f, double[] p, int states) {
        List<Limit> limits = of(f);
        for (int k = 0; k < p.length; k++) {
            if (!limits.get(Math.min(k, limits.size() - 1)).holds(p[k], states)) {
                return false;
            }
        }
        return inOrder(f, p);
    }
}
