/**
 * The JSON Schemas of the circa document formats, bundled on the classpath, and a validator over
 * them. Used by the validator and the CLI to report schema conformance of a document or of one node.
 */
package dev.circa.format.schema;
