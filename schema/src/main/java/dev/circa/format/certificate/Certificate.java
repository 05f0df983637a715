package dev.circa.format.certificate;

import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

/**
 * A certificate (docs/certificate.md): the circuit file it vouches for, what was required and proven,
 * and the evidence of the checks run, sealed by {@link #seal()}.
 *
 * @param version the document version, "1.0"
 * @param model the certified file
 * @param circa the version of circa that certified it
 * @param created when, as an ISO-8601 instant
 * @param requirement what had to be proven
 * @param atol absolute tolerance of the check cases and reference sets
 * @param rtol relative tolerance of the check cases and reference sets
 * @param properties the validator's verdict ("true", "false", "unknown") by property JSON name, sorted
 * @param exactQueries which queries are exact, by name (density, marginal, conditional, mpe, sampling), sorted
 * @param size the circuit's sizes
 * @param checks the embedded check cases run
 * @param references the reference sets run, in the order given
 * @param seal SHA-256 (hex) of the canonical form of every other member, or {@code null} before sealing
 */
public record Certificate(String version, CertifiedFile model, String circa, String created,
        CertifiedRequirement requirement, double atol, double rtol, Map<String, String> properties,
        Map<String, Boolean> exactQueries, CertifiedSize size, CheckEvidence checks,
        List<ReferenceEvidence> references, String seal) {
    /** The {@code format} value. */
    public static final String FORMAT = "circa.certificate";

    public Certificate {
        Objects.requireNonNull(version, "version");
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(circa, "circa");
        Objects.requireNonNull(created, "created");
        Objects.requireNonNull(requirement, "requirement");
        Objects.requireNonNull(size, "size");
        Objects.requireNonNull(checks, "checks");
        properties = java.util.Collections.unmodifiableMap(new TreeMap<>(properties));
        exactQueries = java.util.Collections.unmodifiableMap(new TreeMap<>(exactQueries));
        references = List.copyOf(references);
    }

    /** This certificate with {@code s} as its seal. */
    public Certificate withSeal(String s) {
        return new Certificate(version, model, circa, created, requirement, atol, rtol, properties, exactQueries,
                size, checks, references, s);
    }

    /**
     * The certified file.
     *
     * @param file its name (last path element) when certified
     * @param sha256 SHA-256 of its bytes as stored, lower-case hex
     * @param bytes its size in bytes as stored
     */
    public record CertifiedFile(String file, String sha256, long bytes) {
    }

    /**
     * The requirement the file was certified under.
     *
     * @param properties property JSON names that had to be proven true, in the order given
     * @param tolerance the bound on normalisation errors
     * @param maxEnumeration assignments enumerated per sum at most
     * @param embeddedChecks whether the embedded check cases had to pass
     */
    public record CertifiedRequirement(List<String> properties, double tolerance, int maxEnumeration,
            boolean embeddedChecks) {
        public CertifiedRequirement {
            properties = List.copyOf(properties);
        }
    }

    /**
     * Sizes of the certified circuit.
     *
     * @param variables variables
     * @param nodes nodes
     * @param edges child references
     * @param depth edges on the longest output-to-input path
     */
    public record CertifiedSize(int variables, int nodes, long edges, int depth) {
    }

    /**
     * The embedded check cases run.
     *
     * @param cases how many
     * @param maxAbsError the largest |computed - expected|
     * @param maxRelError the largest relative error
     */
    public record CheckEvidence(long cases, double maxAbsError, double maxRelError) {
    }

    /**
     * One reference set run.
     *
     * @param file its name as given
     * @param sha256 SHA-256 of its bytes as stored
     * @param rows the rows checked
     * @param maxAbsError the largest |computed - expected|
     * @param maxRelError the largest relative error
     */
    public record ReferenceEvidence(String file, String sha256, long rows, double maxAbsError, double maxRelError) {
    }
}
