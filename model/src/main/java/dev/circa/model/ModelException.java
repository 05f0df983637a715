package dev.circa.model;

import dev.circa.format.Counts;
import dev.circa.format.io.FormatException;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import java.util.ArrayList;
import java.util.List;
import java.util.StringJoiner;

/**
 * A circuit that a {@link ModelLoader} refused: either unreadable (a located read error: file, line,
 * column, what was expected; no {@linkplain #report() report}) or read but not proven fit to serve
 * under the loader's {@link Requirement} (the validator's report and its error
 * {@linkplain #diagnostics() diagnostics}), or, loaded with a certificate, refused by it
 * ({@link CertificateMismatchException}). On the command line each is exit status 2.
 */
public class ModelException extends FormatException {
    private static final long serialVersionUID = 1L;
    /** Diagnostics quoted in the message; all of them are in {@link #diagnostics()}. */
    private static final int QUOTED = 3;

    private final transient ValidationReport report;
    private final transient List<Diagnostic> diagnostics;

    private ModelException(FormatException cause) {
        super(cause.file(), cause.line(), cause.column(), cause.pointer(), cause.problem());
        initCause(cause);
        this.report = null;
        this.diagnostics = List.of();
    }

    private ModelException(String file, String problem, ValidationReport report, List<Diagnostic> errors) {
        super(file, 0, 0, null, problem);
        this.report = report;
        this.diagnostics = List.copyOf(errors);
    }

    /** A refusal that is neither a read error nor the validator's (a certificate mismatch). */
    ModelException(String file, String problem, Throwable cause) {
        super(file, 0, 0, null, problem);
        if (cause != null) {
            initCause(cause);
        }
        this.report = null;
        this.diagnostics = List.of();
    }

    /** A read error, kept as it is. */
    static ModelException unreadable(FormatException e) {
        return e instanceof ModelException m ? m : new ModelException(e);
    }

    /** A circuit read but refused by the validator. */
    static ModelException invalid(String file, ValidationReport report, Requirement requirement) {
        List<Diagnostic> errors = new ArrayList<>();
        for (Diagnostic d : report.diagnostics()) {
            if (d.severity() == Severity.ERROR) {
                errors.add(d);
            }
        }
        StringJoiner required = new StringJoiner(", ");
        for (Property p : requirement.properties()) {
            required.add(p.optionName());
        }
        StringBuilder problem = new StringBuilder("cannot be used: ").append(Counts.of(errors.size(), "error"))
                .append(" found by the validator (required: ")
                .append(required.length() == 0 ? "no property" : required.toString())
                .append(", with valid references and parameters)");
        for (int i = 0; i < Math.min(QUOTED, errors.size()); i++) {
            problem.append(i == 0 ? ": " : "; ").append(errors.get(i).render());
        }
        if (errors.size() > QUOTED) {
            problem.append("; and ").append(errors.size() - QUOTED).append(" more");
        }
        return new ModelException(file, problem.toString(), report, errors);
    }

    /**
     * Whether the circuit could not be read at all (then there is no report and no diagnostic).
     *
     * @return true for a read error
     */
    public boolean unreadable() {
        return report == null;
    }

    /**
     * The validator's report of a circuit that was read but refused.
     *
     * @return the report, or {@code null} when the circuit could not be read
     */
    public ValidationReport report() {
        return report;
    }

    /**
     * The validator's error diagnostics, in the order found; empty for a read error.
     *
     * @return an unmodifiable list
     */
    public List<Diagnostic> diagnostics() {
        return diagnostics == null ? List.of() : diagnostics;
    }
}
