package dev.circa.validator;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.rules.Rule;
import dev.circa.validator.rules.RuleContext;
import dev.circa.validator.rules.Rules;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.FutureTask;

/**
 * Proves a circuit document valid, or says exactly why not (CLI.md, {@code validate}): schema,
 * references, order, scopes, properties, parameters, normalisation and embedded checks, as
 * {@link Diagnostic}s in a {@link ValidationReport}. Every pass is linear in the circuit's size, up
 * to the bounded determinism enumeration. Instances are immutable and safe to share between threads.
 */
public final class Validator {
    private static final List<Rule> ORDER = sorted();

    private final ValidationOptions options;
    private final SchemaCheck schema;

    /** A validator with {@code options} and no schema check. */
    public Validator(ValidationOptions options) {
        this(options, SchemaCheck.NONE);
    }

    /**
     * A validator with {@code options} that checks documents read from text against {@code schema}
     * (the command line uses {@link SchemaCheck#BUNDLED}).
     */
    public Validator(ValidationOptions options, SchemaCheck schema) {
        this.options = options;
        this.schema = schema;
    }

    public ValidationOptions options() {
        return options;
    }

    private static List<Rule> sorted() {
        List<Rule> r = new ArrayList<>(Rules.all());
        r.sort(Comparator.comparing((Rule x) -> x.guards().ordinal()).thenComparing(Rule::id));
        return List.copyOf(r);
    }

    /**
     * Reads and validates {@code file} ({@code .gz} decompressed, {@code -} for standard input),
     * checking its text against the schema when this validator has one.
     *
     * @throws FormatException when no model can be built (exit status 2)
     */
    public ValidationReport validate(Path file, ReadLimits limits) throws FormatException {
        CircuitReader reader = new CircuitReader(limits);
        if (schema == SchemaCheck.NONE) {
            return validate(reader.read(file), List.of());
        }
        if (!Files.isRegularFile(file)) {
            CircuitDocument doc = reader.read(file);
            return validate(doc, schema.check(file, limits));
        }
        // The schema check reads the file on its own: on the second core, beside the read and the analyses.
        FutureTask<List<SchemaFinding>> check = new FutureTask<>(() -> schema.check(file, limits));
        Thread worker = new Thread(check, "circa-schema-check");
        worker.setDaemon(true);
        worker.start();
        try {
            CircuitDocument doc = reader.read(file);
            RuleContext ctx = new RuleContext(doc, options);
            ctx.prepare();
            return validate(ctx, doc, findings(check));
        } finally {
            check.cancel(true);
        }
    }

    /** The schema check's findings, or its exception as thrown. */
    private static List<SchemaFinding> findings(FutureTask<List<SchemaFinding>> check) throws FormatException {
        try {
            return check.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while the schema check ran", e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof FormatException f) {
                throw f;
            }
            if (c instanceof RuntimeException r) {
                throw r;
            }
            if (c instanceof Error r) {
                throw r;
            }
            throw new IllegalStateException(c);
        }
    }

    /** Reads and validates {@code file} under the default limits. */
    public ValidationReport validate(Path file) throws FormatException {
        return validate(file, ReadLimits.DEFAULT);
    }

    /** Reads and validates a document given as text; {@code file} names it in messages. */
    public ValidationReport validate(String json, String file) throws FormatException {
        byte[] bytes = json.getBytes(StandardCharsets.UTF_8);
        CircuitDocument doc = new CircuitReader().read(new ByteArrayInputStream(bytes), file);
        return validate(doc, schema.check(new ByteArrayInputStream(bytes), file, ReadLimits.DEFAULT));
    }

    /** Validates a document built in code or read elsewhere (no schema check: there is no text). */
    public ValidationReport validate(CircuitDocument doc) {
        return validate(doc, List.of());
    }

    /** Validates {@code doc}, reporting {@code schemaFindings} (from a schema check of its text) as well. */
    public ValidationReport validate(CircuitDocument doc, List<SchemaFinding> schemaFindings) {
        return validate(new RuleContext(doc, options), doc, schemaFindings);
    }

    private ValidationReport validate(RuleContext ctx, CircuitDocument doc, List<SchemaFinding> schemaFindings) {
        ctx.prepare();
        ctx.schemaFindings(schemaFindings);
        for (Rule r : ORDER) {
            r.check(ctx);
        }
        List<Diagnostic> diags = ctx.diagnostics();
        boolean valid = true;
        for (Diagnostic d : diags) {
            valid &= d.severity() != Severity.ERROR;
        }
        Map<Property, Verdict> props = new EnumMap<>(Property.class);
        for (Property p : Property.values()) {
            props.put(p, ctx.verdict(p));
        }
        Map<String, Double> logZ = null;
        if (ctx.logPartition() != null) {
            logZ = new LinkedHashMap<>();
            for (int o = 0; o < doc.outputs().size(); o++) {
                logZ.putIfAbsent(doc.outputs().get(o).name(), ctx.outputLogPartition(o));
            }
        }
        VariableTree vt = props.get(Property.STRUCTURED_DECOMPOSABLE) == Verdict.TRUE ? ctx.tree().tree() : null;
        boolean density = ctx.graph().usable() && !ctx.parameters().anyProblem()
                && ctx.graph().familyTypes.isEmpty() && ctx.graph().repeatedVars.isEmpty();
        boolean marginal = density && props.get(Property.SMOOTH) == Verdict.TRUE
                && props.get(Property.DECOMPOSABLE) == Verdict.TRUE;
        boolean mpe = marginal && props.get(Property.DETERMINISTIC) == Verdict.TRUE;
        ExactQueries q = new ExactQueries(density, marginal, marginal, mpe, marginal);
        int depth = 0;
        Scopes s = ctx.scopes();
        if (s != null) {
            for (int o = 0; o < ctx.graph().outputCount(); o++) {
                depth = Math.max(depth, s.depth(ctx.graph().outputNode(o)));
            }
        }
        CircuitStats stats = new CircuitStats(doc.variables().size(), doc.nodes().size(), doc.edgeCount(), depth);
        return new ValidationReport(doc.source(), valid, props, logZ, vt, q, stats, diags);
    }
}
