package dev.circa.format.io;

import dev.circa.format.Family;
import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JsonToken;

/**
 * Reads the node objects of a circuit's {@code nodes} array (FORMAT.md section 2), one at a time, into
 * a {@link NodeTable.Builder} and the nodes' locations. What {@link CircuitReader} says of the whole
 * document holds for each node: structure is checked here (member types, exactly one kind, the
 * members each kind needs), values are the validator's work, and an unknown member becomes a
 * {@link ReadFinding}. Not thread-safe; one instance per run of nodes read in order.
 */
final class NodeArrayReader {
    private final JsonInput in;
    private final ReadLimits limits;
    private final String file;
    private final NodeTable.Builder table;
    private final NodeLocations.Recorder nodeLocations;
    /** Decodes weights on another thread, or {@code null}: each is decoded when read. */
    private final DeferredNumbers numbers;
    private final List<ReadFinding> unknown;
    /** The nodes read so far: while a node is read, its position in the nodes array. */
    private int nodeCount;
    private final NodeFields fields = new NodeFields();

    /**
     * @param numbers decodes weights on another thread, or {@code null}
     * @param unknown where findings of unknown members go, in document order
     */
    NodeArrayReader(JsonInput in, ReadLimits limits, NodeTable.Builder table, NodeLocations.Recorder nodeLocations,
            DeferredNumbers numbers, List<ReadFinding> unknown) {
        this.in = in;
        this.limits = limits;
        this.file = in.file();
        this.table = table;
        this.nodeLocations = nodeLocations;
        this.numbers = numbers;
        this.unknown = unknown;
    }

    /** The nodes read. */
    int count() {
        return nodeCount;
    }

    /** Counts {@code n} nodes read by another reader before the next one this reader reads. */
    void skipCount(int n) {
        nodeCount += n;
    }

    /**
     * Reads the node whose first token is the current one (checking the limit on the number of nodes).
     *
     * @param ptr the pointer of the nodes array
     */
    void readNext(String ptr) throws FormatException {
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

    /** The pointer of the node being read, made only for a message or a finding (not once per node). */
    String nodePointer() {
        return "/nodes/" + nodeCount;
    }

    private void unknown(String ptr, String message) {
        unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message,
                new SourceLocation(ptr, in.line(), in.column())));
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
            if (numbers == null || !numbers.offer(in.parser())) {
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
        void build(int line, int col, NodeArrayReader pass) throws FormatException {
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

        private void buildInput(int line, int col, NodeArrayReader pass) throws FormatException {
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

        private double[] vector(String name, int line, int col, NodeArrayReader pass) throws FormatException {
            Object v = params.get(name);
            if (!(v instanceof double[] a)) {
                int[] at = paramLocations.getOrDefault(name, new int[] {line, col});
                throw pass.error(pass.nodePointer() + "/" + name, at[0], at[1], family.jsonName() + " node " + id + " needs \"" + name
                        + "\", an array of numbers");
            }
            return a;
        }

        private void rejectOthers(NodeArrayReader pass, String... allowed) {
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
