/**
 * Scoring and regression checks on Apache Spark with the single-machine engine's numbers: the
 * {@link dev.circa.spark.CircuitScorer} and {@link dev.circa.spark.DistributedCheck} APIs for
 * applications, and the {@code circa-spark} command line ({@link dev.circa.spark.CircaSpark}).
 */
package dev.circa.spark;
