package dev.circa.format;

import java.util.EnumSet;
import java.util.List;
import java.util.Set;

/**
 * The input families of FORMAT.md section 2, with their parameter names and the variable types
 * they accept. Scalar families store their parameters in {@link InputNode#params()} in the order
 * of {@link #parameters()}; {@code categorical} stores its probabilities (or log-probabilities),
 * {@code mvnormal} its mean followed by its covariance in row-major order.
 */
public enum Family {
    BERNOULLI("bernoulli", List.of("p"), EnumSet.of(VariableType.BINARY)),
    CATEGORICAL("categorical", List.of("probs"), EnumSet.of(VariableType.CATEGORICAL, VariableType.BINARY)),
    INDICATOR("indicator", List.of("value"), EnumSet.of(VariableType.BINARY, VariableType.CATEGORICAL)),
    NORMAL("normal", List.of("mean", "sd"), EnumSet.of(VariableType.REAL)),
    LOGNORMAL("lognormal", List.of("mu", "sigma"), EnumSet.of(VariableType.REAL)),
    EXPONENTIAL("exponential", List.of("rate"), EnumSet.of(VariableType.REAL)),
    GAMMA("gamma", List.of("shape", "rate"), EnumSet.of(VariableType.REAL)),
    BETA("beta", List.of("alpha", "beta"), EnumSet.of(VariableType.REAL)),
    UNIFORM("uniform", List.of("low", "high"), EnumSet.of(VariableType.REAL)),
    POISSON("poisson", List.of("rate"), EnumSet.of(VariableType.COUNT)),
    BINOMIAL("binomial", List.of("trials", "p"), EnumSet.of(VariableType.COUNT)),
    MVNORMAL("mvnormal", List.of("mean", "cov"), EnumSet.of(VariableType.REAL));

    private final String jsonName;
    private final List<String> parameters;
    private final Set<VariableType> types;

    Family(String jsonName, List<String> parameters, Set<VariableType> types) {
        this.jsonName = jsonName;
        this.parameters = parameters;
        this.types = types;
    }

    /** The name used in documents, e.g. {@code "normal"}. */
    public String jsonName() {
        return jsonName;
    }

    /** Parameter names as they appear in documents (the log form of categorical is {@code logProbs}). */
    public List<String> parameters() {
        return parameters;
    }

    /** Whether this family may be used for a variable of {@code type}. */
    public boolean accepts(VariableType type) {
        return types.contains(type);
    }

    /** The variable types this family accepts. */
    public Set<VariableType> acceptedTypes() {
        return EnumSet.copyOf(types);
    }

    /** Whether every parameter is a single number (all but categorical and mvnormal). */
    public boolean isScalar() {
        return this != CATEGORICAL && this != MVNORMAL;
    }

    /** Whether values are discrete (masses rather than densities). */
    public boolean isDiscrete() {
        return switch (this) {
            case BERNOULLI, CATEGORICAL, INDICATOR, POISSON, BINOMIAL -> true;
            default -> false;
        };
    }

    /** The family named {@code name} in a document, or {@code null}. */
    public static Family fromJsonName(String name) {
        for (Family f : values()) {
            if (f.jsonName.equals(name)) {
                return f;
            }
        }
        return null;
    }
}
