package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

class SmokeTest {
    @Test
    void validate_pumpStation_valid() throws Exception {
        ValidationReport r = new Validator(ValidationOptions.defaults()).validate(Path.of("../fixtures/circuits/pump-station.json"));
        System.out.println(ReportFormat.TEXT.render(List.of(r)));
        System.out.println(ReportFormat.JSON.render(List.of(r)));
        assertTrue(r.valid());
    }
}
