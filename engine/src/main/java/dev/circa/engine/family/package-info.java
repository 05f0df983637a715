/**
 * Static per-family kernels (log-density, missing-value marginal, mode, sampling) and the special
 * functions behind them, used by the engine's evaluators and sampler; not for application code. Also
 * {@link dev.circa.engine.family.ParameterLimits}, the one owner of each family's parameter limits,
 * which the compiler, the validator and the converters ask.
 */
package dev.circa.engine.family;
