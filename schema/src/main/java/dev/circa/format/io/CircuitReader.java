package dev.circa.format.io;

import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.DocumentLocations;
import dev.circa.format.Family;
import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JsonToken;
import tools.jackson.databind.JsonNode;

/**
 * Reads a circuit document (FORMAT.md section 2) in one streaming pass, in any member order.
 *
 * <p>Structure is checked while reading: JSON syntax, member types, required members, exactly one
 * kind per node, the {@code format} and major {@code version}, finite numbers, duplicate keys and
 * the {@link ReadLimits}. Any of these ends the read with a located {@link FormatException}.
 * Values are not judged here (ranges, references, order, scopes): that is the validator's work.
 * Unknown properties outside {@code extensions} are kept as {@link ReadFinding}s.
 *
 * <p>Instances hold only their limits and are safe to share between threads.
 */
public final class CircuitReader extends JsonDocumentReader<CircuitDocument> {
    /** The newest minor version of format 1 this reader knows. */
    public static final int SUPPORTED_MINOR = 0;

    public CircuitReader() {
        this(ReadLimits.DEFAULT);
    }

    public CircuitReader(ReadLimits limits) {
        super(limits);
    }

    @Override
    protected CircuitDocument read(JsonInput in) throws FormatException {
        Pass pass = new Pass(in, limits());
        try (DeferredNumbers numbers = pass.numbers) {
            return pass.run();
        }
    }

    /** The state of one read. */
    private static final class Pass {
        private final JsonInput in;
        private final ReadLimits limits;
        private final String file;
        private final List<ReadFinding> unknown = new ArrayList<>();
        private final DocumentLocations.Recorder locations = new DocumentLocations.Recorder();
        private final NodeLocations.Recorder nodeLocations = new NodeLocations.Recorder();
        private final NodeTable.Builder table = new NodeTable.Builder();
        /** Decodes the weights on a second thread while the read goes on. */
        final DeferredNumbers numbers = new DeferredNumbers(table);
        /** The nodes read so far: while a node is read, its position in the nodes array. */
        private int nodeCount;
        private final NodeFields fields = new NodeFields();

        Pass(JsonInput in, ReadLimits limits) {
            this.in = in;
            this.limits = limits;
            this.file = in.file();
        }

        CircuitDocument run() throws FormatException {
            in.startDocument("a circuit document");
            // A missing member is reported at the start of the object that lacks it.
            int rootLine = in.line();
            int rootColumn = in.column();
            CircuitDocument.Builder b = CircuitDocument.builder().source(file);
            String format = null;
            String version = null;
            int formatLine = rootLine;
            int formatColumn = rootColumn;
            boolean sawNodes = false;
            boolean sawOutputs = false;
            boolean sawVariables = false;
            String member;
            while ((member = in.nextProperty()) != null) {
                String ptr = "/" + member;
                locations.put(ptr, in.line(), in.column());
                switch (member) {
                    case "format" -> {
                        formatLine = in.line();
                        formatColumn = in.column();
                        format = in.readString(ptr);
                        if (!CircuitDocument.FORMAT.equals(format)) {
                            throw in.error(ptr, "unknown format \"" + format + "\"; expected \""
                                    + CircuitDocument.FORMAT + "\"");
                        }
                    }
                    case "version" -> {
                        version = in.readString(ptr);
                        DocumentHeader.checkVersion(in, version, ptr);
                        b.version(version);
                    }
                    case "name" -> b.name(in.readString(ptr));
                    case "description" -> b.description(in.readString(ptr));
                    case "provenance" -> b.provenance(DocumentHeader.readProvenance(in, ptr, unknown));
                    case "variables" -> {
                        b.variables(VariableListReader.read(in, ptr, unknown));
                        sawVariables = true;
                    }
                    case "nodes" -> {
                        readNodes(ptr);
                        sawNodes = true;
                    }
                    case "outputs" -> {
                        b.outputs(readOutputs(ptr));
                        sawOutputs = true;
                    }
                    case "checks" -> b.checks(readChecks(ptr));
                    case "extensions" -> {
                        in.expect(JsonToken.START_OBJECT, ptr, "an object");
                        JsonNode ext = in.readTree();
                        b.extensions(ext);
                    }
                    default -> {
                        unknown(ptr, "unknown property \"" + member + "\" in a circuit document");
                        in.skipValue();
                    }
                }
            }
            in.endDocument();
            if (format == null) {
                throw new FormatException(file, rootLine, rootColumn, "/format",
                        "missing \"format\"; expected \"format\": \"" + CircuitDocument.FORMAT + "\"");
            }
            if (version == null) {
                throw new FormatException(file, formatLine, formatColumn, "/version",
                        "missing \"version\"; expected \"version\": \"1.0\"");
            }
            if (!sawVariables) {
                throw new FormatException(file, rootLine, rootColumn, "/variables", "missing \"variables\"; expected an array of variables");
            }
            if (!sawNodes) {
                throw new FormatException(file, rootLine, rootColumn, "/nodes", "missing \"nodes\"; expected an array of nodes");
            }
            if (!sawOutputs) {
                throw new FormatException(file, rootLine, rootColumn, "/outputs", "missing \"outputs\"; expected an array of outputs");
            }
            boolean newerMinor = DocumentHeader.minor(version) > SUPPORTED_MINOR;
            List<ReadFinding> findings = new ArrayList<>(unknown.size());
            for (ReadFinding f : unknown) {
                findings.add(newerMinor
                        ? new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR,
                                f.message() + " (ignored: the document is version " + version + ")", f.location())
                        : f);
            }
            numbers.finish();
            return b.nodeTable(table.build()).nodeLocations(nodeLocations.build()).locations(locations.build())
                    .findings(findings).build();
        }

        private void unknown(String ptr, String message) {
            unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message,
                    new SourceLocation(ptr, in.line(), in.column())));
        }

        private List<Output> readOutputs(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of outputs");
            List<Output> outs = new ArrayList<>();
            while (in.nextElement()) {
                String p = ptr + "/" + outs.size();
                locations.put(p, in.line(), in.column());
                in.expect(JsonToken.START_OBJECT, p, "an output object {\"name\": ..., \"node\": ...}");
                String name = null;
                Integer node = null;
                String m;
                while ((m = in.nextProperty()) != null) {
                    switch (m) {
                        case "name" -> name = in.readString(p + "/name");
                        case "node" -> node = in.readInt(p + "/node", 0, Integer.MAX_VALUE);
                        default -> {
                            unknown(p + "/" + m, "unknown property \"" + m + "\" in an output");
                            in.skipValue();
                        }
                    }
                }
                SourceLocation at = locations.build().get(p);
                if (name == null || node == null) {
                    throw new FormatException(file, at.line(), at.column(), p,
                            "an output needs \"name\" and \"node\"; missing " + (name == null ? "\"name\"" : "\"node\""));
                }
                outs.add(new Output(name, node));
            }
            return outs;
        }

        private Checks readChecks(String ptr) throws FormatException {
            in.expect(JsonToken.START_OBJECT, ptr, "an object");
            double atol = Checks.DEFAULT_TOLERANCE;
            double rtol = Checks.DEFAULT_TOLERANCE;
            List<CheckCase> cases = new ArrayList<>();
            String m;
            while ((m = in.nextProperty()) != null) {
                String p = ptr + "/" + m;
                switch (m) {
                    case "atol" -> atol = in.readDouble(p);
                    case "rtol" -> rtol = in.readDouble(p);
                    case "cases" -> {
                        in.expect(JsonToken.START_ARRAY, p, "an array of cases");
                        while (in.nextElement()) {
                            cases.add(readCase(p + "/" + cases.size()));
                        }
                    }
                    default -> {
                        unknown(p, "unknown property \"" + m + "\" in checks");
                        in.skipValue();
                    }
                }
            }
            return new Checks(atol, rtol, cases);
        }

        private CheckCase readCase(String p) throws FormatException {
            locations.put(p, in.line(), in.column());
            int line = in.line();
            int col = in.column();
            in.expect(JsonToken.START_OBJECT, p, "a case object");
            String output = null;
            Map<String, Object> values = null;
            Double logDensity = null;
            boolean sawDensity = false;
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = p + "/" + m;
                switch (m) {
                    case "output" -> output = in.readString(q);
                    case "values" -> {
                        in.expect(JsonToken.START_OBJECT, q, "an object of values keyed by variable name");
                        values = new LinkedHashMap<>();
                        String v;
                        while ((v = in.nextProperty()) != null) {
                            String r = q + "/" + v;
                            if (in.token() == JsonToken.VALUE_STRING) {
                                values.put(v, in.readString(r));
                            } else {
                                values.put(v, in.readDouble(r));
                            }
                        }
                    }
                    case "logDensity" -> {
                        sawDensity = true;
                        logDensity = in.token() == JsonToken.VALUE_NULL ? Double.NEGATIVE_INFINITY : in.readDouble(q);
                    }
                    default -> {
                        unknown(q, "unknown property \"" + m + "\" in a check case");
                        in.skipValue();
                    }
                }
            }
            if (!sawDensity) {
                throw new FormatException(file, line, col, p, "a check case needs \"logDensity\" (a number, or null for -inf)");
            }
            return new CheckCase(output, values == null ? Map.of() : values, logDensity);
        }

        private void readNodes(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of nodes");
            while (in.nextElement()) {
                int index = nodeCount;
                if (index >= limits.maxNodes()) {
                    throw LimitExceededException.of(file, in.line(), in.column(), ptr + "/" + index,
                            "the number of nodes", ReadLimits.MAX_NODES, limits.maxNodes());
                }
                long at = in.position();
                int line = (int) (at >>> 32);
                int column = (int) at;
                nodeLocations.add(line, column);
                readNode(line, column);
                nodeCount++;
            }
        }

        /** The pointer of the node being read, made only for a message or a finding (not once per node). */
        String nodePointer() {
            return "/nodes/" + nodeCount;
        }

        private void readNode(int line, int col) throws FormatException {
            if (in.token() != JsonToken.START_OBJECT) {
                in.expect(JsonToken.START_OBJECT, nodePointer(), "a node object");
            }
            NodeFields f = fields;
            f.reset();
            String m;
            while ((m = in.nextProperty()) != null) {
                // a member's pointer is built only where it is needed, for a message or a finding
                switch (m) {
                    case "id" -> {
                        f.id = intMember(m);
                        f.hasId = true;
                    }
                    case "label" -> f.label = in.readString(nodePointer() + "/" + m);
                    case "input" -> {
                        f.kinds++;
                        String written = in.stringOrNull();
                        f.family = written == null ? null : Family.fromJsonName(written);
                        if (f.family == null) {
                            String q = nodePointer() + "/" + m;
                            String fam = in.readString(q);
                            throw in.error(q, "unknown input family \"" + fam + "\"; expected one of "
                                    + familyNames());
                        }
                    }
                    case "product" -> {
                        f.kinds++;
                        f.isProduct = true;
                        readIds(m);
                    }
                    case "sum" -> {
                        f.kinds++;
                        f.isSum = true;
                        readIds(m);
                    }
                    case "weights" -> {
                        f.weightForms++;
                        readWeights(m);
                    }
                    case "logWeights" -> {
                        f.weightForms++;
                        readWeights(m);
                        f.logWeights = true;
                    }
                    case "var" -> f.vars = new int[] {intMember(m)};
                    case "vars" -> {
                        f.varsArray = true;
                        f.vars = in.readIntArray(nodePointer() + "/" + m, 0, Integer.MAX_VALUE);
                    }
                    default -> {
                        if (ParamNames.isParameter(m)) {
                            long at = in.position();
                            f.paramLocations.put(m, new int[] {(int) (at >>> 32), (int) at});
                            f.params.put(m, readParamValue(m));
                        } else {
                            unknown(nodePointer() + "/" + m, "unknown property \"" + m + "\" in a node");
                            in.skipValue();
                        }
                    }
                }
            }
            f.build(line, col, this);
        }

        /** A non-negative int member {@code m} of the node being read. */
        private int intMember(String m) throws FormatException {
            return in.isIntIn(0, Integer.MAX_VALUE) ? in.intValue()
                    : in.readInt(nodePointer() + "/" + m, 0, Integer.MAX_VALUE);
        }

        /** Appends the child ids of member {@code m} of the node being read to the table. */
        private void readIds(String m) throws FormatException {
            if (in.token() != JsonToken.START_ARRAY) {
                in.expect(JsonToken.START_ARRAY, nodePointer() + "/" + m, "an array of node ids");
            }
            int n = 0;
            while (in.nextElement()) {
                table.appendChild(in.isIntIn(0, Integer.MAX_VALUE) ? in.intValue()
                        : in.readInt(nodePointer() + "/" + m + "/" + n, 0, Integer.MAX_VALUE));
                n++;
            }
        }

        /** Appends the numbers of member {@code m} (weights or log-weights) of the node being read to the table. */
        private void readWeights(String m) throws FormatException {
            if (in.token() != JsonToken.START_ARRAY) {
                in.readDoubleArray(nodePointer() + "/" + m);
            }
            int n = 0;
            while (in.nextElement()) {
                if (!numbers.offer(in.parser())) {
                    double v = in.finiteOrNaN();
                    table.appendValue(Double.isFinite(v) ? v : in.readDouble(nodePointer() + "/" + m + "/" + n));
                }
                n++;
            }
        }

        /**
         * Parameter {@code m} of the node being read: a number, an array of numbers or an array of arrays
         * of numbers. Pointers are made only for a message.
         */
        private Object readParamValue(String m) throws FormatException {
            if (in.token() == JsonToken.START_ARRAY) {
                List<Object> rows = new ArrayList<>();
                double[] flat = new double[8];
                int n = 0;
                boolean nested = false;
                while (in.nextElement()) {
                    int k = nested ? rows.size() : n;
                    if (in.token() == JsonToken.START_ARRAY) {
                        if (n > 0) {
                            throw in.error(paramPointer(m, k), "expected a number like the elements before it, found an array");
                        }
                        nested = true;
                        rows.add(in.readDoubleArray(paramPointer(m, k)));
                    } else {
                        if (nested) {
                            throw in.error(paramPointer(m, k), "expected an array like the rows before it, found "
                                    + JsonInput.describe(in.token()));
                        }
                        if (n == flat.length) {
                            flat = Arrays.copyOf(flat, n * 2);
                        }
                        double v = in.finiteOrNaN();
                        flat[n++] = Double.isFinite(v) ? v : in.readDouble(paramPointer(m, k));
                    }
                }
                if (nested) {
                    return rows.toArray(new double[0][]);
                }
                return Arrays.copyOf(flat, n);
            }
            double v = in.finiteOrNaN();
            return Double.isFinite(v) ? v : in.readDouble(nodePointer() + "/" + m);
        }

        private String paramPointer(String m, int k) {
            return nodePointer() + "/" + m + "/" + k;
        }

        FormatException error(String pointer, int line, int col, String problem) {
            return new FormatException(file, line, col, pointer, problem);
        }

        void unknownAt(String pointer, int line, int col, String message) {
            unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message, new SourceLocation(pointer, line, col)));
        }
    }

    private static String familyNames() {
        StringBuilder sb = new StringBuilder();
        for (Family f : Family.values()) {
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(f.jsonName());
        }
        return sb.toString();
    }

    /** The members of the node being read; reused from node to node. */
    private static final class NodeFields {
        int id;
        boolean hasId;
        String label;
        int kinds;
        Family family;
        boolean isProduct;
        boolean isSum;
        int weightForms;
        boolean logWeights;
        int[] vars;
        boolean varsArray;
        final Map<String, Object> params = new LinkedHashMap<>();
        final Map<String, int[]> paramLocations = new LinkedHashMap<>();

        void reset() {
            id = 0;
            hasId = false;
            label = null;
            kinds = 0;
            family = null;
            isProduct = false;
            isSum = false;
            weightForms = 0;
            logWeights = false;
            vars = null;
            varsArray = false;
            params.clear();
            paramLocations.clear();
        }

        /** Checks the node read and closes it in the table (its child ids and weights are there already). */
        void build(int line, int col, Pass pass) throws FormatException {
            if (!hasId) {
                throw pass.error(pass.nodePointer() + "/id", line, col, "a node needs an integer \"id\"");
            }
            if (kinds == 0) {
                throw pass.error(pass.nodePointer(), line, col, "node " + id + " has no kind; expected one of \"input\", \"product\" or \"sum\"");
            }
            if (kinds > 1) {
                throw pass.error(pass.nodePointer(), line, col, "node " + id + " has more than one kind; expected exactly one of \"input\", \"product\" or \"sum\"");
            }
            if (isProduct || isSum) {
                if (vars != null) {
                    throw pass.error(pass.nodePointer(), line, col, "node " + id + " is a " + (isSum ? "sum" : "product")
                            + " and cannot have \"var\" or \"vars\"");
                }
                for (String name : params.keySet()) {
                    int[] at = paramLocations.get(name);
                    pass.unknownAt(pass.nodePointer() + "/" + name, at[0], at[1], "unknown property \"" + name + "\" in a "
                            + (isSum ? "sum" : "product") + " node");
                }
            }
            if (isProduct) {
                if (weightForms > 0) {
                    throw pass.error(pass.nodePointer(), line, col, "product node " + id + " cannot have weights; only sums are weighted");
                }
                pass.table.close(NodeTable.PRODUCT, id, label, null, false);
                return;
            }
            if (isSum) {
                if (weightForms == 0) {
                    throw pass.error(pass.nodePointer(), line, col, "sum node " + id + " needs \"weights\" or \"logWeights\", one per child");
                }
                if (weightForms > 1) {
                    throw pass.error(pass.nodePointer(), line, col, "sum node " + id + " has both \"weights\" and \"logWeights\"; expected exactly one");
                }
                pass.table.close(NodeTable.SUM, id, label, null, logWeights);
                return;
            }
            buildInput(line, col, pass);
        }

        private void buildInput(int line, int col, Pass pass) throws FormatException {
            if (weightForms > 0) {
                throw pass.error(pass.nodePointer(), line, col, "input node " + id + " cannot have weights; only sums are weighted");
            }
            boolean mv = family == Family.MVNORMAL;
            if (vars == null) {
                throw pass.error(pass.nodePointer(), line, col, "input node " + id + " needs " + (mv ? "\"vars\"" : "\"var\"")
                        + " (a variable index" + (mv ? " array" : "") + ")");
            }
            if (mv != varsArray) {
                throw pass.error(pass.nodePointer(), line, col, mv ? "mvnormal node " + id + " needs \"vars\" (an array of variable indices), not \"var\""
                        : family.jsonName() + " node " + id + " needs \"var\" (one variable index), not \"vars\"");
            }
            double[] values;
            boolean logForm = false;
            String fam = family.jsonName();
            switch (family) {
                case CATEGORICAL -> {
                    boolean hasProbs = params.containsKey("probs");
                    boolean hasLog = params.containsKey("logProbs");
                    if (hasProbs == hasLog) {
                        throw pass.error(pass.nodePointer(), line, col, "categorical node " + id
                                + " needs exactly one of \"probs\" or \"logProbs\"");
                    }
                    logForm = hasLog;
                    values = vector(hasLog ? "logProbs" : "probs", line, col, pass);
                    rejectOthers(pass, hasLog ? "logProbs" : "probs");
                }
                case MVNORMAL -> {
                    double[] mean = vector("mean", line, col, pass);
                    Object c = params.get("cov");
                    if (!(c instanceof double[][] cov)) {
                        int[] at = paramLocations.getOrDefault("cov", new int[] {line, col});
                        throw pass.error(pass.nodePointer() + "/cov", at[0], at[1], "mvnormal node " + id
                                + " needs \"cov\", a d x d array of arrays of numbers");
                    }
                    int d = mean.length;
                    if (vars.length != d || cov.length != d) {
                        throw pass.error(pass.nodePointer(), line, col, "mvnormal node " + id + " has " + vars.length + " vars, a mean of length "
                                + d + " and " + cov.length + " covariance rows; expected the same number d");
                    }
                    values = new double[d + d * d];
                    System.arraycopy(mean, 0, values, 0, d);
                    for (int i = 0; i < d; i++) {
                        if (cov[i].length != d) {
                            throw pass.error(pass.nodePointer() + "/cov/" + i, line, col, "covariance row " + i + " of mvnormal node " + id
                                    + " has " + cov[i].length + " entries; expected " + d);
                        }
                        System.arraycopy(cov[i], 0, values, d + i * d, d);
                    }
                    rejectOthers(pass, "mean", "cov");
                }
                default -> {
                    List<String> names = family.parameters();
                    values = new double[names.size()];
                    for (int i = 0; i < values.length; i++) {
                        Object v = params.get(names.get(i));
                        if (v == null) {
                            throw pass.error(pass.nodePointer(), line, col, fam + " node " + id + " needs \"" + names.get(i) + "\" (a number)");
                        }
                        if (!(v instanceof Double d)) {
                            int[] at = paramLocations.get(names.get(i));
                            throw pass.error(pass.nodePointer() + "/" + names.get(i), at[0], at[1], "\"" + names.get(i) + "\" of " + fam
                                    + " node " + id + " must be a number, found an array");
                        }
                        values[i] = d;
                    }
                    rejectOthers(pass, names.toArray(new String[0]));
                }
            }
            for (int v : vars) {
                pass.table.appendVar(v);
            }
            for (double v : values) {
                pass.table.appendValue(v);
            }
            pass.table.close(NodeTable.INPUT, id, label, family, logForm);
        }

        private double[] vector(String name, int line, int col, Pass pass) throws FormatException {
            Object v = params.get(name);
            if (!(v instanceof double[] a)) {
                int[] at = paramLocations.getOrDefault(name, new int[] {line, col});
                throw pass.error(pass.nodePointer() + "/" + name, at[0], at[1], family.jsonName() + " node " + id + " needs \"" + name
                        + "\", an array of numbers");
            }
            return a;
        }

        private void rejectOthers(Pass pass, String... allowed) {
            List<String> ok = List.of(allowed);
            for (Map.Entry<String, int[]> e : paramLocations.entrySet()) {
                if (!ok.contains(e.getKey())) {
                    pass.unknownAt(pass.nodePointer() + "/" + e.getKey(), e.getValue()[0], e.getValue()[1], "unknown property \""
                            + e.getKey() + "\" for a " + family.jsonName() + " input");
                }
            }
        }
    }
}
