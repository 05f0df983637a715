package dev.circa.cli;

import dev.circa.format.certificate.Certificate;
import dev.circa.format.io.FormatException;
import dev.circa.model.CertificateCheck;
import dev.circa.model.Model;
import dev.circa.model.Requirement;
import dev.circa.validator.ValidationReport;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import picocli.CommandLine.Option;

/**
 * The options of every command that reads one circuit to use it: the read limits of {@link ReadOptions}
 * and {@code --certificate FILE}, with which the circuit's bytes are checked against the certificate
 * while they are read, instead of validating the circuit again; a mismatch is exit status 2 with its reason.
 */
public final class CircuitReadOptions extends ReadOptions {
    @Option(names = "--certificate", paramLabel = "FILE",
            description = "A certificate written by circa certify: check the file's bytes against it instead of validating again.")
    Path certificateFile;

    /** Whether a certificate was given. */
    boolean certified() {
        return certificateFile != null;
    }

    /** Loads {@code circuit} as every command does (smooth and decomposable required), through the certificate when given. */
    Model use(Path circuit) throws FormatException {
        return certificateFile == null ? load(circuit) : loadCertified(circuit, Requirement.DEFAULT);
    }

    /** Loads {@code circuit} through the certificate, which must prove {@code r}. */
    Model loadCertified(Path circuit, Requirement r) throws FormatException {
        Model m = loader().withRequirement(r).load(circuit, certificateFile);
        if (!m.normalized()) {
            err().println("circa: warning: " + circuit + " is certified but not normalized (log Z = "
                    + logPartitions(m) + "); densities are those of the unnormalised circuit");
        }
        return m;
    }

    /** The model's report with log Z of every output (a report rebuilt from a certificate carries none). */
    static ValidationReport reportWithLogZ(Model m) {
        ValidationReport c = m.report();
        return new ValidationReport(c.file(), c.valid(), c.properties(), logPartitions(m), c.variableTree(),
                c.exactQueries(), c.stats(), c.diagnostics());
    }

    private static Map<String, Double> logPartitions(Model m) {
        Map<String, Double> logZ = new LinkedHashMap<>();
        for (int o = 0; o < m.outputNames().size(); o++) {
            logZ.put(m.outputNames().get(o), m.logPartition(o));
        }
        return logZ;
    }

    /**
     * {@code validate --certificate}: checks the certificate's seal and the bytes of the one file
     * against it (and, when given, that it proves {@code required}) instead of validating again.
     */
    int verifyCertificate(List<Path> files, Requirement required) throws FormatException {
        if (files.size() != 1) {
            throw new UsageException("--certificate checks one file against its certificate; give exactly one FILE");
        }
        Certificate c = CertificateCheck.verify(files.get(0), certificateFile, limits(), required);
        List<String> proven = new ArrayList<>();
        c.properties().forEach((p, v) -> {
            if (v.equals("true")) {
                proven.add(p);
            }
        });
        out().println(files.get(0) + ": matches its certificate " + certificateFile + " (" + c.model().bytes()
                + " bytes, SHA-256 " + c.model().sha256() + "); certified by circa " + c.circa() + " at " + c.created()
                + ", proven: " + String.join(", ", proven) + "; not validated again");
        out().flush();
        return ExitStatus.OK;
    }
}
