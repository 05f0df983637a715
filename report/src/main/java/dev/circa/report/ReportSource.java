package dev.circa.report;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/**
 * The model a report is about.
 *
 * @param fileName the file as the reader should see it named
 * @param sha256 the SHA-256 of the file's bytes, in hexadecimal
 * @param document the document read from it
 * @param circuit the document compiled
 * @param validation the validator's report with its default options (what {@code circa validate} says)
 */
public record ReportSource(String fileName, String sha256, CircuitDocument document, CompiledCircuit circuit,
        ValidationReport validation) {

    /** The source for {@code file}, already read into {@code document} and compiled: hashes the file and validates. */
    public static ReportSource of(Path file, CircuitDocument document, CompiledCircuit circuit) throws IOException {
        ValidationReport report = new Validator(ValidationOptions.defaults()).validate(document);
        return new ReportSource(file.toString(), sha256(file), document, circuit, report);
    }

    /** The SHA-256 of the file's bytes (streamed), as 64 hexadecimal digits. */
    public static String sha256(Path file) throws IOException {
        MessageDigest md;
        try {
            md = MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
        byte[] buffer = new byte[1 << 16];
        try (InputStream in = Files.newInputStream(file)) {
            int n;
            while ((n = in.read(buffer)) > 0) {
                md.update(buffer, 0, n);
            }
        }
        return HexFormat.of().formatHex(md.digest());
    }
}
