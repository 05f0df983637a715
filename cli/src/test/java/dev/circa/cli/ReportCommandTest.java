package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ReportCommandTest {
    @TempDir
    Path dir;

    @Test
    void report_exampleWithPair_writesTheWholePage() throws Exception {
        Path out = dir.resolve("report.html");
        Cli.Result r = Cli.run("report", Cli.EXAMPLE.toString(), "--pairs", "inlet_pressure:valve", "-o",
                out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        assertTrue(r.err().contains("circa report: wrote " + out + " (valid model, 2 marginals, 1 pair"), r::describe);
        String page = Files.readString(out);
        assertTrue(page.startsWith("<!DOCTYPE html>") && page.endsWith("</html>\n"));
        for (String id : new String[] {"summary", "verdict", "checks", "marginals", "pairs", "structure"}) {
            assertTrue(page.contains("<section id=\"" + id + "\">"), id);
        }
        // the file's two embedded checks, both passing
        assertTrue(page.contains("<h3>embedded checks: passed</h3>"), "embedded checks reported");
        assertTrue(page.contains("<dt>cases</dt><dd>2</dd>"));
    }

    @Test
    void report_unknownPairVariable_status2AndNoFile() {
        Path out = dir.resolve("report.html");
        Cli.Result r = Cli.run("report", Cli.EXAMPLE.toString(), "--pairs", "inlet_pressure:flow", "-o",
                out.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains("no variable \"flow\"; expected one of inlet_pressure, valve"), r::describe);
        assertFalse(Files.exists(out));
    }

    @Test
    void report_unreadableReference_status2AndNoFile() throws Exception {
        Path out = dir.resolve("report.html");
        Path ref = dir.resolve("ref.csv");
        Files.writeString(ref, "inlet_pressure,valve,log_density\n3.0,open,x\n");
        Cli.Result r = Cli.run("report", Cli.EXAMPLE.toString(), "--reference", ref.toString(), "-o",
                out.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains(ref.toString()), r::describe);
        assertFalse(Files.exists(out));
    }

    @Test
    void report_outputNamesTheModel_refused() throws Exception {
        Path model = dir.resolve("model.json");
        Files.copy(Cli.EXAMPLE, model);
        byte[] before = Files.readAllBytes(model);
        Cli.Result r = Cli.run("report", model.toString(), "-o", model.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(java.util.Arrays.equals(before, Files.readAllBytes(model)), "the input is untouched");
    }

    @Test
    void report_productOverSharedVariable_status2() throws Exception {
        Path model = dir.resolve("overlap.json");
        Files.writeString(model, Files.readString(Cli.EXAMPLE).replace("{\"id\": 5, \"product\": [3, 4]}",
                "{\"id\": 5, \"product\": [3, 4, 0]}"));
        Path out = dir.resolve("report.html");
        Cli.Result r = Cli.run("report", model.toString(), "-o", out.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::describe);
        assertTrue(r.err().contains("ProductScopesOverlap"), r::describe);
        assertFalse(Files.exists(out));
    }

    @Test
    void report_withCertificate_verdictSaysTheBytesMatch_andAChangedFileIsRefused() throws Exception {
        Path model = dir.resolve("model.json");
        Files.copy(Cli.EXAMPLE, model);
        Path cert = dir.resolve("model.cert.json");
        assertEquals(ExitStatus.OK, Cli.run("certify", model.toString(), "-o", cert.toString()).status());
        Path out = dir.resolve("report.html");
        Cli.Result r = Cli.run("report", model.toString(), "--certificate", cert.toString(), "-o", out.toString());
        assertEquals(ExitStatus.OK, r.status(), r::describe);
        String page = Files.readString(out);
        assertTrue(page.contains("bytes match the certificate " + cert), "certificate state shown");

        // one more byte of white space at the end: still valid JSON, but no longer the certified file
        Files.writeString(model, Files.readString(model) + " ");
        Path out2 = dir.resolve("report2.html");
        Cli.Result changed = Cli.run("report", model.toString(), "--certificate", cert.toString(), "-o", out2.toString());
        assertEquals(ExitStatus.UNUSABLE, changed.status(), changed::describe);
        assertFalse(Files.exists(out2));
    }
}
