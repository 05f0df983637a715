package dev.circa.spark;

import dev.circa.format.io.FormatException;
import java.util.function.Supplier;

/**
 * Runs a Spark job and turns a failure caused by the input (a located {@link FormatException} or a
 * {@link DataValueException} thrown in a task) back into that exception, so that the user sees one
 * message in circa's words rather than Spark's task report.
 */
final class Jobs {
    private Jobs() {
    }

    static <T> T run(Supplier<T> job) throws FormatException {
        try {
            return job.get();
        } catch (Exception e) {
            // Exception, not RuntimeException: a failed job throws SparkException, a checked exception that
            // Scala code throws undeclared; rethrown as it came when no input problem caused it
            for (Throwable t = e; t != null; t = t.getCause()) {
                if (t instanceof FormatException f) {
                    throw f;
                }
                if (t instanceof DataValueException d) {
                    throw d;
                }
            }
            throw e;
        }
    }
}
