/**
 * Benchmarks and scale measurements for circa developers (JMH, plus plain programs that report time
 * and memory at a million nodes). Not for application code; never run by the test suite.
 */
package dev.circa.bench;
