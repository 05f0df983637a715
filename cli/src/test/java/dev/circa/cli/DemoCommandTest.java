package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoCommandTest {
    @TempDir
    Path tmp;

    @Test
    void demo_freshFolder_everyStepAsExpectedAndFilesWritten() throws Exception {
        Path dir = tmp.resolve("demo");
        Cli.Result r = Cli.run("demo", dir.toString());
        assertEquals(0, r.status(), r.out() + r.err());
        for (String f : new String[] {"regimes.circuit.json", "stations.circuit.json", "broken-export.circuit.json",
            "regimes.dot", "station-reference.csv", "stations.report.html"}) {
            assertTrue(Files.isRegularFile(dir.resolve(f)), f);
            assertTrue(r.out().contains(dir.resolve(f).toString()), "says where it wrote " + f);
        }
        // the NumPy/SciPy reference set (fixtures/npz/SOURCE.md) passes; the broken export is caught by both rules
        assertTrue(r.out().contains("PASSED: 6 cases, 0 failures"), r.out());
        assertTrue(r.out().contains("[ProductScopesOverlap]"), r.out());
        assertTrue(r.out().contains("[WeightsNotNormalized]"), r.out());
        String report = Files.readString(dir.resolve("stations.report.html"));
        assertTrue(report.startsWith("<!DOCTYPE html>") && report.contains("<h3>station-reference.csv: passed</h3>")
                && report.contains("data-pair=\"inlet_pressure:motor_current\""), "the report with its check and pair");
        // the demo names the regimes as the README does, and says where the DOT file is for dot
        String readme = Files.readString(Path.of("..", "README.md"));
        java.util.regex.Matcher regimes = java.util.regex.Pattern.compile("three regimes \\(([^)]*)\\)").matcher(readme);
        assertTrue(regimes.find(), "the README names the regimes");
        assertTrue(r.out().replaceAll("\\s+", " ").contains("three regimes (" + regimes.group(1).replaceAll("\\s+", " ") + ")"), r.out());
        for (String label : java.util.List.of("normal-operation", "cavitation", "blocked-outlet")) {
            // the labels of fixtures/mixtures/pump-station-regimes.yaml, as the README spells them
            assertTrue(Files.readString(Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml")).contains("label: " + label));
            assertTrue(regimes.group(1).replaceAll("\\s+", " ").contains(label.replace('-', ' ')), label);
        }
        assertTrue(r.out().contains("dot -Tsvg " + dir.resolve("regimes.dot") + " -o " + dir.resolve("regimes.svg")), r.out());
        assertEquals(0, Cli.run("validate", dir.resolve("regimes.circuit.json").toString()).status());
        assertEquals(1, Cli.run("validate", dir.resolve("broken-export.circuit.json").toString()).status());
    }
}
