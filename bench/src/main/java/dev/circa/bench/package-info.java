/**
 * Benchmarks and scale measurements for circa developers (JMH, plus plain programs that report time
 * and memory at a million nodes, and the scale table of bench/run over region-graph circuits of 10^5 to
 * 10^7 edges). Not for application code; never run by the test suite.
 */
package dev.circa.bench;
