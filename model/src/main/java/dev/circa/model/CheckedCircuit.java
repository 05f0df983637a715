package dev.circa.model;

import dev.circa.format.CircuitDocument;
import dev.circa.validator.ValidationReport;

/**
 * A circuit read and validated under a loader's {@link Requirement}, whatever the verdict: what a tool
 * that describes a circuit needs ({@link ModelLoader#check(java.nio.file.Path)}); a {@link Model} is
 * made only of a circuit that passed.
 *
 * @param source the name of the file or stream, as given
 * @param document the document as read
 * @param report the validator's report under the requirement
 */
public record CheckedCircuit(String source, CircuitDocument document, ValidationReport report) {
    /**
     * Whether the circuit is fit to serve under the requirement: no error diagnostic.
     *
     * @return true when a model can be made of it
     */
    public boolean fit() {
        return report.valid();
    }
}
