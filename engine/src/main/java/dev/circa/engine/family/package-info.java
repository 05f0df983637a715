/**
 * Static per-family kernels (log-density, missing-value marginal, mode, sampling) and the special
 * functions behind them, used by the engine's evaluators and sampler; not for application code.
 */
package dev.circa.engine.family;
