package dev.circa.cli;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.model.Model;
import dev.circa.model.Requirement;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.LinkedHashMap;
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
    LoadedCircuit load(Path circuit, ReadLimits limits, PrintWriter err) throws FormatException {
        return file == null ? LoadedCircuit.load(circuit, limits, err) : load(circuit, limits, Requirement.DEFAULT, err);
    }

    /**
     * {@code validate --certificate}: checks the certificate's seal and the bytes of the one file
     * against it (and, when given, that it proves {@code required}) instead of validating again.
     */
    int verify(java.util.List<Path> files, ReadLimits limits, Requirement required, PrintWriter out) throws FormatException {
        if (files.size() != 1) {
            throw new UsageException("--certificate checks one file against its certificate; give exactly one FILE");
        }
        dev.circa.format.certificate.Certificate c = dev.circa.model.CertificateCheck.verify(files.get(0), file, limits, required);
        java.util.List<String> proven = new java.util.ArrayList<>();
        c.properties().forEach((p, v) -> {
            if (v.equals("true")) {
                proven.add(p);
            }
        });
        out.println(files.get(0) + ": matches its certificate " + file + " (" + c.model().bytes() + " bytes, SHA-256 "
                + c.model().sha256() + "); certified by circa " + c.circa() + " at " + c.created() + ", proven: "
                + String.join(", ", proven) + "; not validated again");
        out.flush();
        return ExitStatus.OK;
    }

    /** Loads {@code circuit} through the certificate, which must prove {@code r}. */
    LoadedCircuit load(Path circuit, ReadLimits limits, Requirement r, PrintWriter err) throws FormatException {
        Model m = Model.loader().withLimits(limits).withRequirement(r).load(circuit, file);
        ValidationReport c = m.report();
        Map<String, Double> logZ = new LinkedHashMap<>();
        for (int o = 0; o < m.outputNames().size(); o++) {
            logZ.put(m.outputNames().get(o), m.logPartition(o));
        }
        if (c.property(Property.NORMALIZED) != Verdict.TRUE) {
            err.println("circa: warning: " + circuit + " is certified but not normalized (log Z = " + logZ
                    + "); densities are those of the unnormalised circuit");
        }
        ValidationReport report = new ValidationReport(c.file(), c.valid(), c.properties(), logZ, c.variableTree(),
                c.exactQueries(), c.stats(), c.diagnostics());
        return new LoadedCircuit(circuit, m.document(), m.circuit(), report);
    }
}
