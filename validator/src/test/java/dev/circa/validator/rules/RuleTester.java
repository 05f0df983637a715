package dev.circa.validator.rules;

import static org.junit.jupiter.api.Assertions.fail;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.util.ArrayList;
import java.util.List;

/**
 * Runs the validator on a tiny inline model and compares its diagnostics with the expected ones,
 * keyed by pointer and code (with severity); any missing or unexpected diagnostic fails the test.
 */
final class RuleTester {
    private final String json;
    private CircuitDocument built;
    private ValidationOptions options = ValidationOptions.defaults();
    private SchemaCheck schema = SchemaCheck.NONE;
    private final List<String> expected = new ArrayList<>();
    private ValidationReport report;

    private RuleTester(String json) {
        this.json = json;
    }

    /** A document built in code (for values JSON cannot hold). */
    static RuleTester built(CircuitDocument doc) {
        RuleTester t = new RuleTester(null);
        t.built = doc;
        return t;
    }

    /** A whole document. */
    static RuleTester document(String json) {
        return new RuleTester(json);
    }

    /** A circuit document with the given variables, nodes and outputs (JSON array bodies). */
    static RuleTester circuit(String variables, String nodes, String outputs) {
        return new RuleTester("{\"format\": \"circa.circuit\", \"version\": \"1.0\",\n\"variables\": [" + variables
                + "],\n\"nodes\": [\n" + nodes + "\n],\n\"outputs\": [" + outputs + "]}");
    }

    RuleTester options(ValidationOptions o) {
        this.options = o;
        return this;
    }

    RuleTester schema(SchemaCheck s) {
        this.schema = s;
        return this;
    }

    /** Expects a diagnostic {@code code} of severity {@code s} at {@code pointer}. */
    RuleTester expect(String pointer, String code, Severity s) {
        expected.add(key(pointer, code, s));
        return this;
    }

    /** Expects an error {@code code} at {@code pointer}. */
    RuleTester expect(String pointer, String code) {
        return expect(pointer, code, Severity.ERROR);
    }

    private static String key(String pointer, String code, Severity s) {
        return code + " " + s.jsonName() + " at " + (pointer.isEmpty() ? "(root)" : pointer);
    }

    /** Validates and compares; returns the report for further assertions. */
    ValidationReport check() {
        CircuitDocument doc = built;
        if (doc == null) {
            try {
                doc = new CircuitReader().readString(json, "test.json");
            } catch (FormatException e) {
                throw new AssertionError("test model does not read: " + e.getMessage(), e);
            }
        }
        Validator v = new Validator(options, schema);
        try {
            report = schema == SchemaCheck.NONE || json == null ? v.validate(doc) : v.validate(json, "test.json");
        } catch (FormatException e) {
            throw new AssertionError(e.getMessage(), e);
        }
        List<String> missing = new ArrayList<>(expected);
        List<String> unexpected = new ArrayList<>();
        for (Diagnostic d : report.diagnostics()) {
            String k = key(d.pointer(), d.code(), d.severity());
            if (!missing.remove(k)) {
                unexpected.add(d.severity().jsonName() + " " + d.render());
            }
        }
        if (!missing.isEmpty() || !unexpected.isEmpty()) {
            fail("missing: " + missing + "\nunexpected:\n  " + String.join("\n  ", unexpected));
        }
        return report;
    }
}
