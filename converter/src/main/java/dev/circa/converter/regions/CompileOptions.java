package dev.circa.converter.regions;

import dev.circa.format.Family;
import dev.circa.format.VariableType;
import java.util.EnumMap;
import java.util.Map;

/**
 * How a region graph is compiled (FORMAT.md section 3): K sums per inner region, I input bundles
 * per leaf region, C outputs at the root, and an input family per variable type.
 *
 * @param sums K >= 1 ({@code --sums}, default 4)
 * @param inputs I >= 1 ({@code --inputs}, default 4)
 * @param outputs C >= 1 ({@code --outputs}, default 1)
 * @param families the family for each variable type; a type not in the map gets its default
 *     (real normal, binary bernoulli, categorical categorical, count poisson)
 */
public record CompileOptions(int sums, int inputs, int outputs, Map<VariableType, Family> families) {
    /**
     * @throws IllegalArgumentException when a count is below 1, a family does not accept its type
     *     or is {@code mvnormal}
     */
    public CompileOptions {
        if (sums < 1 || inputs < 1 || outputs < 1) {
            throw new IllegalArgumentException("sums, inputs and outputs must each be at least 1, got " + sums + ", "
                    + inputs + ", " + outputs);
        }
        EnumMap<VariableType, Family> m = new EnumMap<>(VariableType.class);
        for (VariableType t : VariableType.values()) {
            m.put(t, defaultFamily(t));
        }
        if (families != null) {
            for (Map.Entry<VariableType, Family> e : families.entrySet()) {
                Family f = e.getValue();
                if (f == Family.MVNORMAL) {
                    throw new IllegalArgumentException("mvnormal is not a compile family (it spans several variables)");
                }
                if (!f.accepts(e.getKey())) {
                    throw new IllegalArgumentException("family " + f.jsonName() + " does not accept "
                            + e.getKey().jsonName() + " variables; it accepts " + typeNames(f));
                }
                m.put(e.getKey(), f);
            }
        }
        families = Map.copyOf(m);
    }

    /** K = 4, I = 4, C = 1, default families. */
    public static CompileOptions defaults() {
        return new CompileOptions(4, 4, 1, Map.of());
    }

    /** These options with {@code family} for variables of {@code type}. */
    public CompileOptions withFamily(VariableType type, Family family) {
        EnumMap<VariableType, Family> m = new EnumMap<>(families);
        m.put(type, family);
        return new CompileOptions(sums, inputs, outputs, m);
    }

    /**
     * These options with one {@code --family} setting applied, e.g. {@code real=lognormal}.
     *
     * @throws IllegalArgumentException naming what is wrong with {@code spec}
     */
    public CompileOptions withFamilyOption(String spec) {
        int eq = spec.indexOf('=');
        if (eq < 0) {
            throw new IllegalArgumentException("--family expects TYPE=FAMILY (e.g. real=lognormal), got \"" + spec + "\"");
        }
        VariableType t = VariableType.fromJsonName(spec.substring(0, eq).trim());
        if (t == null) {
            throw new IllegalArgumentException("unknown variable type \"" + spec.substring(0, eq).trim()
                    + "\" in --family; expected real, binary, categorical or count");
        }
        Family f = Family.fromJsonName(spec.substring(eq + 1).trim());
        if (f == null) {
            throw new IllegalArgumentException("unknown input family \"" + spec.substring(eq + 1).trim()
                    + "\" in --family; expected one of the compile families (see docs/circuit.md, input families): "
                    + java.util.Arrays.stream(Family.values()).filter(x -> x != Family.MVNORMAL).map(Family::jsonName)
                            .collect(java.util.stream.Collectors.joining(", ")));
        }
        return withFamily(t, f);
    }

    /** The family used for variables of {@code type}. */
    public Family family(VariableType type) {
        return families.get(type);
    }

    /** The default family of a type: real normal, binary bernoulli, categorical categorical, count poisson. */
    public static Family defaultFamily(VariableType type) {
        return switch (type) {
            case REAL -> Family.NORMAL;
            case BINARY -> Family.BERNOULLI;
            case CATEGORICAL -> Family.CATEGORICAL;
            case COUNT -> Family.POISSON;
        };
    }

    private static String typeNames(Family f) {
        StringBuilder sb = new StringBuilder();
        for (VariableType t : f.acceptedTypes()) {
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(t.jsonName());
        }
        return sb.toString();
    }
}
