/**
 * The evaluation engine's public API, for the validator, the converter, the CLI and teams that serve a
 * circuit from their own JVM code: compile a {@link dev.circa.format.CircuitDocument} into a
 * {@link dev.circa.engine.CompiledCircuit}, then evaluate it with an {@link dev.circa.engine.Evaluator}
 * or draw from it with a {@link dev.circa.engine.Sampler}.
 */
package dev.circa.engine;
