/**
 * The engine's own reproducible random generator and the variates drawn from it, used by the sampler so
 * that a seed gives the same draws on any machine; not for application code.
 */
package dev.circa.engine.random;
