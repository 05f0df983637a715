package dev.circa.converter.mixture;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.FormatException;
import dev.circa.format.mixture.MixtureDocument;
import java.util.Locale;
import java.util.function.Function;

/**
 * Converts a mixture document into a circuit (one output, {@code joint}) and proves the two equal.
 *
 * <p>Each expression becomes one node, children first, with ids 0..n-1: a mixture a sum, a product a
 * product, an input an input; a definition becomes one node shared by all its uses; a Gaussian
 * mixture a sum of one normal vector per component. A covariance that is block diagonal after a
 * permutation (found from its exact zeros) becomes a product of one {@code mvnormal} or
 * {@code normal} per block.
 *
 * <p>Authoring mistakes end the conversion with a located {@link FormatException} naming the model
 * path (exit status 2): a {@code use} cycle, a variable used twice in one product, mixture components
 * over different variables, weights not adding to 1 (unless {@link MixtureOptions#normalizeWeights()}),
 * bad parameters, a declared variable never modelled. Numeric disagreement between the circuit and the
 * source is not an exception: it is a {@link VerificationResult} that has not {@linkplain
 * VerificationResult#passed() passed} (exit status 1).
 *
 * <p>Stateless; safe to call from any thread.
 */
public final class MixtureConverter {
    /** The producer circa's converters write in the provenance of the circuits they make. */
    public static final String PRODUCER = CircuitEmitter.PRODUCER;

    private MixtureConverter() {
    }

    /**
     * A conversion.
     *
     * @param circuit the circuit
     * @param verification its comparison with the source
     * @param definitions how many definitions became (shared) nodes
     * @param splitCovariances how many covariances were split into independent blocks
     */
    public record Result(CircuitDocument circuit, VerificationResult verification, int definitions,
            int splitCovariances) {
        /** Sizes and the verification verdict, for people. */
        public String summary() {
            return String.format(Locale.ROOT, "converted %s: %d variables, %d nodes, %d edges; %d definition%s "
                    + "(one node each), %d covariance%s split into independent blocks%n%s",
                    circuit.name() == null ? "the mixture" : circuit.name(), circuit.variables().size(),
                    circuit.nodes().size(), circuit.edgeCount(), definitions, definitions == 1 ? "" : "s",
                    splitCovariances, splitCovariances == 1 ? "" : "s", verification.summary());
        }
    }

    /**
     * The circuit of {@code doc}, without verification.
     *
     * @throws FormatException on an authoring mistake, located in the document
     */
    public static CircuitDocument toCircuit(MixtureDocument doc, MixtureOptions options) throws FormatException {
        return CircuitEmitter.emit(CheckedModel.of(doc, options.normalizeWeights()));
    }

    /**
     * Converts {@code doc} and compares the circuit's log-density (by the engine) with the source's (by
     * {@link MixtureDensity}) at {@link MixtureOptions#verifyPoints()} points sampled from the source
     * by {@link MixtureSampler}, and at the same points with random variables missing.
     *
     * @throws FormatException on an authoring mistake, located in the document
     */
    public static Result convert(MixtureDocument doc, MixtureOptions options) throws FormatException {
        return convert(doc, options, EngineDensity::of);
    }

    static Result convert(MixtureDocument doc, MixtureOptions options,
            Function<CircuitDocument, CircuitLogDensity> evaluator) throws FormatException {
        CheckedModel model = CheckedModel.of(doc, options.normalizeWeights());
        CircuitDocument circuit = CircuitEmitter.emit(model);
        VerificationResult v = options.verifyPoints() == 0
                ? Verifier.verify(model, null, 0, options.atol(), options.rtol(), options.seed())
                : Verifier.verify(model, evaluator.apply(circuit), options.verifyPoints(), options.atol(),
                        options.rtol(), options.seed());
        return new Result(circuit, v, CircuitEmitter.definitionCount(model), CircuitEmitter.splitCount(model));
    }
}
