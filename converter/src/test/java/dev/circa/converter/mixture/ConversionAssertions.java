package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.validator.Property;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;

/** What every conversion test asserts about a converted circuit. */
final class ConversionAssertions {
    private ConversionAssertions() {
    }

    /** Converts with verification, requires it to pass and the circuit to be valid; returns the circuit. */
    static CircuitDocument convertVerified(MixtureDocument doc, MixtureOptions options) throws Exception {
        MixtureConverter.Result r = MixtureConverter.convert(doc, options);
        assertTrue(r.verification().passed(), r.summary());
        assertEquals(2 * options.verifyPoints(), r.verification().points());
        assertValid(r.circuit());
        return r.circuit();
    }

    /** The engine's log-density of the circuit's output at {@code rows} rows. */
    static double[] circuitLogDensity(CircuitDocument circuit, double[] data, int rows) throws Exception {
        double[] out = new double[rows];
        new Evaluator(CompiledCircuit.compile(circuit)).logDensity(data, rows, out);
        return out;
    }

    /**
     * The circuit, written and read back, is the same circuit (bit for bit), with nothing unknown in
     * it; the engine compiles it; and the validator, schema included, finds it valid with its default
     * requirements (smooth, decomposable, normalized) and without warnings.
     */
    static void assertValid(CircuitDocument circuit) throws Exception {
        ByteArrayOutputStream first = new ByteArrayOutputStream();
        new CircuitWriter().write(circuit, first);
        byte[] bytes = first.toByteArray();
        CircuitDocument back = new CircuitReader().read(new ByteArrayInputStream(bytes), "converted.json");
        ByteArrayOutputStream second = new ByteArrayOutputStream();
        new CircuitWriter().write(back, second);
        assertEquals(first.toString(StandardCharsets.UTF_8), second.toString(StandardCharsets.UTF_8));
        assertTrue(back.findings().isEmpty(), () -> back.findings().toString());
        CompiledCircuit.compile(back);
        ValidationReport report = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED)
                .validate(first.toString(StandardCharsets.UTF_8), "converted.json");
        assertTrue(report.valid(), () -> report.diagnostics().toString());
        assertEquals(0, report.count(Severity.WARNING), () -> report.diagnostics().toString());
        assertEquals(Verdict.TRUE, report.property(Property.NORMALIZED), () -> report.diagnostics().toString());
    }
}
