/**
 * Certificate documents ({@code "format": "circa.certificate"}, docs/certificate.md): what circa
 * proved about one circuit file, bound to the file's bytes by their SHA-256 and sealed by a digest of
 * the certificate's own canonical form. The model, its strict reader and its canonical writer.
 */
package dev.circa.format.certificate;
