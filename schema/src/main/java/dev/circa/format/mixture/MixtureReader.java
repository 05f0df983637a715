package dev.circa.format.mixture;

import dev.circa.format.Family;
import dev.circa.format.Header;
import dev.circa.format.Provenance;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.DocumentHeader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.io.TextDecoding;
import java.io.BufferedInputStream;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.snakeyaml.engine.v2.api.LoadSettings;
import org.snakeyaml.engine.v2.schema.CoreSchema;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.core.StreamReadFeature;
import tools.jackson.core.TokenStreamLocation;
import tools.jackson.dataformat.yaml.YAMLFactory;
import tools.jackson.dataformat.yaml.YAMLFactoryBuilder;
import tools.jackson.dataformat.yaml.YAMLMapper;
import tools.jackson.dataformat.yaml.YAMLReadFeature;
import tools.jackson.dataformat.yaml.YAMLSchema;

/**
 * Reads a mixture document (FORMAT.md section 4) from JSON or YAML 1.2 (core schema) in one
 * streaming pass, members in any order. Every problem ends the read with one located
 * {@link FormatException}: syntax, wrong types, a missing or unknown member, an unknown variable,
 * state or definition, a family that does not fit its variable, {@code .inf}/{@code .nan}, YAML
 * anchors, aliases or tags, and the {@link ReadLimits}. The message gives the model path, e.g.
 * {@code model.mixture[1].product[0]}. Parameter values are not judged here (the converter does).
 *
 * <p>The reader keeps no state between calls; its static methods are safe to call from any thread.
 */
public final class MixtureReader {
    /** The newest minor version of format 1 this reader knows. */
    public static final int SUPPORTED_MINOR = 0;

    /** The two syntaxes of a mixture document. */
    public enum Syntax {
        /** JSON (RFC 8259), read strictly as circuit documents are. */
        JSON,
        /** YAML 1.2, core schema, without anchors, aliases, tags, {@code .inf} or {@code .nan}. */
        YAML
    }

    private static final List<String> EXPRESSION_KINDS = List.of("mixture", "product", "use", "gaussian-mixture");

    private MixtureReader() {
    }

    /**
     * Reads {@code path} ({@code -} for standard input; {@code .gz} decompressed). The syntax follows
     * the name ({@code .json}, {@code .yaml}, {@code .yml}, before any {@code .gz}), else the content
     * (JSON when it starts with <code>{</code>, YAML otherwise).
     */
    public static MixtureDocument read(Path path, ReadLimits limits) throws FormatException {
        String file = InputFiles.displayName(path);
        InputStream in = InputFiles.open(path, limits.maxBytes());
        try {
            return read(in, file, syntaxOf(path), limits);
        } finally {
            try {
                in.close();
            } catch (IOException e) {
                // the document has been read whole; a failure to close changes nothing in it
            }
        }
    }

    /**
     * Reads from {@code in}; {@code file} names it in messages.
     *
     * @param syntax the syntax, or {@code null} to decide by the content
     */
    public static MixtureDocument read(InputStream in, String file, Syntax syntax, ReadLimits limits)
            throws FormatException {
        InputStream buffered = in.markSupported() ? in : new BufferedInputStream(in);
        Syntax s = syntax != null ? syntax : sniff(buffered, file);
        JsonInput input = open(buffered, file, s, limits);
        try {
            return new Pass(input, s, limits).run();
        } catch (FormatException e) {
            throw locate(e, input);
        } catch (StackOverflowError e) {
            // expressions are read and resolved by recursive descent, bounded by --max-depth; a depth
            // limit raised beyond what the thread's stack can follow ends here, with the read abandoned
            throw locate(new LimitExceededException(file, 0, 0, null, "the model is nested more deeply than the reader's"
                    + " stack can follow under the depth limit of " + limits.maxDepth() + " set by " + ReadLimits.MAX_DEPTH
                    + " (lower it with " + ReadLimits.MAX_DEPTH + ", or give Java a larger stack with -Xss)",
                    ReadLimits.MAX_DEPTH), input);
        } finally {
            try {
                input.close();
            } catch (FormatException e) {
                // closing after a complete or failed read adds nothing the caller needs
            }
        }
    }

    /** Reads a document from text (tests, small inputs); the syntax is decided by the content. */
    public static MixtureDocument readString(String text, String file, ReadLimits limits) throws FormatException {
        return read(new ByteArrayInputStream(text.getBytes(StandardCharsets.UTF_8)), file, null, limits);
    }

    /** The syntax implied by a file name, or {@code null} when the name does not say. */
    public static Syntax syntaxOf(Path path) {
        if (path == null || path.getFileName() == null) {
            return null;
        }
        String n = path.getFileName().toString().toLowerCase(Locale.ROOT);
        if (n.endsWith(".gz")) {
            n = n.substring(0, n.length() - 3);
        }
        if (n.endsWith(".json")) {
            return Syntax.JSON;
        }
        if (n.endsWith(".yaml") || n.endsWith(".yml")) {
            return Syntax.YAML;
        }
        return null;
    }

    private static Syntax sniff(InputStream in, String file) throws FormatException {
        try {
            in.mark(1 << 16);
            int b;
            int count = 0;
            Syntax s = Syntax.YAML;
            while ((b = in.read()) >= 0 && count++ < (1 << 16) - 1) {
                if (b == ' ' || b == '\t' || b == '\r' || b == '\n' || b == 0xEF || b == 0xBB || b == 0xBF) {
                    continue;
                }
                s = b == '{' ? Syntax.JSON : Syntax.YAML;
                break;
            }
            in.reset();
            return s;
        } catch (IOException e) {
            if (e instanceof FormatException fe) {
                throw fe;
            }
            throw new FormatException(file, 0, 0, null, "cannot be read: " + e.getMessage());
        }
    }

    private static JsonInput open(InputStream in, String file, Syntax syntax, ReadLimits limits)
            throws FormatException {
        if (syntax == Syntax.JSON) {
            return JsonInput.fromStream(in, file, limits);
        }
        try {
            YAMLFactoryBuilder builder = YAMLFactory.builder()
                    .yamlSchema(YAMLSchema.CORE)
                    .disable(YAMLReadFeature.PARSE_OCTAL_NUMBERS)
                    .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                    .streamReadConstraints(JsonInput.constraints(limits))
                    .loadSettings(LoadSettings.builder().setCodePointLimit(Integer.MAX_VALUE)
                            .setSchema(new CoreSchema())
                            .setMaxAliasesForCollections(0).build());
            // UTF-8, UTF-16 or UTF-32 with or without a byte-order mark, as JSON text is read
            JsonParser p = YAMLMapper.builder(new CoreYamlFactory(builder, file)).build()
                    .createParser(TextDecoding.reader(in, file));
            return new JsonInput(new YamlGuard(p, file), file);
        } catch (JacksonException e) {
            throw JsonInput.translate(e, file);
        }
    }

    /** The longest model path or pointer kept whole; a longer one keeps its start and its end. */
    static final int MAX_PATH = 240;
    private static final int PATH_HEAD = 80;
    private static final String ELISION = "...";

    /**
     * The path of a member or element of {@code parent}. Paths are kept for every expression and value,
     * so their length is bounded: beyond {@link #MAX_PATH} characters the middle is elided, and memory
     * grows linearly with nesting instead of with its square (20,000 nested mixtures once took gigabytes).
     */
    static String child(String parent, String segment) {
        int total = parent.length() + segment.length();
        if (total <= MAX_PATH) {
            return parent + segment;
        }
        int keep = MAX_PATH - PATH_HEAD - ELISION.length() - segment.length();
        if (keep <= 0) {
            return parent.substring(0, Math.min(parent.length(), PATH_HEAD)) + ELISION + segment;
        }
        return parent.substring(0, PATH_HEAD) + ELISION + parent.substring(parent.length() - keep) + segment;
    }

    /** Gives a position to limit errors that the parser reported without one. */
    private static FormatException locate(FormatException e, JsonInput in) {
        if (e.line() > 0) {
            return e;
        }
        TokenStreamLocation l = in.parser().currentLocation();
        if (l == null || l.getLineNr() <= 0) {
            return e;
        }
        if (e instanceof LimitExceededException le) {
            return new LimitExceededException(e.file(), l.getLineNr(), Math.max(1, l.getColumnNr()), e.pointer(),
                    e.problem(), le.option());
        }
        return new FormatException(e.file(), l.getLineNr(), Math.max(1, l.getColumnNr()), e.pointer(), e.problem());
    }

    // ---------------------------------------------------------------- raw expressions, resolved at the end

    private abstract static class Raw {
        String label;
        String path;
        SourceLocation location;
        double weight;
        SourceLocation weightLocation;
    }

    private static final class RawMixture extends Raw {
        final List<Raw> entries = new ArrayList<>();
        final List<Double> weights = new ArrayList<>();
        final List<SourceLocation> weightLocations = new ArrayList<>();
    }

    private static final class RawProduct extends Raw {
        final List<Raw> factors = new ArrayList<>();
    }

    private static final class RawUse extends Raw {
        String name;
        SourceLocation nameLocation;
    }

    private static final class RawInput extends Raw {
        Family family;
        Located var;
        Located vars;
        Located params;
    }

    private static final class RawGaussian extends Raw {
        Located body;
    }

    /** The state of one read. */
    private static final class Pass {
        private final JsonInput in;
        private final Syntax syntax;
        private final ReadLimits limits;
        private final String file;
        private final List<ReadFinding> unknown = new ArrayList<>();
        private final List<String> unknownPaths = new ArrayList<>();
        private final List<Variable> variables = new ArrayList<>();
        private final List<SourceLocation> variableLocations = new ArrayList<>();
        private final Map<String, Integer> variableIndex = new LinkedHashMap<>();
        private final Map<String, Raw> rawDefinitions = new LinkedHashMap<>();
        private final Map<String, SourceLocation> definitionLocations = new LinkedHashMap<>();
        private final Map<String, Definition> definitions = new LinkedHashMap<>();
        private final List<RawUse> uses = new ArrayList<>();
        private long expressionCount;

        Pass(JsonInput in, Syntax syntax, ReadLimits limits) {
            this.in = in;
            this.syntax = syntax;
            this.limits = limits;
            this.file = in.file();
        }

        MixtureDocument run() throws FormatException {
            in.startDocument("a mixture document");
            String format = null;
            String version = null;
            String name = null;
            String description = null;
            Provenance provenance = null;
            boolean sawVariables = false;
            Raw model = null;
            String member;
            while ((member = in.nextProperty()) != null) {
                String ptr = "/" + escape(member);
                switch (member) {
                    case "format" -> {
                        format = in.readString(member);
                        if (!MixtureDocument.FORMAT.equals(format)) {
                            throw in.error(member, "unknown format \"" + format + "\"; expected \""
                                    + MixtureDocument.FORMAT + "\"");
                        }
                    }
                    case "version" -> {
                        if (in.isNumber()) {
                            // one rule for JSON and YAML: 1.0 unquoted is a number, and a number loses "1.10"
                            throw in.error(member, "version " + in.parser().getText() + " is a number; expected the"
                                    + " string \"1.0\" (quote it: version: \"1.0\")");
                        }
                        version = in.readString(member);
                        DocumentHeader.checkVersion(in, version, member);
                    }
                    case "name" -> name = in.readString(member);
                    case "description" -> description = in.readString(member);
                    case "provenance" -> provenance = readProvenance(ptr);
                    case "variables" -> {
                        readVariables(ptr);
                        sawVariables = true;
                    }
                    case "definitions" -> readDefinitions(ptr);
                    case "model" -> model = readExpression("model", ptr, false);
                    case "extensions" -> {
                        in.expect(JsonToken.START_OBJECT, member, "an object");
                        in.readTree();
                    }
                    default -> {
                        unknown(ptr, member, "unknown property \"" + member + "\" in a mixture document; expected format, "
                                + "version, name, description, provenance, variables, definitions, model or extensions");
                        in.skipValue();
                    }
                }
            }
            in.endDocument();
            if (format == null) {
                throw new FormatException(file, 1, 1, "format",
                        "missing \"format\"; expected \"format\": \"" + MixtureDocument.FORMAT + "\"");
            }
            if (version == null) {
                throw new FormatException(file, 1, 1, "version", "missing \"version\"; expected \"version\": \"1.0\"");
            }
            if (!sawVariables) {
                throw new FormatException(file, 1, 1, "variables", "missing \"variables\"; expected a list of variables");
            }
            if (model == null) {
                throw new FormatException(file, 1, 1, "model", "missing \"model\"; expected the model expression");
            }
            List<ReadFinding> findings = new ArrayList<>();
            if (DocumentHeader.minor(version) <= SUPPORTED_MINOR) {
                if (!unknown.isEmpty()) {
                    ReadFinding f = unknown.get(0);
                    throw new FormatException(file, f.location().line(), f.location().column(),
                            unknownPaths.get(0), f.message());
                }
            } else {
                for (ReadFinding f : unknown) {
                    findings.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR,
                            f.message() + " (ignored: the document is version " + version + ")", f.location()));
                }
            }
            checkVariables();
            for (RawUse u : uses) {
                if (!rawDefinitions.containsKey(u.name)) {
                    throw at(u.nameLocation, u.path + ".use", "unknown definition \"" + u.name + "\"; "
                            + (rawDefinitions.isEmpty() ? "the document has no definitions"
                                    : "expected one of: " + String.join(", ", rawDefinitions.keySet())));
                }
            }
            for (Map.Entry<String, Raw> d : rawDefinitions.entrySet()) {
                definitions.put(d.getKey(), new Definition(d.getKey(), resolve(d.getValue()),
                        definitionLocations.get(d.getKey())));
            }
            Expression root = resolve(model);
            Header header = Header.builder().version(version).name(name).description(description)
                    .provenance(provenance).variables(variables).findings(findings).source(file).build();
            return new MixtureDocument(header, definitions, root);
        }

        // ------------------------------------------------------------ reading

        private SourceLocation here(String ptr) {
            return new SourceLocation(ptr, in.line(), in.column());
        }

        private FormatException at(SourceLocation l, String path, String problem) {
            return new FormatException(file, l.line(), l.column(), path, problem);
        }

        private void unknown(String ptr, String path, String message) {
            unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message, here(ptr)));
            unknownPaths.add(path);
        }

        /** A string; in YAML also a plain number or boolean taken as written (labels are strings). */
        private String readScalarText(String ptr) throws FormatException {
            JsonToken t = in.token();
            if (t == JsonToken.VALUE_STRING) {
                return in.readString(ptr);
            }
            if (syntax == Syntax.YAML && (in.isNumber() || t == JsonToken.VALUE_TRUE || t == JsonToken.VALUE_FALSE)) {
                return in.parser().getText();
            }
            throw in.error(ptr, "expected a string, found " + JsonInput.describe(t));
        }

        private Provenance readProvenance(String ptr) throws FormatException {
            in.expect(JsonToken.START_OBJECT, "provenance", "an object {producer, created, source}");
            String producer = null;
            String created = null;
            String source = null;
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = ptr + "/" + escape(m);
                switch (m) {
                    case "producer" -> producer = in.readString("provenance.producer");
                    case "created" -> created = readScalarText("provenance.created");
                    case "source" -> source = in.readString("provenance.source");
                    default -> {
                        unknown(q, "provenance." + m, "unknown property \"" + m + "\" in provenance; expected producer, created or source");
                        in.skipValue();
                    }
                }
            }
            return new Provenance(producer, created, source);
        }

        private void readVariables(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, "variables", "a list of variables");
            while (in.nextElement()) {
                String p = ptr + "/" + variables.size();
                String path = "variables[" + variables.size() + "]";
                SourceLocation loc = here(p);
                in.expect(JsonToken.START_OBJECT, path, "a variable {name: ..., type: ...}");
                String name = null;
                VariableType type = null;
                List<String> states = null;
                String unit = null;
                String description = null;
                String m;
                while ((m = in.nextProperty()) != null) {
                    String q = p + "/" + escape(m);
                    String qp = path + "." + m;
                    switch (m) {
                        case "name" -> name = readScalarText(qp);
                        case "type" -> {
                            String t = in.readString(qp);
                            type = VariableType.fromJsonName(t);
                            if (type == null) {
                                throw in.error(qp, "unknown variable type \"" + t
                                        + "\"; expected real, binary, categorical or count");
                            }
                        }
                        case "states" -> {
                            in.expect(JsonToken.START_ARRAY, qp, "a list of state labels");
                            states = new ArrayList<>();
                            while (in.nextElement()) {
                                states.add(readScalarText(qp + "[" + states.size() + "]"));
                            }
                        }
                        case "unit" -> unit = in.readString(qp);
                        case "description" -> description = in.readString(qp);
                        default -> {
                            unknown(q, qp, "unknown property \"" + m + "\" in a variable; expected name, type, states, "
                                    + "unit or description");
                            in.skipValue();
                        }
                    }
                }
                if (name == null) {
                    throw at(loc, path, "a variable needs a \"name\"");
                }
                if (type == null) {
                    throw at(loc, path, "variable \"" + name + "\" needs a \"type\" (real, binary, categorical or count)");
                }
                variables.add(new Variable(name, type, states, unit, description));
                variableLocations.add(loc);
            }
        }

        private void checkVariables() throws FormatException {
            for (int i = 0; i < variables.size(); i++) {
                Variable v = variables.get(i);
                SourceLocation loc = variableLocations.get(i);
                String path = "variables[" + i + "]";
                if (v.name().isEmpty()) {
                    throw at(loc, path, "a variable name must not be empty");
                }
                if (variableIndex.putIfAbsent(v.name(), i) != null) {
                    throw at(loc, path, "variable \"" + v.name() + "\" is declared twice; names must be unique");
                }
                if (v.type() == VariableType.CATEGORICAL && v.states().size() < 2) {
                    throw at(loc, path, "categorical variable \"" + v.name() + "\" needs \"states\": at least 2 labels");
                }
                if (v.type() == VariableType.BINARY && !v.states().isEmpty() && v.states().size() != 2) {
                    throw at(loc, path, "binary variable \"" + v.name() + "\" has " + v.states().size()
                            + " states; expected none or 2");
                }
                if ((v.type() == VariableType.REAL || v.type() == VariableType.COUNT) && !v.states().isEmpty()) {
                    throw at(loc, path, v.type().name().toLowerCase(Locale.ROOT) + " variable \"" + v.name()
                            + "\" cannot have states; only binary and categorical variables do");
                }
                Set<String> seen = new HashSet<>();
                for (String s : v.states()) {
                    if (!seen.add(s)) {
                        throw at(loc, path, "variable \"" + v.name() + "\" lists state \"" + s
                                + "\" twice; labels must be unique");
                    }
                }
            }
        }

        private void readDefinitions(String ptr) throws FormatException {
            in.expect(JsonToken.START_OBJECT, "definitions", "an object of named expressions");
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = child(ptr, "/" + escape(m));
                definitionLocations.put(m, here(q));
                rawDefinitions.put(m, readExpression("definitions." + m, q, false));
            }
        }

        private void countExpression() throws FormatException {
            if (++expressionCount > limits.maxNodes()) {
                throw LimitExceededException.of(file, in.line(), in.column(), null, "the number of expressions",
                        ReadLimits.MAX_NODES, limits.maxNodes());
            }
        }

        /** Reads the expression object at the current token (nesting is bounded by {@code --max-depth}). */
        private Raw readExpression(String path, String ptr, boolean entry) throws FormatException {
            SourceLocation loc = here(ptr);
            in.expect(JsonToken.START_OBJECT, path, entry
                    ? "a mixture entry {weight: ..., and one expression}"
                    : "an expression (an object with mixture, product, use, gaussian-mixture or an input family)");
            countExpression();
            String label = null;
            Double weight = null;
            SourceLocation weightLocation = null;
            String kind = null;
            Raw raw = null;
            Located var = null;
            Located vars = null;
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = child(ptr, "/" + escape(m));
                String qp = child(path, "." + m);
                Family family = Family.fromJsonName(m);
                if (m.equals("label")) {
                    if (!entry) {
                        throw in.error(qp, "\"label\" belongs in a mixture entry; this expression is not one "
                                + "(a definition is known by its name)");
                    }
                    label = readScalarText(qp);
                    continue;
                }
                if (m.equals("weight") && entry) {
                    weightLocation = here(q);
                    weight = in.readDouble(qp);
                    continue;
                }
                if (m.equals("var") || m.equals("vars")) {
                    Located v = readLocated(qp, q);
                    if (m.equals("var")) {
                        var = v;
                    } else {
                        vars = v;
                    }
                    continue;
                }
                if (!EXPRESSION_KINDS.contains(m) && family == null) {
                    if (m.equals("weight")) {
                        throw in.error(qp, "\"weight\" belongs in a mixture entry; this expression is not one");
                    }
                    unknown(q, qp, "unknown property \"" + m + "\" in an expression; expected "
                            + (entry ? "weight, label, " : "") + "mixture, product, use, gaussian-mixture, "
                            + "or var/vars with an input family");
                    in.skipValue();
                    continue;
                }
                if (kind != null) {
                    throw in.error(qp, "an expression has both \"" + kind + "\" and \"" + m
                            + "\"; expected exactly one of mixture, product, use, gaussian-mixture or an input family");
                }
                kind = m;
                SourceLocation at = here(q);
                switch (m) {
                    case "mixture" -> {
                        RawMixture r = new RawMixture();
                        in.expect(JsonToken.START_ARRAY, qp, "a list of mixture entries");
                        while (in.nextElement()) {
                            int i = r.entries.size();
                            Raw e = readExpression(child(qp, "[" + i + "]"), child(q, "/" + i), true);
                            r.entries.add(e);
                            r.weights.add(e.weight);
                            r.weightLocations.add(e.weightLocation);
                        }
                        if (r.entries.isEmpty()) {
                            throw at(at, qp, "a mixture needs at least one entry");
                        }
                        raw = r;
                    }
                    case "product" -> {
                        RawProduct r = new RawProduct();
                        in.expect(JsonToken.START_ARRAY, qp, "a list of expressions");
                        while (in.nextElement()) {
                            int i = r.factors.size();
                            r.factors.add(readExpression(child(qp, "[" + i + "]"), child(q, "/" + i), false));
                        }
                        if (r.factors.isEmpty()) {
                            throw at(at, qp, "a product needs at least one factor");
                        }
                        raw = r;
                    }
                    case "use" -> {
                        RawUse r = new RawUse();
                        r.nameLocation = at;
                        r.name = in.readString(qp);
                        uses.add(r);
                        raw = r;
                    }
                    case "gaussian-mixture" -> {
                        RawGaussian r = new RawGaussian();
                        in.expect(JsonToken.START_OBJECT, qp, "an object {vars, weights, means, covariances or variances}");
                        r.body = readLocated(qp, q);
                        raw = r;
                    }
                    default -> {
                        RawInput r = new RawInput();
                        r.family = family;
                        r.params = readLocated(qp, q);
                        raw = r;
                    }
                }
            }
            if (raw == null) {
                throw at(loc, path, "an expression needs one of mixture, product, use, gaussian-mixture or an input "
                        + "(var or vars with a family such as normal or categorical)");
            }
            if (raw instanceof RawInput r) {
                r.var = var;
                r.vars = vars;
            } else if (var != null || vars != null) {
                Located v = var != null ? var : vars;
                throw at(v.location(), v.path(), "\"" + (var != null ? "var" : "vars") + "\" belongs to an input; "
                        + "a " + kind + " expression takes its variables from its parts");
            }
            if (entry) {
                if (weight == null) {
                    throw at(loc, path, "a mixture entry needs a \"weight\"");
                }
                raw.weight = weight;
                raw.weightLocation = weightLocation;
            }
            raw.label = label;
            raw.path = path;
            raw.location = loc;
            return raw;
        }

        /** Reads any value into a located tree (nesting is bounded by {@code --max-depth}). */
        private Located readLocated(String path, String ptr) throws FormatException {
            SourceLocation loc = here(ptr);
            JsonToken t = in.token();
            if (t == JsonToken.START_OBJECT) {
                Map<String, Located> map = new LinkedHashMap<>();
                String m;
                while ((m = in.nextProperty()) != null) {
                    map.put(m, readLocated(child(path, "." + m), child(ptr, "/" + escape(m))));
                }
                return new Located(map, path, loc);
            }
            if (t == JsonToken.START_ARRAY) {
                List<Located> list = new ArrayList<>();
                while (in.nextElement()) {
                    list.add(readLocated(child(path, "[" + list.size() + "]"), child(ptr, "/" + list.size())));
                }
                return new Located(list, path, loc);
            }
            if (in.isNumber()) {
                return new Located(in.readDouble(path), path, loc);
            }
            if (t == JsonToken.VALUE_STRING) {
                return new Located(in.readString(path), path, loc);
            }
            if (syntax == Syntax.YAML && (t == JsonToken.VALUE_TRUE || t == JsonToken.VALUE_FALSE)) {
                return new Located(in.parser().getText(), path, loc);
            }
            throw in.error(path, "expected a number, a string, a list or an object, found " + JsonInput.describe(t));
        }

        // ------------------------------------------------------------ resolution

        private Expression resolve(Raw raw) throws FormatException {
            if (raw instanceof RawMixture r) {
                List<MixtureEntry> entries = new ArrayList<>(r.entries.size());
                for (int i = 0; i < r.entries.size(); i++) {
                    entries.add(new MixtureEntry(r.weights.get(i), resolve(r.entries.get(i)), r.weightLocations.get(i)));
                }
                return new MixtureExpr(entries, r.label, r.path, r.location);
            }
            if (raw instanceof RawProduct r) {
                List<Expression> factors = new ArrayList<>(r.factors.size());
                for (Raw f : r.factors) {
                    factors.add(resolve(f));
                }
                return new ProductExpr(factors, r.label, r.path, r.location);
            }
            if (raw instanceof RawUse r) {
                return new UseExpr(r.name, r.label, r.path, r.location);
            }
            if (raw instanceof RawInput r) {
                return InputResolver.input(this::variableOf, variables, r.family, r.var, r.vars, r.params, r.label,
                        r.path, r.location, file);
            }
            RawGaussian g = (RawGaussian) raw;
            return InputResolver.gaussianMixture(this::variableOf, variables, g.body, g.label, g.path, g.location, file);
        }

        private int variableOf(Located name) throws FormatException {
            if (!(name.value() instanceof String s)) {
                throw at(name.location(), name.path(), "expected a variable name, found " + name.describe());
            }
            Integer i = variableIndex.get(s);
            if (i == null) {
                List<String> names = new ArrayList<>(variableIndex.keySet());
                throw at(name.location(), name.path(), "unknown variable \"" + s + "\"; "
                        + (names.isEmpty() ? "the document declares no variables"
                                : "the document declares " + String.join(", ", names)));
            }
            return i;
        }
    }

    static String escape(String token) {
        return token.replace("~", "~0").replace("/", "~1");
    }
}
