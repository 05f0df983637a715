package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** circa certify, --certificate on the commands that read one circuit, and validate --certificate. */
class CertifyCommandTest {
    @TempDir
    Path dir;

    private Path model() throws Exception {
        Path p = dir.resolve("pump-station.json");
        Files.copy(Cli.EXAMPLE, p);
        return p;
    }

    private Path certify(Path model) {
        Path cert = dir.resolve(model.getFileName() + ".cert.json");
        Cli.Result r = Cli.run("certify", model.toString(), "-o", cert.toString());
        assertEquals(0, r.status(), r::describe);
        assertTrue(Files.exists(cert));
        return cert;
    }

    /** Source: GNU coreutils sha256sum, run on the same file, outside the JVM. */
    private static String sha256sum(Path p) throws Exception {
        Process proc = new ProcessBuilder("sha256sum", p.toString()).redirectErrorStream(true).start();
        String out;
        try (InputStream in = proc.getInputStream()) {
            out = new String(in.readAllBytes(), StandardCharsets.US_ASCII);
        }
        assertTrue(proc.waitFor(30, TimeUnit.SECONDS));
        assertEquals(0, proc.exitValue(), out);
        return out.substring(0, 64);
    }

    @Test
    void certify_writesCertificate_digestIsSha256sums() throws Exception {
        Path model = model();
        Path cert = certify(model);
        String text = Files.readString(cert);
        assertTrue(text.contains("\"sha256\":\"" + sha256sum(model) + "\""), text);
        assertTrue(text.contains("\"bytes\":" + Files.size(model)), text);
        assertTrue(text.startsWith("{\n\"format\":\"circa.certificate\""), text);
    }

    @Test
    void certify_referenceSets_hashedAndCounted() throws Exception {
        Path model = model();
        Path ref = dir.resolve("ref.csv");
        // FORMAT.md section 5 (SciPy 1.10): log p(inlet_pressure = 3.0, valve = open) of the example circuit.
        Files.writeString(ref, "inlet_pressure,valve,log_density\n3.0,open,0.18261296103078395\n");
        Path cert = dir.resolve("c.json");
        Cli.Result r = Cli.run("certify", model.toString(), "--reference", ref.toString(), "--require",
                "smooth,decomposable,normalized", "-o", cert.toString());
        assertEquals(0, r.status(), r::describe);
        String text = Files.readString(cert);
        assertTrue(text.contains("\"sha256\":\"" + sha256sum(ref) + "\",\"rows\":1"), text);
        assertTrue(text.contains("\"properties\":[\"smooth\",\"decomposable\",\"normalized\"]"), text);
    }

    @Test
    void certify_failingReferenceSet_status1_nothingWritten() throws Exception {
        Path ref = dir.resolve("ref.csv");
        Files.writeString(ref, "inlet_pressure,valve,log_density\n3.0,open,0.2\n");
        Path cert = dir.resolve("c.json");
        Cli.Result r = Cli.run("certify", model().toString(), "--reference", ref.toString(), "-o", cert.toString());
        assertEquals(1, r.status(), r::describe);
        assertTrue(r.err().contains("1 of 1 row beyond tolerance"), r::describe);
        assertFalse(Files.exists(cert));
    }

    @Test
    void certify_requiredPropertyNotProven_status1_nothingWritten() throws Exception {
        Path cert = dir.resolve("c.json");
        Cli.Result r = Cli.run("certify", model().toString(), "--require", "deterministic", "-o", cert.toString());
        assertEquals(1, r.status(), r::describe);
        assertFalse(Files.exists(cert));
    }

    @Test
    void certify_unreadableInput_status2_nothingWritten() throws Exception {
        Path bad = dir.resolve("bad.json");
        Files.writeString(bad, "{\"format\": \"circa.circuit\", ");
        Path cert = dir.resolve("c.json");
        Cli.assertUnusable(Cli.run("certify", bad.toString(), "-o", cert.toString()), "bad.json", "");
        assertFalse(Files.exists(cert));
        Cli.assertUnusable(Cli.run("certify", model().toString(), "--reference", dir.resolve("none.csv").toString(),
                "-o", cert.toString()), "none.csv", "");
        assertFalse(Files.exists(cert));
    }

    @Test
    void everyCommandThatReadsOneCircuit_withCertificate_sameOutputAsWithout() throws Exception {
        Path model = model();
        Path cert = certify(model);
        Path data = dir.resolve("data.csv");
        Files.writeString(data, "inlet_pressure,valve\n3.0,open\n2.1,\n,closed\n");
        List<String[]> runs = List.of(
                new String[] {"eval", model.toString(), "--data", data.toString()},
                new String[] {"impute", model.toString(), "--data", data.toString()},
                new String[] {"sample", model.toString(), "-n", "5", "--seed", "3"},
                new String[] {"inspect", model.toString()},
                new String[] {"check", model.toString()},
                new String[] {"normalize", model.toString(), "-o", "-"},
                new String[] {"render", model.toString()});
        for (String[] args : runs) {
            Cli.Result plain = Cli.run(args);
            List<String> with = new ArrayList<>(Arrays.asList(args));
            with.addAll(List.of("--certificate", cert.toString()));
            Cli.Result certified = Cli.run(with.toArray(String[]::new));
            assertEquals(0, plain.status(), plain::describe);
            assertEquals(0, certified.status(), certified::describe);
            if (!args[0].equals("inspect")) {
                assertEquals(plain.out(), certified.out(), args[0]);
            }
        }
    }

    @Test
    void validate_withCertificate_intact_status0() throws Exception {
        Path model = model();
        Path cert = certify(model);
        Cli.Result r = Cli.run("validate", model.toString(), "--certificate", cert.toString());
        assertEquals(0, r.status(), r::describe);
        assertTrue(r.out().contains("matches its certificate"), r.out());
    }

    @Test
    void oneChangedByteInAWeight_refusedWithReason_evalAndValidate() throws Exception {
        Path model = model();
        Path cert = certify(model);
        Files.writeString(model, Files.readString(model).replace("[0.85, 0.15]", "[0.86, 0.15]"));
        Cli.assertUnusable(Cli.run("eval", model.toString(), "--data", Cli.READINGS.toString(), "--certificate",
                cert.toString()), "pump-station.json", "changed after certification");
        Cli.assertUnusable(Cli.run("validate", model.toString(), "--certificate", cert.toString()),
                "pump-station.json", "changed after certification");
    }

    @Test
    void truncatedFile_refusedWithReason() throws Exception {
        Path model = model();
        Path cert = certify(model);
        byte[] b = Files.readAllBytes(model);
        Files.write(model, Arrays.copyOf(b, b.length - 40));
        Cli.assertUnusable(Cli.run("inspect", model.toString(), "--certificate", cert.toString()),
                "pump-station.json", "truncated");
        Cli.assertUnusable(Cli.run("validate", model.toString(), "--certificate", cert.toString()),
                "pump-station.json", "truncated");
    }

    @Test
    void certificateOfAnotherModel_refusedWithReason() throws Exception {
        Path model = model();
        Path other = dir.resolve("regimes.json");
        Files.copy(Path.of("..", "fixtures", "mixtures", "pump-station-regimes.circuit.json"), other);
        Path otherCert = certify(other);
        Cli.assertUnusable(Cli.run("sample", model.toString(), "-n", "3", "--certificate", otherCert.toString()),
                "pump-station.json", "another file, regimes.json");
        Cli.assertUnusable(Cli.run("validate", model.toString(), "--certificate", otherCert.toString()),
                "pump-station.json", "another file");
    }

    @Test
    void editedCertificate_refusedWithReason() throws Exception {
        Path model = model();
        Path cert = certify(model);
        String text = Files.readString(cert);
        Files.writeString(cert, text.replace("\"deterministic\":\"false\"", "\"deterministic\":\"true\""));
        Cli.assertUnusable(Cli.run("check", model.toString(), "--certificate", cert.toString()),
                "cert.json", "was edited");
        Cli.assertUnusable(Cli.run("validate", model.toString(), "--certificate", cert.toString()),
                "cert.json", "was edited");
    }
}
