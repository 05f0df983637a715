package dev.circa.validator;

import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.rules.Rule;
import dev.circa.validator.rules.RuleContext;
import dev.circa.validator.rules.Rules;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;

/**
 * Proves a circuit document valid, or says exactly why not (CLI.md, {@code validate}): schema,
 * references, order, scopes, properties, parameters, normalisation and embedded checks, as
 * {@link Diagnostic}s in a {@link ValidationReport}. Every pass is linear in the circuit's size, up
 * to the bounded determinism enumeration. Instances are immutable and safe to share between threads.
 */
public final class Validator {
    /** Files up to this many bytes are also checked against the schema as a whole tree. */
    public static final long SCHEMA_TREE_BYTES = 64L << 20;

    private static final List<Rule> ORDER = sorted();

    private final ValidationOptions options;
    private final SchemaCheck schema;

    /** A validator with {@code options} and no schema check. */
    public Validator(ValidationOptions options) {
        this(options, SchemaCheck.NONE);
    }

    /** A validator with {@code options} that checks documents read from text against {@code schema}. */
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
     * Reads and validates {@code file} ({@code .gz} decompressed, {@code -} for standard input).
     *
     * @throws FormatException when no model can be built (exit status 2)
     */
    public ValidationReport validate(Path file, ReadLimits limits) throws FormatException {
        CircuitReader reader = new CircuitReader(limits);
        String name = InputFiles.displayName(file);
        boolean stdin = file.toString().equals("-");
        if (stdin) {
            byte[] bytes;
            try (InputStream in = InputFiles.open(file, limits.maxBytes())) {
                bytes = in.readAllBytes();
            } catch (IOException e) {
                throw new FormatException(name, 0, 0, null, "cannot read standard input: " + e.getMessage());
            }
            CircuitDocument doc = reader.read(new ByteArrayInputStream(bytes), name);
            JsonNode tree = schema == SchemaCheck.NONE || bytes.length > SCHEMA_TREE_BYTES ? null
                    : tree(new ByteArrayInputStream(bytes), name, limits);
            return validate(doc, tree);
        }
        CircuitDocument doc = reader.read(file);
        JsonNode tree = null;
        if (schema != SchemaCheck.NONE && size(file) <= SCHEMA_TREE_BYTES) {
            try (InputStream in = InputFiles.open(file, limits.maxBytes())) {
                tree = tree(in, name, limits);
            } catch (IOException e) {
                throw new FormatException(name, 0, 0, null, "cannot read the file: " + e.getMessage());
            }
        }
        return validate(doc, tree);
    }

    /** Reads and validates {@code file} under the default limits. */
    public ValidationReport validate(Path file) throws FormatException {
        return validate(file, ReadLimits.DEFAULT);
    }

    private static long size(Path file) {
        try {
            return Files.size(file);
        } catch (IOException e) {
            return Long.MAX_VALUE;
        }
    }

    private static JsonNode tree(InputStream in, String name, ReadLimits limits) throws FormatException {
        try {
            return JsonInput.mapperFor(limits).readTree(in);
        } catch (JacksonException e) {
            throw JsonInput.translate(e, name);
        }
    }

    /** Validates a document built in code or read elsewhere (no schema check: there is no text). */
    public ValidationReport validate(CircuitDocument doc) {
        return validate(doc, null);
    }

    /** Validates {@code doc}, also checking {@code tree} (the same document as JSON) against the schema when given. */
    public ValidationReport validate(CircuitDocument doc, JsonNode tree) {
        RuleContext ctx = new RuleContext(doc, options);
        if (tree != null) {
            ctx.schemaFindings(schema.check(tree));
        }
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
