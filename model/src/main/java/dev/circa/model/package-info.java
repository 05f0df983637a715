/**
 * The public model API, for teams that serve a proven circuit from their own JVM code: load a circuit
 * file with a {@link dev.circa.model.ModelLoader} under named read limits and a
 * {@link dev.circa.model.Requirement}, then score rows by variable name on a shared, thread-safe
 * {@link dev.circa.model.Model}.
 */
package dev.circa.model;
