/**
 * The compiled circuit's flat arrays, the compiler that builds them and the evaluation kernels that trust
 * them, used by the engine's public classes; not for application code.
 */
package dev.circa.engine.internal;
