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
 * {@code --certificate FILE}, shared by every command that reads one circuit: with it, the circuit's
 * bytes are checked against the certificate while they are read, instead of validating the circuit
 * again; a mismatch is exit status 2 with its reason.
 */
public final class CertificateOption {
    @Option(names = "--certificate", paramLabel = "FILE",
            description = "A certificate written by circa certify: check the file's bytes against it instead of validating again.")
    Path file;

    /** Whether a certificate was given. */
    boolean given() {
        return file != null;
    }

    /** Loads {@code circuit} as every command does (smooth and decomposable required), through the certificate when given. */
    Model load(ReadOptions read, Path circuit) throws FormatException {
        return file == null ? read.load(circuit) : certified(read, circuit, Requirement.DEFAULT);
    }

    /** Loads {@code circuit} through the certificate, which must prove {@code r}. */
    Model certified(ReadOptions read, Path circuit, Requirement r) throws FormatException {
        Model m = read.loader().withRequirement(r).load(circuit, file);
        if (!m.normalized()) {
            read.err().println("circa: warning: " + circuit + " is certified but not normalized (log Z = "
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
    int verify(List<Path> files, ReadOptions read, Requirement required) throws FormatException {
        if (files.size() != 1) {
            throw new UsageException("--certificate checks one file against its certificate; give exactly one FILE");
        }
        Certificate c = CertificateCheck.verify(files.get(0), file, read.limits(), required);
        List<String> proven = new ArrayList<>();
        c.properties().forEach((p, v) -> {
            if (v.equals("true")) {
                proven.add(p);
            }
        });
        read.out().println(files.get(0) + ": matches its certificate " + file + " (" + c.model().bytes()
                + " bytes, SHA-256 " + c.model().sha256() + "); certified by circa " + c.circa() + " at " + c.created()
                + ", proven: " + String.join(", ", proven) + "; not validated again");
        read.out().flush();
        return ExitStatus.OK;
    }
}
