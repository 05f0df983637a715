package dev.circa.converter.normalize;

import dev.circa.format.CircuitDocument;
import java.util.List;

/**
 * A renormalised circuit and what changed.
 *
 * @param document the new document: same variables, node ids, order and outputs; rescaled weights;
 *     embedded check values shifted by -log Z of their output
 * @param outputs the output names, in order
 * @param logPartitionBefore log Z of each output before
 * @param logPartitionAfter log Z of each output after (0 up to rounding)
 * @param sumsChanged sums whose weights changed
 * @param inputsChanged categorical inputs whose probabilities were rescaled
 */
public record NormalizationResult(CircuitDocument document, List<String> outputs, double[] logPartitionBefore,
                                  double[] logPartitionAfter, int sumsChanged, int inputsChanged) {
    public NormalizationResult {
        outputs = List.copyOf(outputs);
        logPartitionBefore = logPartitionBefore.clone();
        logPartitionAfter = logPartitionAfter.clone();
    }
}
