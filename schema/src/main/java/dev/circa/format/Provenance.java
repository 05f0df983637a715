package dev.circa.format;

/**
 * Where a document came from; every field optional ({@code null} when absent).
 *
 * @param producer the program and version that wrote it
 * @param created an ISO-8601 time
 * @param source free text
 */
public record Provenance(String producer, String created, String source) {
}
