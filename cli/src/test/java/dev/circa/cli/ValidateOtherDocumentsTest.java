package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A region graph or a mixture document given where a circuit is expected: status 2, and convert is named. */
class ValidateOtherDocumentsTest {
    private static final Path REGIONS = Path.of("..", "fixtures", "regions", "random-n6-d2-r2-seed7.json");
    private static final Path YAML_MIXTURE = Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml");

    @TempDir
    Path tmp;

    @Test
    void validate_regionGraph_status2_locatedAtFormat_namesConvert() {
        Cli.Result r = Cli.run("validate", REGIONS.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertEquals(1, r.messages(), r::toString);
        // "format" is on line 2, column 2 of the fixture
        assertTrue(r.message().startsWith("circa: " + REGIONS + ":2:"), r::toString);
        assertTrue(r.message().contains("a region graph (format \"circa.regions\"), not a circuit; circa convert"), r::toString);
    }

    @Test
    void validate_yamlMixture_status2_namesConvert() {
        Cli.Result r = Cli.run("validate", YAML_MIXTURE.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.message().contains("a mixture document (format \"circa.mixture\"), not a circuit; circa convert"), r::toString);
    }

    @Test
    void validate_jsonMixture_andEvalOfARegionGraph_namesConvert() throws Exception {
        Path m = tmp.resolve("mixture.json");
        Files.writeString(m, "{\"format\": \"circa.mixture\", \"version\": \"1.0\", \"variables\": []}");
        Cli.Result r = Cli.run("validate", "--format", "json", m.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertTrue(r.out().contains("circa convert"), r::toString);
        Cli.Result e = Cli.run("inspect", REGIONS.toString());
        assertEquals(ExitStatus.UNUSABLE, e.status(), e::toString);
        assertTrue(e.message().contains("not a circuit; circa convert"), e::toString);
        Cli.Result s = Cli.run("sample", YAML_MIXTURE.toString(), "-n", "1");
        assertEquals(ExitStatus.UNUSABLE, s.status(), s::toString);
        assertTrue(s.message().contains("a mixture document (format \"circa.mixture\"), not a circuit"), s::toString);
    }

    @Test
    void validate_yamlThatIsNotAMixture_keepsTheReadersMessage() throws Exception {
        Path y = tmp.resolve("notes.yaml");
        Files.writeString(y, "just: [some, notes]\n");
        Cli.Result r = Cli.run("validate", y.toString());
        assertEquals(ExitStatus.UNUSABLE, r.status(), r::toString);
        assertFalse(r.message().contains("circa convert"), r::toString);
    }
}
